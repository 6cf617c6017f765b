// Longer than most files: the whole invented demo scenario (people, sites, options, review) in one place.
import type { SiteInput } from '../shared/schemas/site'
import { NO_FLOW_RULES } from '../shared/schemas/flowRules'
import type { OptionInputDraft } from '../shared/schemas/option'
import type { Role } from '../shared/utils/roles'
import type { ConsentKind, ConsentStatus } from '../shared/utils/consents'

// The invented demo scenario: no real organisation, river, site or person. E-mail addresses use
// the reserved .example domain. Later features add their part of the story here.

/** Demo-only password shared by every demo account. Never use it anywhere real. */
export const DEMO_PASSWORD = 'brackwin-demo-2026'

export const DEMO_ORGANISATION = 'Tarn & Beck Renewables'

/** The demo organisation works in pounds sterling: every amount of the demo is in it. */
export const DEMO_CURRENCY = { code: 'GBP', symbol: '£' } as const

export interface DemoAccount {
  name: string
  email: string
  role: Role
  /** Who they are in the story. */
  story: string
}

export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  { name: 'Morwenna Hale', email: 'morwenna@tarnbeck.example', role: 'admin', story: 'administrator at Tarn & Beck Renewables' },
  { name: 'Idris Penrose', email: 'idris@tarnbeck.example', role: 'engineer', story: 'project engineer at Tarn & Beck Renewables' },
  { name: 'Elspeth Garrow', email: 'elspeth@fellside-agency.example', role: 'reviewer', story: 'environmental officer at the (invented) Fellside River Agency' },
  { name: 'Tobias Wren', email: 'tobias@brackwin-farm.example', role: 'viewer', story: 'landowner on the Brackwin Water' },
]

/** When the demo accounts confirmed their addresses (invented). */
export const DEMO_VERIFIED_AT = '2026-09-01T09:00:00.000Z'

/**
 * A new starter who has signed up but not yet opened the confirmation e-mail: signs in with the demo
 * password, sees the "confirm your address" notice, and belongs to no organisation yet.
 */
export const DEMO_PENDING_ACCOUNT = { name: 'Nessa Quill', email: 'nessa@tarnbeck.example', story: 'graduate engineer starting at Tarn & Beck Renewables next month' } as const

// ——— Sites on the (invented) Brackwin Water ———
// Coordinates sit on real ground but name nothing real; every figure is invented but plausible.

/** One demo site: the site itself, and optionally how to make its daily flow record. */
export interface DemoSite {
  site: SiteInput
  /** Generated daily flows (see `demoDailyFlows`), stored as the site's uploaded record. */
  record?: DemoRecordSpec
}

export interface DemoRecordSpec {
  fileName: string
  firstDay: string
  years: number
  /** Long-run mean flow the seasonal curve is built around, m³/s. */
  meanFlow: number
  /** Starting state of the pseudo-random walk; a fixed integer so every run makes the same record. */
  noiseStart: number
  /** Days with no data (a gauge outage), inclusive. */
  outage?: { from: string; to: string }
}

/** Twelve months; `flows` gives the seasonal profile, `notMeasured` the months (1–12) whose upstream oxygen is a stand-in. */
const months = (temps: number[], oxygen: number[], unit: 'mg/L' | '%sat', extra: { flows?: number[]; notMeasured?: number[] } = {}) =>
  temps.map((t, i) => ({
    waterTemp_C: t,
    upstreamOxygen: { value: oxygen[i]!, unit, measured: !extra.notMeasured?.includes(i + 1) },
    ...(extra.flows ? { flow_m3s: extra.flows[i]! } : {}),
  }))

// An upland river: coldest in January–February, warmest in late July.
const TEMPS = [4.5, 5.0, 6.5, 8.5, 11.5, 14.5, 16.5, 16.0, 13.5, 10.5, 7.0, 5.0]

/** Mean flow of each month at Skelby gauging weir, m³/s (invented): wetter in winter; the seasonal profile of its FDC. */
const SKELBY_MONTH_FLOWS = [12, 11, 9, 7, 5, 3.5, 2.8, 2.6, 3.4, 6, 9, 11]

/** FDC of the Brackwin Water at Skelby gauging weir, m³/s (invented). */
const SKELBY_FDC = [
  { exceedance: 1, flow: 64 },
  { exceedance: 5, flow: 31 },
  { exceedance: 10, flow: 21 },
  { exceedance: 20, flow: 13 },
  { exceedance: 30, flow: 8.9 },
  { exceedance: 50, flow: 4.9 },
  { exceedance: 70, flow: 2.9 },
  { exceedance: 80, flow: 2.2 },
  { exceedance: 90, flow: 1.6 },
  { exceedance: 95, flow: 1.25 },
  { exceedance: 99, flow: 0.9 },
]

export const DEMO_SITES: readonly DemoSite[] = [
  {
    site: {
      name: 'Hollin Mill weir',
      riverName: 'Brackwin Water',
      location: { lat: 54.5712, lng: -2.6581 },
      reach: { type: 'LineString', coordinates: [[-2.6594, 54.5719], [-2.6586, 54.5715], [-2.6578, 54.5710], [-2.6569, 54.5706]] },
      altitude_m: 182,
      weir: { grossHead_m: 2.4, crestWidth_m: 18, shape: 'flat-broad-crested-irregular-step', waterQuality: 'clean' },
      headTable: [],
      reservedFlow: { kind: 'percentile', exceedance: 95 },
      // The "low sensitivity" preset (illustrative; the regulator's figures for the reach replace it).
      flowRules: { preset: 'low-sensitivity', maxTake: { kind: 'mean-multiple', multiple: 1.3 }, keptShare_pct: 0, passFlow_m3s: 0 },
      months: months(TEMPS, [12.6, 12.4, 11.8, 11.0, 10.1, 9.3, 8.8, 8.9, 9.6, 10.4, 11.5, 12.2], 'mg/L'),
      catchment: null,
      fdcPoints: [],
      targetOxygen_mgL: 6,
      notes: 'Stone weir of a former corn mill; the leat on the left bank is silted up. Twelve years of daily flows from the owner\'s own level logger, with a gap while it was repaired.',
    },
    record: {
      fileName: 'hollin-mill-daily-flows.csv',
      firstDay: '2012-01-01',
      years: 12,
      meanFlow: 5.2,
      noiseStart: 40721,
      outage: { from: '2018-07-09', to: '2018-07-20' },
    },
  },
  {
    site: {
      name: 'Skelby gauging weir',
      riverName: 'Brackwin Water',
      location: { lat: 54.5604, lng: -2.635 },
      reach: { type: 'LineString', coordinates: [[-2.6361, 54.5609], [-2.6352, 54.5605], [-2.6341, 54.5601]] },
      altitude_m: 141,
      weir: {
        grossHead_m: 1.6, crestWidth_m: 22, shape: 'sharp-crested-straight-slope', waterQuality: 'clean',
        // Heads from the weir's hydraulics: a surveyed crest 1.9 m above the channel bed, and the cobbled channel below it
        // (14 m wide, 1 in 670, Manning's n 0.04); about 1.6 m of head at the median flow, and the weir drowns above about 34 m³/s.
        hydraulics: { crestHeight_m: 1.9, dischargeCoefficient: null, tail: { kind: 'manning', channelWidth_m: 14, bedSlope: 0.0015, roughnessN: 0.04 } },
      },
      headTable: [],
      reservedFlow: { kind: 'fixed', flow: 1.1 },
      flowRules: { ...NO_FLOW_RULES },
      months: months(TEMPS, [99, 99, 98, 97, 95, 91, 86, 85, 89, 94, 97, 98], '%sat', { flows: SKELBY_MONTH_FLOWS }),
      catchment: null,
      fdcPoints: SKELBY_FDC,
      targetOxygen_mgL: 6,
      notes: 'Triangular-profile gauging weir of the (invented) Fellside River Agency; its flow-duration curve is published, the daily record is not, but its monthly mean flows are (the seasonal profile).',
    },
  },
  {
    site: {
      name: 'Cragg Foot drop',
      riverName: 'Brackwin Water',
      location: { lat: 54.5478, lng: -2.6032 },
      reach: { type: 'LineString', coordinates: [[-2.6046, 54.5483], [-2.6038, 54.548], [-2.6029, 54.5477], [-2.6019, 54.5473], [-2.6011, 54.5471]] },
      altitude_m: 96,
      weir: { grossHead_m: 1.35, crestWidth_m: 26, shape: 'round-broad-crested-curved-face', waterQuality: 'slightly-polluted' },
      // The tail pool backs up in floods: the head falls as the river rises.
      headTable: [
        { flow: 1, head: 1.35 },
        { flow: 5, head: 1.3 },
        { flow: 15, head: 1.12 },
        { flow: 30, head: 0.85 },
        { flow: 60, head: 0.5 },
      ],
      reservedFlow: { kind: 'percentile', exceedance: 95 },
      flowRules: { ...NO_FLOW_RULES },
      // Nobody sampled the winter months (the outfall survey ran March to November): stand-in values.
      months: months(TEMPS, [11.9, 11.7, 11.1, 10.2, 9.2, 8.3, 7.6, 7.5, 8.4, 9.5, 10.8, 11.6], 'mg/L', { notMeasured: [12, 1, 2] }),
      // Below the Skelby gauge with a larger catchment: its curve scaled by area ratio.
      catchment: { siteArea_km2: 148, gaugeArea_km2: 121 },
      fdcPoints: SKELBY_FDC,
      targetOxygen_mgL: 6.5,
      notes: 'Low concrete drop below the village outfall; summer oxygen is the concern. Flows scaled from Skelby gauging weir by catchment area. Upstream oxygen for December to February was not measured: the values are stand-ins.',
    },
  },
]

/** Next state and a value in [0, 1) of a 32-bit linear congruential walk (Numerical Recipes constants). */
function step(state: number): [number, number] {
  const next = (Math.imul(state, 1664525) + 1013904223) >>> 0
  return [next, next / 4294967296]
}

/**
 * Deterministic daily flows for a demo record: a seasonal curve (high in January, low in late July)
 * times a log-normal pseudo-random walk with occasional spates, scaled to the wanted mean. The same
 * spec always gives the same days; the outage days are gaps (null).
 */
export function demoDailyFlows(spec: DemoRecordSpec): { date: string; flow: number | null }[] {
  const start = Date.parse(`${spec.firstDay}T00:00:00Z`)
  const end = Date.UTC(new Date(start).getUTCFullYear() + spec.years, new Date(start).getUTCMonth(), new Date(start).getUTCDate())
  const n = Math.round((end - start) / 86_400_000)
  let state = spec.noiseStart >>> 0
  let walk = 0
  const raw = new Float64Array(n)
  let sum = 0
  for (let i = 0; i < n; i++) {
    let u: number
    let e = 0
    for (let k = 0; k < 3; k++) {
      ;[state, u] = step(state)
      e += u - 0.5
    }
    ;[state, u] = step(state)
    walk = 0.93 * walk + 0.22 * e + (u < 0.03 ? 0.8 : 0)
    const t = start + i * 86_400_000
    const dayOfYear = (t - Date.UTC(new Date(t).getUTCFullYear(), 0, 1)) / 86_400_000
    const season = 1 + 0.6 * Math.cos((2 * Math.PI * (dayOfYear - 20)) / 365.25)
    raw[i] = season * Math.exp(walk)
    sum += raw[i]!
  }
  const factor = spec.meanFlow / (sum / n)
  const days: { date: string; flow: number | null }[] = new Array(n)
  for (let i = 0; i < n; i++) {
    const date = new Date(start + i * 86_400_000).toISOString().slice(0, 10)
    const gap = spec.outage && date >= spec.outage.from && date <= spec.outage.to
    days[i] = { date, flow: gap ? null : Math.round(raw[i]! * factor * 1000) / 1000 }
  }
  return days
}

// ——— Design options and their stored assessments ———
// Three options at Hollin Mill weir (the third models the reviewer's summer closure as closed
// months), two at Skelby gauging weir (a deep pair that adds oxygen, and a shallow pair that would
// cost the river oxygen, run river first, which gives up energy to avoid it), one at Cragg Foot drop.
// The seed stores one assessment of each, computed by the real engine from the site and option as
// stored (server/domain/assessments.ts).

/** One demo option: the site it belongs to (by name) and the option as a form would send it. */
export interface DemoOption {
  siteName: string
  option: OptionInputDraft
}

export const DEMO_OPTIONS: readonly DemoOption[] = [
  {
    siteName: 'Hollin Mill weir',
    option: {
      name: 'Two units in the old leat',
      notes: 'Both venturis set side by side in the silted leat mouth, air pipes up the left-bank wall to one turbine house.',
      design: {
        units: 2, throatDiameter_m: 0.55, outletDiameter_m: 1.1, throatDepth_m: 2.5, air: { pipeDiameter_m: 0.45, pipeLength_m: 9 },
        // The maker's sound power level of one air turbine, for the noise check at Mill Cottage.
        turbine: { soundPower_dBA: 92 },
        // The leat walls stand already: less civil work per m³/s than a new cut.
        costs: { fixedCost: 45_000, ratedPowerPrice: 650, civilsPerDesignFlow: 60_000 },
      },
    },
  },
  {
    siteName: 'Hollin Mill weir',
    option: {
      name: 'Three smaller units across the crest',
      notes: 'Three units spread along the weir crest; more civils, but they stage in one by one as the river rises.',
      design: {
        units: 3, throatDiameter_m: 0.5, outletDiameter_m: 1.0, throatDepth_m: 3, air: { pipeDiameter_m: 0.4, pipeLength_m: 11 },
        costs: { fixedCost: 50_000, ratedPowerPrice: 650, civilsPerDesignFlow: 85_000 },
      },
    },
  },
  {
    siteName: 'Hollin Mill weir',
    option: {
      name: 'Old leat pair, held off June to September',
      notes: 'The two-unit leat design under the agency\'s condition 2: every unit shut from June to September, when the river is lowest and warmest.',
      design: {
        units: 2, throatDiameter_m: 0.55, outletDiameter_m: 1.1, throatDepth_m: 2.5, air: { pipeDiameter_m: 0.45, pipeLength_m: 9 },
        operation: { closedMonths: [6, 7, 8, 9] },
        costs: { fixedCost: 45_000, ratedPowerPrice: 650, civilsPerDesignFlow: 60_000 },
      },
    },
  },
  {
    siteName: 'Skelby gauging weir',
    option: {
      name: 'Pair below the gauging section',
      notes: 'Kept clear of the gauging section so the agency\'s rating is undisturbed.',
      design: {
        units: 2, throatDiameter_m: 0.5, outletDiameter_m: 1.0, throatDepth_m: 2.5, air: { pipeDiameter_m: 0.4, pipeLength_m: 7 },
        costs: { fixedCost: 55_000, ratedPowerPrice: 650, civilsPerDesignFlow: 78_000 },
      },
    },
  },
  {
    siteName: 'Skelby gauging weir',
    option: {
      name: 'Shallow pair, river first',
      notes: 'The same pair with the throats only 0.8 m down, for a cheaper dig. Shallow bubbles give back less than the weir\'s own fall, so run energy first it would cost the river oxygen at middle flows; run river first, the units stay shut wherever they would, and the energy given up shows on the result.',
      design: {
        units: 2, throatDiameter_m: 0.5, outletDiameter_m: 1.0, throatDepth_m: 0.8, air: { pipeDiameter_m: 0.4, pipeLength_m: 7 },
        operation: { mode: 'river-first' },
        // The cheaper dig: shallower throats need less excavation per m³/s.
        costs: { fixedCost: 55_000, ratedPowerPrice: 650, civilsPerDesignFlow: 62_000 },
      },
    },
  },
  {
    siteName: 'Cragg Foot drop',
    option: {
      name: 'Pair on the right bank',
      notes: 'Right bank, away from the village outfall; chosen to test the summer oxygen case. Set against a cross-flow turbine: the reviewer asked what the river gains for the energy given up.',
      design: {
        units: 2, throatDiameter_m: 0.55, outletDiameter_m: 1.2, throatDepth_m: 2.5, air: { pipeDiameter_m: 0.45, pipeLength_m: 8 },
        costs: { fixedCost: 50_000, ratedPowerPrice: 650, civilsPerDesignFlow: 78_000 }, baseline: { kind: 'cross-flow' },
      },
    },
  },
]

// ——— Review, comments, summary link and invitation ———
// Idris submits the two-unit option at Hollin Mill weir; he and Elspeth talk it through; Elspeth
// accepts it with conditions (the stored assessment shows the units add a little oxygen from October
// to April and barely run from June to September, so the conditions hold them off then until
// monitoring confirms the figures; the third Hollin Mill option models that closure). Idris shares a
// summary link with Tobias; Morwenna has invited a second (invented) agency officer to review
// Skelby gauging weir only.

/** One comment of the demo thread; `by` is a demo account's role. */
export interface DemoComment {
  by: 'engineer' | 'reviewer'
  body: string
  month?: number
  flagId?: 'gas-supersaturation' | 'oxygen-below-target' | 'net-oxygen-loss' | 'scheme-below-target' | 'cavitation'
}

export const DEMO_REVIEW = {
  siteName: 'Hollin Mill weir',
  optionName: 'Two units in the old leat',
  note: 'Two units in the old leat mouth, Q95 kept over the weir. Twelve years of logger flows behind it.',
  comments: [
    { by: 'engineer', body: '@Elspeth Garrow the reserved flow is the Q95 of the owner\'s logger record; the gap in July 2018 is left out, not filled.' },
    {
      by: 'reviewer',
      body: 'From June to September the units would run only a few days a month and add nothing measurable, and that is when the river is lowest and warmest. Could they be held off then until monitoring confirms the oxygen and gas figures? @Idris Penrose',
      month: 6,
      flagId: 'net-oxygen-loss',
    },
    { by: 'engineer', body: 'Yes: the controller can hold them off by month; it costs about 1.2 MWh a year (see the option held off June to September). The gas check is clear at every flow.', flagId: 'gas-supersaturation' },
  ] satisfies DemoComment[],
  decision: {
    decision: 'accepted-with-conditions' as const,
    reason:
      'The Q95 reserved flow is kept at every flow, the river stays above the 6 mg/L target in every month with and without the scheme, the scheme never costs the river oxygen, and the gas check is clear. The summer months, when the river is most at risk, are dealt with by condition 2.',
    conditions:
      '1. Keep at least the Q95 flow over the weir crest and fish pass at all times.\n2. Hold the units off from June to September until two years of monitoring show no net oxygen loss and no gas supersaturation below the weir.\n3. Log dissolved oxygen below the weir monthly for the first two years and send the readings to the agency.\n4. Screen the venturi intakes before the first run.',
    /** The permissions of the consents list the decision requires granted. */
    requiredConsents: ['abstraction-licence', 'fish-passage'] as ConsentKind[],
  },
}

/**
 * Token of the demo summary link, DEMO ONLY: it is fixed so the README can show `/s/<token>`. Real
 * links are 128-bit random and shown once. The seed stores only its hash, like any other.
 */
export const DEMO_SUMMARY_TOKEN = 'demo-hollin-mill-summary-2026'
export const DEMO_SUMMARY_LINK = { siteName: 'Hollin Mill weir', note: 'For Tobias Wren (landowner, left bank)', days: 365 }

/** A pending invitation: a second (invented) agency officer, asked to review one site. */
export const DEMO_INVITATION = { email: 'rhiannon@fellside-agency.example', role: 'reviewer' as const, siteName: 'Skelby gauging weir' }

// ——— Consents and constraints ———
// Hollin Mill weir's consents list part-way through: the landowner and heritage consents in hand, the
// flood-risk permit granted with conditions, the abstraction licence and fish passage applied for,
// the grid connection refused (no capacity at the village substation), the rest not started or not
// needed. Mill Cottage stands 120 m from the turbine house, so the noise check shows a figure.
// Skelby gauging weir is a gauging station: its warning shows. References are invented.

/** One permission of a demo site's consents list. */
export interface DemoConsent {
  kind: ConsentKind
  status: ConsentStatus
  reference?: string
  appliedOn?: string
  decidedOn?: string
  conditions?: string
  notes?: string
}

/** The consents list and constraints of a demo site. */
export interface DemoConsents {
  siteName: string
  constraints: { nearestDwelling_m: number | null; noiseLimit_dBA: number | null; isGaugingStation: boolean }
  consents: DemoConsent[]
}

export const DEMO_CONSENTS: readonly DemoConsents[] = [
  {
    siteName: 'Hollin Mill weir',
    constraints: { nearestDwelling_m: 120, noiseLimit_dBA: null, isGaugingStation: false },
    consents: [
      { kind: 'abstraction-licence', status: 'applied', reference: 'FRA/AB/2026/0117', appliedOn: '2026-06-15', notes: 'Q95 hands-off flow proposed; the agency asked for the twelve-year logger record, sent 2 July.' },
      { kind: 'impoundment-licence', status: 'not-needed', notes: 'The crest is not raised and no new structure holds water back; the agency agreed by e-mail.' },
      {
        kind: 'flood-risk-permit', status: 'granted-with-conditions', reference: 'FRA/FRP/2026/0342', appliedOn: '2026-04-02', decidedOn: '2026-07-20',
        conditions: 'No plant in the channel from 1 October to 31 March. Spoil kept above the 1-in-100-year flood line.',
      },
      { kind: 'fish-passage', status: 'applied', reference: 'FRA/FP/2026/0058', appliedOn: '2026-06-15', notes: 'Notch in the existing fish pass kept wet at Q95.' },
      { kind: 'eel-screening', status: 'not-started', notes: 'Screen design to follow the abstraction licence.' },
      { kind: 'heritage', status: 'granted', reference: 'HDC/LBC/26/0088', appliedOn: '2026-02-10', decidedOn: '2026-04-28', notes: 'The mill race wall is listed; the turbine house stands clear of it.' },
      { kind: 'landowner', status: 'granted', reference: 'Letter of agreement, Brackwin Farm', appliedOn: '2026-02-01', decidedOn: '2026-03-10' },
      { kind: 'grid-connection', status: 'refused', reference: 'NW-CQ-558213', appliedOn: '2026-05-05', decidedOn: '2026-08-14', notes: 'No capacity at the village substation before 2029; to ask again for export behind the farm meter.' },
    ],
  },
  {
    siteName: 'Skelby gauging weir',
    constraints: { nearestDwelling_m: null, noiseLimit_dBA: null, isGaugingStation: true },
    consents: [
      { kind: 'gauging-station', status: 'applied', reference: 'FRA/HYD/2026/0021', appliedOn: '2026-08-03', notes: 'The agency\'s hydrometry team wants check gaugings before and after the works.' },
    ],
  },
]

// ——— Commissioning ———
// The two-unit leat scheme at Hollin Mill weir, built and measured one October morning (invented):
// a mercury manometer on the first unit's throat, oxygen in the head pool and below the weir after
// mixing. It performs as assessed.

/** The demo commissioning record, as the form would send it (the assessment is the option's stored one). */
export const DEMO_COMMISSIONING = {
  siteName: 'Hollin Mill weir',
  optionName: 'Two units in the old leat',
  record: {
    measuredAt: '2026-10-14T11:20',
    measuredBy: 'Cerys Dunmoor (site technician)',
    riverFlow_m3s: 6.2,
    waterTemp_C: 10.5,
    manometerFluid: 'mercury' as const,
    reading_m: 0.872,
    readingUnit: 'm-of-manometer-fluid' as const,
    upstreamOxygen_mgL: 9.7,
    downstreamOxygen_mgL: 10.45,
    oxygenMeasuredAt: 'below-weir' as const,
    notes: 'Unit 1 only, unit 2 shut for the reading. Manometer read from the bank platform with the tappings valved; oxygen by handheld probe, calibrated that morning, in the head pool and 40 m below the weir.',
  },
}
