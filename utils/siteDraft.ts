// The site form's draft: a blank one, one from a stored site, the bodies it sends, and the schema's
// issues by field path in plain words; with these, useFormState runs the site's forms (SITE_FORM).
import { MONTH_NAMES } from '#shared/utils/months'
import type { OxygenUnit, Reach, SiteDto } from '#shared/schemas/site'
import type { FlowRulePreset, MaxTake } from '#shared/schemas/flowRules'
import type { WeirAerationModel } from '#shared/engine/weirAeration'
import type { WaterQualityClass, WeirShapeClass } from '#shared/engine/oxygen'
import { type CheckIssue, type FormMessages, samePlain } from './formState'
import { checkHeadRows, headRowsFrom, headTableText, type HeadTableRow } from './headTable'
import { hydraulicsDraftFrom, hydraulicsFromDraft, tailRowsText, type HydraulicsDraft } from './weirHydraulicsDraft'

/** One month row as the months table edits it. */
export interface MonthDraft {
  waterTemp_C: number | null
  oxygenValue: number | null
  oxygenUnit: OxygenUnit
  /** False when the upstream oxygen was not measured this month (the value stands in). */
  oxygenMeasured: boolean
  /** The month's mean flow, m³/s, for the seasonal profile; null when not entered. */
  flow_m3s: number | null
}

/** What the site form's inputs hold (the weir hydraulics' fields from HydraulicsDraft, utils/weirHydraulicsDraft.ts). */
export interface SiteDraft extends HydraulicsDraft {
  name: string
  riverName: string
  lat: number | null
  lng: number | null
  reach: Reach | null
  altitude_m: number | null
  grossHead_m: number | null
  crestWidth_m: number | null
  shape: WeirShapeClass
  waterQuality: WaterQualityClass
  /** The weir aeration model the figures use. */
  aerationModel: WeirAerationModel
  /** A measured deficit ratio and its conditions; all blank (and not drowned) sends none. */
  measuredR: number | null
  measuredTemp_C: number | null
  measuredDrowned: boolean
  measuredNote: string
  reservedKind: 'fixed' | 'percentile'
  reservedFlow: number | null
  reservedExceedance: number | null
  /** The flow rules' preset ('custom' once any value is edited away from it). */
  flowRulesPreset: FlowRulePreset
  maxTakeKind: MaxTake['kind']
  /** Fixed maximum take, m³/s. */
  maxTakeFlow: number | null
  /** Maximum take as a multiple of the mean flow. */
  maxTakeMultiple: number | null
  keptShare_pct: number | null
  passFlow_m3s: number | null
  siteArea_km2: number | null
  gaugeArea_km2: number | null
  targetOxygen_mgL: number | null
  notes: string
  months: MonthDraft[]
  /** The head-vs-flow table as text rows (utils/headTable.ts); sent as `headTable` by the overview and a new site. */
  headRows: HeadTableRow[]
}

/** Starting month values for a new site: 10 °C and water at saturation (common practice, no source; replace with measurements). */
export const STARTING_MONTH: MonthDraft = { waterTemp_C: 10, oxygenValue: 100, oxygenUnit: '%sat', oxygenMeasured: true, flow_m3s: null }

/** An empty draft for a new site. */
export function blankSiteDraft(): SiteDraft {
  return {
    name: '',
    riverName: '',
    lat: null,
    lng: null,
    reach: null,
    altitude_m: 0,
    grossHead_m: null,
    crestWidth_m: null,
    shape: 'sharp-crested-vertical-face',
    waterQuality: 'clean',
    aerationModel: 'butts-evans',
    measuredR: null,
    measuredTemp_C: null,
    measuredDrowned: false,
    measuredNote: '',
    reservedKind: 'percentile',
    reservedFlow: null,
    reservedExceedance: 95,
    flowRulesPreset: 'none',
    maxTakeKind: 'none',
    maxTakeFlow: null,
    maxTakeMultiple: null,
    keptShare_pct: 0,
    passFlow_m3s: 0,
    siteArea_km2: null,
    gaugeArea_km2: null,
    targetOxygen_mgL: 6,
    notes: '',
    months: MONTH_NAMES.map(() => ({ ...STARTING_MONTH })),
    headRows: [],
    ...hydraulicsDraftFrom(null),
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
    altitude_m: site.altitude_m,
    grossHead_m: site.weir.grossHead_m,
    crestWidth_m: site.weir.crestWidth_m,
    shape: site.weir.shape,
    waterQuality: site.weir.waterQuality,
    // Stored before the weir models came: Butts & Evans, nothing measured.
    aerationModel: site.weir.aerationModel ?? 'butts-evans',
    measuredR: site.weir.measuredDeficitRatio?.r ?? null,
    measuredTemp_C: site.weir.measuredDeficitRatio?.temperature_C ?? null,
    measuredDrowned: site.weir.measuredDeficitRatio?.drowned ?? false,
    measuredNote: site.weir.measuredDeficitRatio?.note ?? '',
    reservedKind: site.reservedFlow.kind,
    reservedFlow: site.reservedFlow.kind === 'fixed' ? site.reservedFlow.flow : null,
    reservedExceedance: site.reservedFlow.kind === 'percentile' ? site.reservedFlow.exceedance : 95,
    flowRulesPreset: site.flowRules.preset,
    maxTakeKind: site.flowRules.maxTake.kind,
    maxTakeFlow: site.flowRules.maxTake.kind === 'fixed' ? site.flowRules.maxTake.flow_m3s : null,
    maxTakeMultiple: site.flowRules.maxTake.kind === 'mean-multiple' ? site.flowRules.maxTake.multiple : null,
    keptShare_pct: site.flowRules.keptShare_pct,
    passFlow_m3s: site.flowRules.passFlow_m3s,
    siteArea_km2: site.catchment?.siteArea_km2 ?? null,
    gaugeArea_km2: site.catchment?.gaugeArea_km2 ?? null,
    targetOxygen_mgL: site.targetOxygen_mgL,
    notes: site.notes,
    months: site.months.map((m) => ({
      waterTemp_C: m.waterTemp_C,
      oxygenValue: m.upstreamOxygen.value,
      oxygenUnit: m.upstreamOxygen.unit,
      // Stored before these fields came: measured, and no month flow.
      oxygenMeasured: m.upstreamOxygen.measured ?? true,
      flow_m3s: m.flow_m3s ?? null,
    })),
    headRows: headRowsFrom(site.headTable),
    ...hydraulicsDraftFrom(site.weir.hydraulics ?? null),
  }
}

/** True when two drafts hold the same values (the head rows by their texts, as typed). */
function sameSiteDraft(a: SiteDraft, b: SiteDraft): boolean {
  return samePlain(
    { ...a, headRows: headTableText(a.headRows), tailRows: tailRowsText(a.tailRows) },
    { ...b, headRows: headTableText(b.headRows), tailRows: tailRowsText(b.tailRows) },
  )
}

/** The months as the API takes them (unchecked). */
export function monthsFromDraft(months: readonly MonthDraft[]) {
  return months.map((m) => ({
    waterTemp_C: m.waterTemp_C,
    upstreamOxygen: { value: m.oxygenValue, unit: m.oxygenUnit, measured: m.oxygenMeasured },
    flow_m3s: m.flow_m3s,
  }))
}

/** The measured deficit ratio to send: none while its fields are all blank, else all of them (blanks for the schema to report). */
function measuredRatioFromDraft(d: SiteDraft) {
  const blank = d.measuredR === null && d.measuredTemp_C === null && !d.measuredDrowned && d.measuredNote.trim() === ''
  return blank ? null : { r: d.measuredR, temperature_C: d.measuredTemp_C, drowned: d.measuredDrowned, note: d.measuredNote.trim() }
}

/** The hands-off flow as the API takes it (unchecked). */
export function reservedFlowFromDraft(d: Pick<SiteDraft, 'reservedKind' | 'reservedFlow' | 'reservedExceedance'>) {
  return d.reservedKind === 'fixed' ? { kind: 'fixed' as const, flow: d.reservedFlow } : { kind: 'percentile' as const, exceedance: d.reservedExceedance }
}

/** The flow rules as the API takes them (unchecked). */
export function flowRulesFromDraft(d: SiteDraft) {
  const maxTake = d.maxTakeKind === 'fixed'
    ? { kind: 'fixed' as const, flow_m3s: d.maxTakeFlow }
    : d.maxTakeKind === 'mean-multiple' ? { kind: 'mean-multiple' as const, multiple: d.maxTakeMultiple } : { kind: 'none' as const }
  return { preset: d.flowRulesPreset, maxTake, keptShare_pct: d.keptShare_pct, passFlow_m3s: d.passFlow_m3s }
}

/** The overview fields as the API takes them (unchecked: blanks stay null for the schema to report). */
export function overviewFromDraft(d: SiteDraft) {
  const bothAreasBlank = d.siteArea_km2 === null && d.gaugeArea_km2 === null
  return {
    name: d.name,
    riverName: d.riverName,
    location: d.lat === null && d.lng === null ? undefined : { lat: d.lat, lng: d.lng },
    reach: d.reach,
    altitude_m: d.altitude_m,
    weir: {
      grossHead_m: d.grossHead_m,
      crestWidth_m: d.crestWidth_m,
      shape: d.shape,
      waterQuality: d.waterQuality,
      aerationModel: d.aerationModel,
      measuredDeficitRatio: measuredRatioFromDraft(d),
      hydraulics: hydraulicsFromDraft(d),
    },
    reservedFlow: reservedFlowFromDraft(d),
    flowRules: flowRulesFromDraft(d),
    catchment: bothAreasBlank ? null : { siteArea_km2: d.siteArea_km2, gaugeArea_km2: d.gaugeArea_km2 },
    targetOxygen_mgL: d.targetOxygen_mgL,
    notes: d.notes,
  }
}

/** The head table to send, or undefined while its rows fail their own checks (which stop the save). */
function headTableFromDraft(d: SiteDraft) {
  return checkHeadRows(d.headRows).table ?? undefined
}

/** The overview's PATCH body (unchecked): the overview fields and the head table. */
export function overviewBody(d: SiteDraft) {
  return { ...overviewFromDraft(d), headTable: headTableFromDraft(d) }
}

/** The months' PATCH body (unchecked): all twelve. */
export function monthsBody(d: SiteDraft) {
  return { months: monthsFromDraft(d.months) }
}

/** A new site's body (unchecked): the overview, the head table and the months. */
export function newSiteBody(d: SiteDraft) {
  return { ...overviewFromDraft(d), headTable: headTableFromDraft(d), months: monthsFromDraft(d.months) }
}

/** Clearer words for a few schema messages that read oddly on a form. */
export function friendly(path: string, message: string): string {
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
export function issuesByPath(issues: readonly CheckIssue[], input?: unknown): Record<string, string> {
  const out: Record<string, string> = {}
  for (const issue of issues) {
    const path = issue.path.map(String).join('.')
    const blank = input !== undefined && issue.path.length > 0 && valueAt(input, issue.path) === null
    out[path] ??= friendly(path, blank && issue.message === 'must be a number' ? 'is required' : issue.message)
  }
  return out
}

/** The site forms' wording: the schema's and the server's messages in plain words (the form-wide ones are useFormState's). */
const SITE_FORM_MESSAGES: FormMessages = {
  issues: issuesByPath,
  server: (fields) => Object.fromEntries(Object.entries(fields).map(([k, v]) => [k, friendly(k, v)])),
}

/** What every site form gives useFormState besides its body and its request. */
export const SITE_FORM = {
  draftOf: draftFromSite,
  same: sameSiteDraft,
  recheck: true,
  messages: SITE_FORM_MESSAGES,
}
