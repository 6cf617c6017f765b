// The option form's state: the draft, its errors, saving a new option or a change.
import { computed, reactive, ref, shallowRef } from 'vue'
import { checkOptionDraft, draftFromOption, type DraftValue, type OptionDraft, sameDraft } from '../utils/optionFields'
import { httpStatus, issuesFromError } from '../utils/serverErrors'
import { createOption, patchOption } from './useOption'
import type { OptionDto, OptionInput } from '~~/shared/schemas/option'

/**
 * The option form's state: the draft the fields show, per-field errors from the shared schema (or
 * the server's 4xx), saving a new option or a change with the version last read (409 → `conflict`).
 */
export function useOptionEditor(initial: OptionDraft) {
  const draft = reactive<OptionDraft>(structuredClone(initial))
  const baseline = shallowRef<OptionDraft>(structuredClone(initial))
  const errors = ref<Record<string, string>>({})
  const formError = ref('')
  const busy = ref(false)
  const conflict = ref(false)
  const saved = ref(false)
  const dirty = computed(() => !sameDraft(draft, baseline.value))

  function set(path: string, value: DraftValue) {
    draft.values[path] = value
    saved.value = false
    if (errors.value[path]) {
      const { [path]: _gone, ...rest } = errors.value
      errors.value = rest
    }
  }
  function setText(key: 'name' | 'notes', value: string) {
    draft[key] = value
    saved.value = false
    if (key === 'name' && errors.value['name']) {
      const { name: _gone, ...rest } = errors.value
      errors.value = rest
    }
  }
  function reset(next: OptionDraft) {
    draft.name = next.name
    draft.notes = next.notes
    draft.values = { ...next.values }
    baseline.value = structuredClone(next)
    errors.value = {}
    formError.value = ''
    conflict.value = false
  }
  function check(): OptionInput | null {
    const { input, errors: found } = checkOptionDraft(draft)
    errors.value = found
    formError.value = input ? '' : `Check the ${Object.keys(found).length === 1 ? 'marked field' : `${Object.keys(found).length} marked fields`}.`
    return input
  }
  function fail(error: unknown) {
    if (httpStatus(error) === 409) {
      conflict.value = true
      return
    }
    const { fields, message } = issuesFromError(error)
    errors.value = fields
    formError.value = Object.keys(fields).length ? `Check the marked fields: ${message}` : message
  }
  /** Checks, then sends; answers the stored option, or null when the check or the server refused. */
  async function send(write: (input: OptionInput) => Promise<OptionDto>): Promise<OptionDto | null> {
    saved.value = false
    const input = check()
    if (!input) return null
    busy.value = true
    try {
      const stored = await write(input)
      reset(draftFromOption(stored))
      saved.value = true
      return stored
    } catch (error) {
      fail(error)
      return null
    } finally {
      busy.value = false
    }
  }
  const saveNew = (siteId: number) => send((input) => createOption(siteId, input))
  const saveChanges = (option: Pick<OptionDto, 'id' | 'version'>) =>
    send((input) => patchOption(option.id, { ...input, version: option.version }))

  return { draft, errors, formError, busy, conflict, saved, dirty, set, setText, reset, check, fail, saveNew, saveChanges }
}

/** The option form's state, as the form components take it. */
export type OptionEditor = ReturnType<typeof useOptionEditor>
