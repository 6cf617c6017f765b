// The site form's state: a draft the inputs bind to (numbers may be blank while typing), turned
// into the API's shape and checked with the very schemas the server uses (shared/schemas/site.ts).
import { computed, reactive, ref, watch } from 'vue'
import type { ZodType } from 'zod'
import { MonthsSchema, SiteInputSchema, SitePatchSchema, type SiteInput, type SitePatch } from '~~/shared/schemas/site'
import { issuesFromError } from '../utils/serverErrors'
import { cloneDraft, friendly, issuesByPath, monthsFromDraft, overviewFromDraft, type SiteDraft } from '../utils/siteDraft'

/**
 * Form state for one site: the draft, per-field errors (keyed by the API's paths, e.g.
 * `weir.grossHead_m`, `months.3.upstreamOxygen.value`), a form-wide message and busy flag.
 */
export function useSiteForm(initial: SiteDraft) {
  const draft = reactive<SiteDraft>(cloneDraft(initial))
  const baseline = ref(JSON.stringify(initial))
  /** True once the draft differs from what was last loaded or saved. */
  const dirty = computed(() => JSON.stringify(draft) !== baseline.value)
  const errors = ref<Record<string, string>>({})
  const formError = ref('')
  const busy = ref(false)

  // After the first check, every edit checks again, so a fixed field loses its message at once.
  let recheck: (() => void) | null = null
  watch(draft, () => recheck?.(), { deep: true, flush: 'sync' })

  function parse<T>(schema: ZodType<T>, value: unknown): T | null {
    const result = schema.safeParse(value)
    errors.value = {}
    formError.value = ''
    if (result.success) return result.data
    errors.value = issuesByPath(result.error.issues, value)
    formError.value = 'Some fields need attention; see the messages beside them.'
    return null
  }

  /** The whole new site, checked; null with errors set when something is wrong. */
  function checkNew(): SiteInput | null {
    recheck = checkNew
    return parse(SiteInputSchema, { ...overviewFromDraft(draft), months: monthsFromDraft(draft.months) })
  }
  /** The overview fields as a PATCH at `version`, checked. */
  function checkOverview(version: number): SitePatch | null {
    recheck = () => checkOverview(version)
    return parse(SitePatchSchema, { ...overviewFromDraft(draft), version })
  }
  /** The 12 months as a PATCH at `version`, checked (errors keyed `months.N.…`). */
  function checkMonths(version: number): SitePatch | null {
    recheck = () => checkMonths(version)
    const months = parse(MonthsSchema, monthsFromDraft(draft.months))
    if (!months) {
      errors.value = Object.fromEntries(Object.entries(errors.value).map(([k, v]) => [`months.${k}`, v]))
      return null
    }
    return { months, version }
  }

  /** Maps a failed request's answer onto the fields (or the form-wide message). */
  function fail(error: unknown) {
    const { fields, message } = issuesFromError(error)
    errors.value = Object.fromEntries(Object.entries(fields).map(([k, v]) => [k, friendly(k, v)]))
    formError.value = Object.keys(fields).length ? 'Some fields need attention; see the messages beside them.' : message
  }

  /** Puts a stored site back into the draft (after a save or a reload). */
  function reset(next: SiteDraft) {
    recheck = null
    Object.assign(draft, cloneDraft(next))
    baseline.value = JSON.stringify(next)
    errors.value = {}
    formError.value = ''
  }

  return { draft, dirty, errors, formError, busy, checkNew, checkOverview, checkMonths, fail, reset }
}

/** The state `useSiteForm` returns, for components that take a form as a prop. */
export type SiteForm = ReturnType<typeof useSiteForm>
