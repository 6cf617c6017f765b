// The site form's state: a draft the inputs bind to (numbers may be blank while typing), turned
// into the API's shape and checked with the very schemas the server uses (shared/schemas/site.ts).
import { computed, reactive, ref, watch } from 'vue'
import type { ZodType } from 'zod'
import {
  MonthsSchema,
  SiteInputSchema,
  SitePatchSchema,
  type OxygenUnit,
  type Reach,
  type SiteDto,
  type SiteInput,
  type SitePatch,
} from '~~/shared/schemas/site'
import type { WaterQualityClass, WeirShapeClass } from '~~/shared/engine/oxygen'
import { issuesFromError } from './useSchemaForm'

/** One month row as the months table edits it. */
export interface MonthDraft {
  waterTempC: number | null
  oxygenValue: number | null
  oxygenUnit: OxygenUnit
}

/** What the site form's inputs hold. */
export interface SiteDraft {
  name: string
  riverName: string
  lat: number | null
  lng: number | null
  reach: Reach | null
  altitudeM: number | null
  grossHeadM: number | null
  crestWidthM: number | null
  shape: WeirShapeClass
  waterQuality: WaterQualityClass
  reservedKind: 'fixed' | 'percentile'
  reservedFlow: number | null
  reservedExceedance: number | null
  siteAreaKm2: number | null
  gaugeAreaKm2: number | null
  targetOxygenMgL: number | null
  notes: string
  months: MonthDraft[]
}

/** A plain deep copy (drafts are JSON; this also unwraps reactive proxies). */
function clone<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T
}

/** Month names, January first, for the months table. */
export const MONTH_NAMES = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'] as const

/** Starting month values for a new site: 10 °C and water at saturation (common practice, no source; replace with measurements). */
export const STARTING_MONTH: MonthDraft = { waterTempC: 10, oxygenValue: 100, oxygenUnit: '%sat' }

/** An empty draft for a new site. */
export function blankSiteDraft(): SiteDraft {
  return {
    name: '',
    riverName: '',
    lat: null,
    lng: null,
    reach: null,
    altitudeM: 0,
    grossHeadM: null,
    crestWidthM: null,
    shape: 'sharp-crested-vertical-face',
    waterQuality: 'clean',
    reservedKind: 'percentile',
    reservedFlow: null,
    reservedExceedance: 95,
    siteAreaKm2: null,
    gaugeAreaKm2: null,
    targetOxygenMgL: 6,
    notes: '',
    months: MONTH_NAMES.map(() => ({ ...STARTING_MONTH })),
  }
}

/** A draft holding a stored site. */
export function draftFromSite(site: SiteDto): SiteDraft {
  return {
    name: site.name,
    riverName: site.riverName,
    lat: site.location.lat,
    lng: site.location.lng,
    reach: site.reach,
    altitudeM: site.altitudeM,
    grossHeadM: site.weir.grossHeadM,
    crestWidthM: site.weir.crestWidthM,
    shape: site.weir.shape,
    waterQuality: site.weir.waterQuality,
    reservedKind: site.reservedFlow.kind,
    reservedFlow: site.reservedFlow.kind === 'fixed' ? site.reservedFlow.flow : null,
    reservedExceedance: site.reservedFlow.kind === 'percentile' ? site.reservedFlow.exceedance : 95,
    siteAreaKm2: site.catchment?.siteAreaKm2 ?? null,
    gaugeAreaKm2: site.catchment?.gaugeAreaKm2 ?? null,
    targetOxygenMgL: site.targetOxygenMgL,
    notes: site.notes,
    months: site.months.map((m) => ({ waterTempC: m.waterTempC, oxygenValue: m.upstreamOxygen.value, oxygenUnit: m.upstreamOxygen.unit })),
  }
}

/** The months as the API takes them (unchecked). */
export function monthsFromDraft(months: readonly MonthDraft[]) {
  return months.map((m) => ({ waterTempC: m.waterTempC, upstreamOxygen: { value: m.oxygenValue, unit: m.oxygenUnit } }))
}

/** The overview fields as the API takes them (unchecked: blanks stay null for the schema to report). */
export function overviewFromDraft(d: SiteDraft) {
  const bothAreasBlank = d.siteAreaKm2 === null && d.gaugeAreaKm2 === null
  return {
    name: d.name,
    riverName: d.riverName,
    location: d.lat === null && d.lng === null ? undefined : { lat: d.lat, lng: d.lng },
    reach: d.reach,
    altitudeM: d.altitudeM,
    weir: { grossHeadM: d.grossHeadM, crestWidthM: d.crestWidthM, shape: d.shape, waterQuality: d.waterQuality },
    reservedFlow: d.reservedKind === 'fixed' ? { kind: 'fixed' as const, flow: d.reservedFlow } : { kind: 'percentile' as const, exceedance: d.reservedExceedance },
    catchment: bothAreasBlank ? null : { siteAreaKm2: d.siteAreaKm2, gaugeAreaKm2: d.gaugeAreaKm2 },
    targetOxygenMgL: d.targetOxygenMgL,
    notes: d.notes,
  }
}

/** Clearer words for a few schema messages that read oddly on a form. */
function friendly(path: string, message: string): string {
  if (path === 'location' || path === 'location.lat' || path === 'location.lng') {
    if (/expected (object|number)/i.test(message) || message === 'must be a number') return 'Place the site on the map, or enter its latitude and longitude'
  }
  if (/^Invalid input/.test(message)) return 'is required'
  return message
}

/** The value at `path` inside `value`, or undefined. */
function valueAt(value: unknown, path: readonly PropertyKey[]): unknown {
  let v = value
  for (const key of path) v = v !== null && typeof v === 'object' ? (v as Record<PropertyKey, unknown>)[key] : undefined
  return v
}

/**
 * Per-field messages from a zod result's issues, keyed by dotted path (first message wins). Given
 * the checked `input`, a blank field (null) reads "is required" rather than "must be a number".
 */
export function issuesByPath(issues: readonly { path: readonly PropertyKey[]; message: string }[], input?: unknown): Record<string, string> {
  const out: Record<string, string> = {}
  for (const issue of issues) {
    const path = issue.path.map(String).join('.')
    const blank = input !== undefined && issue.path.length > 0 && valueAt(input, issue.path) === null
    out[path] ??= friendly(path, blank && issue.message === 'must be a number' ? 'is required' : issue.message)
  }
  return out
}

/**
 * Form state for one site: the draft, per-field errors (keyed by the API's paths, e.g.
 * `weir.grossHeadM`, `months.3.upstreamOxygen.value`), a form-wide message and busy flag.
 */
export function useSiteForm(initial: SiteDraft) {
  const draft = reactive<SiteDraft>(clone(initial))
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
    Object.assign(draft, clone(next))
    baseline.value = JSON.stringify(next)
    errors.value = {}
    formError.value = ''
  }

  return { draft, dirty, errors, formError, busy, checkNew, checkOverview, checkMonths, fail, reset }
}

/** The state `useSiteForm` returns, for components that take a form as a prop. */
export type SiteForm = ReturnType<typeof useSiteForm>
