// The consents and constraints list of a site: the permissions a scheme needs, each with a status,
// their plain labels and why each matters, and the checks the list carries (eel screening, a
// gauging station's rating), with the counts the reviewer's brief and the landowner summary show.

/** Every permission the list holds, in the order shown. */
export const CONSENT_KINDS = [
  'abstraction-licence',
  'impoundment-licence',
  'flood-risk-permit',
  'fish-passage',
  'eel-screening',
  'water-quality',
  'gauging-station',
  'heritage',
  'landowner',
  'grid-connection',
  'noise',
] as const
export type ConsentKind = (typeof CONSENT_KINDS)[number]

/** Where a permission stands. A kind nobody has touched is `not-started`. */
export const CONSENT_STATUSES = ['not-started', 'not-needed', 'applied', 'granted', 'granted-with-conditions', 'refused'] as const
export type ConsentStatus = (typeof CONSENT_STATUSES)[number]

/** Plain label of each status. */
export const CONSENT_STATUS_LABELS: Record<ConsentStatus, string> = {
  'not-started': 'Not started',
  'not-needed': 'Not needed',
  applied: 'Applied for',
  granted: 'Granted',
  'granted-with-conditions': 'Granted with conditions',
  refused: 'Refused',
}

/** A permission's plain name, why it matters, and where that comes from. */
export interface ConsentKindInfo {
  label: string
  why: string
  source: string
}

const NO_SOURCE = 'common practice, no source'

/** Plain name and one line on why each permission matters. */
export const CONSENT_KIND_INFO: Record<ConsentKind, ConsentKindInfo> = {
  'abstraction-licence': { label: 'Abstraction licence', why: 'Water taken through the units is an abstraction: the regulator sets the hands-off flow and the most that may be taken.', source: NO_SOURCE },
  'impoundment-licence': { label: 'Impoundment licence', why: 'Works that hold back or raise the water at the weir need the regulator\'s licence.', source: NO_SOURCE },
  'flood-risk-permit': { label: 'Flood-risk permit', why: 'Works in or beside a main river can change flood levels; they need a permit before they start.', source: NO_SOURCE },
  'fish-passage': { label: 'Fish passage', why: 'Fish must still pass the weir; the regulator may ask for a pass or a share of the flow for one.', source: NO_SOURCE },
  'eel-screening': {
    label: 'Eel screening',
    why: 'A weir counts as a dam; a diversion of 20 m³ or more in 24 hours must be screened against eels, or be exempted.',
    source: 'Eels (England and Wales) Regulations 2009, SI 2009/3344',
  },
  'water-quality': { label: 'Water-quality consent', why: 'Air injected into the river changes its oxygen and dissolved gas; the regulator may set limits.', source: NO_SOURCE },
  'gauging-station': { label: 'Gauging station', why: 'A scheme at a gauging weir alters the gauge\'s rating; its owner must agree and the rating be checked again.', source: NO_SOURCE },
  heritage: { label: 'Heritage', why: 'An old mill weir may be listed or lie in a conservation area; changes to it need consent.', source: NO_SOURCE },
  landowner: { label: 'Landowner consent', why: 'The weir, both banks and the access belong to someone; nothing is built without their written agreement.', source: NO_SOURCE },
  'grid-connection': { label: 'Grid connection', why: 'The network operator must offer a connection before the power can be exported.', source: NO_SOURCE },
  noise: { label: 'Noise', why: 'Air turbines are heard; the planning authority sets a limit at the nearest dwelling, strictest at night.', source: NO_SOURCE },
}

/** Statuses that count as the permission being in hand. */
export const isGranted = (s: ConsentStatus) => s === 'granted' || s === 'granted-with-conditions'
/** Statuses that still need work: neither in hand, refused, nor not needed. */
export const isOutstanding = (s: ConsentStatus) => s === 'not-started' || s === 'applied'

/** A diversion at or above this many m³ in 24 hours must be screened against eels (Eels (England and Wales) Regulations 2009, SI 2009/3344). */
export const EEL_SCREENING_THRESHOLD_M3_PER_DAY = 20

const SECONDS_PER_DAY = 86_400

/** The eel-screening check: does the scheme's largest diversion reach the threshold? */
export interface EelScreeningCheck {
  /** The largest diversion, m³ in 24 hours (units × one unit's capacity at the gross head × 86,400 s); null when no assessment gives it. */
  diversionPerDay_m3: number | null
  threshold_m3PerDay: number
  triggered: boolean | null
  /** Plain words: "triggered: diverts up to 172,800 m³ a day". */
  message: string
  source: string
}

/** Whether a scheme diverting up to `designFlow_m3s` must be screened against eels. */
export function eelScreeningCheck(designFlow_m3s: number | null): EelScreeningCheck {
  const base = { threshold_m3PerDay: EEL_SCREENING_THRESHOLD_M3_PER_DAY, source: CONSENT_KIND_INFO['eel-screening'].source }
  if (designFlow_m3s === null || !Number.isFinite(designFlow_m3s) || designFlow_m3s < 0) {
    return { ...base, diversionPerDay_m3: null, triggered: null, message: 'not yet known: assess an option to find the most the scheme diverts' }
  }
  const perDay = designFlow_m3s * SECONDS_PER_DAY
  const triggered = perDay >= EEL_SCREENING_THRESHOLD_M3_PER_DAY
  const amount = Math.round(perDay).toLocaleString('en-GB')
  return {
    ...base,
    diversionPerDay_m3: perDay,
    triggered,
    message: triggered ? `triggered: diverts up to ${amount} m³ a day` : `not triggered: diverts at most ${amount} m³ a day`,
  }
}

/** The warning a site at a gauging station carries. */
export const GAUGING_STATION_WARNING =
  'This weir is a gauging station: a scheme here alters its rating (the flow read from the water level). Agree the works with the gauge\'s owner and plan for the rating to be checked again.'

/** Counts by status for the reviewer's brief and the landowner summary. */
export type ConsentCounts = Record<ConsentStatus, number>

/** How many permissions stand at each status. */
export function consentCounts(items: readonly { status: ConsentStatus }[]): ConsentCounts {
  const counts = Object.fromEntries(CONSENT_STATUSES.map((s) => [s, 0])) as ConsentCounts
  for (const i of items) counts[i.status]++
  return counts
}

/** One plain line for a landowner: "Permissions: 3 of 11 granted, 2 applied for, 1 refused (flood-risk permit)". */
export function permissionsLine(items: readonly { kind: ConsentKind; status: ConsentStatus }[]): string {
  const needed = items.filter((i) => i.status !== 'not-needed')
  const granted = needed.filter((i) => isGranted(i.status)).length
  const applied = needed.filter((i) => i.status === 'applied').length
  const refused = needed.filter((i) => i.status === 'refused').map((i) => CONSENT_KIND_INFO[i.kind].label.toLowerCase())
  const parts = [`${granted} of ${needed.length} granted`]
  if (applied) parts.push(`${applied} applied for`)
  if (refused.length) parts.push(`${refused.length} refused (${refused.join(', ')})`)
  return `Permissions: ${parts.join(', ')}`
}

/** "requires: flood-risk permit granted, landowner consent granted" for a decision that requires items; '' for none. */
export function requiredConsentsLine(kinds: readonly ConsentKind[]): string {
  if (!kinds.length) return ''
  return `requires: ${kinds.map((k) => `${CONSENT_KIND_INFO[k].label.replace(/^./, (c) => c.toLowerCase())} granted`).join(', ')}`
}
