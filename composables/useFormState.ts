// The state every editor of a stored thing shares (a site's overview and months, its FDC points, an
// option), and the forms that create one: the draft the inputs bind to, whether it holds unsaved
// edits, putting it back, turning it into the request body checked by the shared zod schema, and
// saving it with the version last read, where a 409 means someone else saved first. What differs
// between editors (the draft's shape, the body, the wording) comes in as options, so field names
// stay data of the editor, never of this file.
import { computed, reactive, ref, shallowRef, watch, type ComputedRef, type Ref, type ShallowRef } from 'vue'
import type { z, ZodType } from 'zod'
import { copyPlain, DEFAULT_FORM_MESSAGES, type FormMessages, samePlain } from '../utils/formState'
import { issuesFromError, staleVersionOf, type StaleVersion } from '../utils/serverErrors'

/** What the editor gives: the draft's shape, the body, how to send it, and its wording. */
export interface FormStateOptions<D extends object, S extends ZodType<object>, R extends { version: number }> {
  /** The stored thing the form edits; followed while the draft holds no edits. None for a new thing. */
  stored?: () => R | null | undefined
  /** The draft while nothing is stored (a new thing, or one still loading). */
  blank?: D
  /** A stored thing (as read, or as a save answered) as the draft holds it. */
  draftOf: (stored: R) => D
  /** The request body the draft stands for, before the check (blanks left for the schema to report); the version is added to it. */
  toBody: (draft: D) => object
  /** The shared zod schema the server checks the body with; its output is what `send` gets. */
  schema: S
  /** Sends a checked body; answers the stored thing. */
  send: (body: z.output<S>) => Promise<R>
  /** The editor's own checks beyond the schema (a table's rows), run on each save; false stops it (they show their own messages). */
  ready?: (draft: D) => boolean
  /** True when two drafts hold the same values (default: equal plain data). */
  same?: (a: D, b: D) => boolean
  /** After a save was tried, check the draft again on every edit, so a fixed field loses its message at once. */
  recheck?: boolean
  /** How the form words its messages. */
  messages?: FormMessages
}

/** An editor's form state. */
export interface FormState<D extends object, B = unknown, R = unknown> {
  /** What the inputs bind to: a deep copy of the saved value, the same object for the form's life. */
  draft: D
  /** The last saved (or loaded) value. */
  saved: Readonly<ShallowRef<D>>
  /** The version last read; null for a thing not yet stored (its save sends none). */
  version: Readonly<Ref<number | null>>
  /** True while the draft's values differ from the saved value. */
  dirty: ComputedRef<boolean>
  /** Messages by field path (the API's: `weir.grossHead_m`, `months.3.waterTemp_C`), from the schema or the server. */
  errors: Ref<Record<string, string>>
  /** A message about the whole form, or ''. */
  formError: Ref<string>
  /** True while a save is under way. */
  busy: Readonly<Ref<boolean>>
  /** True right after a successful save (an editor may clear it on the next edit). */
  justSaved: Ref<boolean>
  /** Set when a save answered 409: the version now stored. Cleared when the newer stored thing is loaded. */
  conflict: Readonly<Ref<StaleVersion | null>>
  /** True once a save was tried since the draft was last loaded or reset (editors show their own checks from then on). */
  tried: Readonly<Ref<boolean>>
  /** The checked body at the version last read, or null with the messages set. */
  toBody: () => B | null
  /** Checks and sends the draft; answers the stored thing, or null when refused (messages or `conflict` set). */
  save: () => Promise<R | null>
  /** Drops the edits: the draft goes back to the saved value, without messages. */
  reset: () => void
}

/** The part of a form that field components take: the draft they edit and the messages by field path. */
export type FormFields<D extends object> = Pick<FormState<D>, 'draft' | 'errors'>

/**
 * Form state for one editor. With `stored`, a newer stored thing (a reload, a save elsewhere on the
 * page) flows into the draft while it holds no edits, or after a conflict; edits in progress are
 * kept, and the version follows either way.
 */
export function useFormState<D extends object, S extends ZodType<object>, R extends { version: number }>(
  options: FormStateOptions<D, S, R>,
): FormState<D, z.output<S>, R> {
  const words = { ...DEFAULT_FORM_MESSAGES, ...options.messages }
  const same = options.same ?? samePlain
  const first = options.stored?.()
  const start: D | undefined = first ? options.draftOf(first) : options.blank
  if (!start) throw new Error('useFormState needs a stored value or a blank draft')

  const saved = shallowRef(copyPlain(start)) as ShallowRef<D>
  const version = ref<number | null>(first ? first.version : null)
  const draft = reactive(copyPlain(start)) as D
  const dirty = computed(() => !same(draft, saved.value))
  const errors = ref<Record<string, string>>({})
  const formError = ref('')
  const busy = ref(false)
  const justSaved = ref(false)
  const conflict = ref<StaleVersion | null>(null)
  const tried = ref(false)

  /** Puts `value` into the draft (in place: components hold the object; drafts keep one shape) and forgets messages. */
  function fill(value: D) {
    tried.value = false
    Object.assign(draft, copyPlain(value))
    errors.value = {}
    formError.value = ''
  }

  /** Takes a stored thing as the saved value and the draft. */
  function load(stored: R) {
    saved.value = copyPlain(options.draftOf(stored))
    version.value = stored.version
    conflict.value = null
    fill(saved.value)
  }

  function toBody(): z.output<S> | null {
    const raw = options.toBody(draft)
    const body = version.value === null ? raw : { ...raw, version: version.value }
    const result = options.schema.safeParse(body)
    if (result.success) {
      errors.value = {}
      formError.value = ''
      return result.data
    }
    errors.value = words.issues(result.error.issues, body)
    formError.value = words.refused(errors.value)
    return null
  }

  async function save(): Promise<R | null> {
    justSaved.value = false
    tried.value = true
    const ready = options.ready ? options.ready(draft) : true
    const body = toBody()
    if (!ready || body === null) return null
    busy.value = true
    try {
      const stored = await options.send(body)
      load(stored)
      justSaved.value = true
      return stored
    } catch (error) {
      // A stale version only means a conflict for a thing already stored; a new one just failed.
      const stale = version.value === null ? null : staleVersionOf(error)
      if (stale) conflict.value = stale
      else {
        const { fields, message } = issuesFromError(error)
        errors.value = words.server(fields)
        formError.value = words.failed(fields, message)
      }
      return null
    } finally {
      busy.value = false
    }
  }

  function reset() {
    fill(saved.value)
    justSaved.value = false
  }

  if (options.stored) {
    watch(options.stored, (next) => {
      if (!next) return
      if (!dirty.value || conflict.value) return load(next)
      saved.value = copyPlain(options.draftOf(next))
      version.value = next.version
    })
  }
  if (options.recheck) {
    watch(draft, () => tried.value && toBody(), { deep: true, flush: 'sync' })
  }

  return { draft, saved, version, dirty, errors, formError, busy, justSaved, conflict, tried, toBody, save, reset }
}
