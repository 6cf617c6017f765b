// How a stored assessment is shown: its headline figures, flag titles, levels and facts, the words
// for regimes, shut reasons and month bases, and the operating modes' names. Results stored by an
// older engine may lack the newer fields (a flag's level, share and worst value; a row's shut reason),
// so every helper here takes them as possibly missing.
import { MONTH_NAMES, MONTH_SHORT } from '#shared/utils/months'
import type { OperatingMode, Regime, ShutReason } from '#shared/engine/operation'
import { storedVerdict, type StoredMoney } from '#shared/engine/money'
import type { AssessSummary, Flag, FlagId, FlagLevel, MonthRow } from '#shared/engine/results'
import type { Currency } from '#shared/schemas/organisation'
import { formatMoney, formatNumber, moneyUnit } from './format'

/** One headline figure. */
export interface Headline {
  key: string
  label: string
  /** The figure as text, without its unit. */
  value: string
  unit: string
  /** Plain words on how it was reached. */
  note?: string
  /** True when the figure is a worry (net oxygen loss, margin under the limit, no energy). */
  warn?: boolean
}

/** A net oxygen change with its sign ("+0.12", "−0.30", "0.00"), or a dash when missing. */
export function signedMgL(x: number, digits = 2): string {
  if (!Number.isFinite(x)) return '–'
  const text = formatNumber(Math.abs(x), digits)
  if (Number(text.replace(/,/g, '')) === 0) return formatNumber(0, digits)
  return `${x > 0 ? '+' : '−'}${text}`
}

/** A share (0–1) as a whole percentage, "under 1" for a small share that is not none. */
export function percentText(share: number): string {
  return share > 0 && share < 0.005 ? 'under 1' : formatNumber(share * 100, 0)
}

const isNumber = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x)

/** The headline figures of a summary, each with its unit, money in `currency` (the year's oxygen and the diffuser's recovery only when the run has them). */
export function headlineFigures(s: AssessSummary, currency: Currency, minMargin_m?: number): Headline[] {
  const margin = s.minCavitationMargin_m
  const figures: Headline[] = [
    { key: 'energy', label: 'Annual energy', value: formatNumber(s.annualEnergy_MWh, 1), unit: 'MWh/yr', warn: !(s.annualEnergy_MWh > 0) },
    { key: 'cf', label: 'Capacity factor', value: formatNumber(s.capacityFactor * 100, 1), unit: '%', note: `${formatNumber(s.annualFullLoad_h, 0)} full-load h/yr` },
    { key: 'rated', label: 'Rated power', value: formatNumber(s.ratedPower_kW, 1), unit: 'kW', note: s.ratingSizedToDesign ? 'sized to the design point' : 'as entered' },
    {
      key: 'margin', label: 'Least cavitation margin', value: margin === null ? 'units never run' : formatNumber(margin, 2), unit: margin === null ? '' : 'm',
      warn: margin !== null && minMargin_m !== undefined && margin < minMargin_m, note: minMargin_m !== undefined ? `keep at least ${formatNumber(minMargin_m, 1)} m` : undefined,
    },
    {
      key: 'oxygen', label: 'Net oxygen gain, summer low flow', value: signedMgL(s.netOxygenGainSummerLowFlow_mgL), unit: 'mg/L',
      warn: s.netOxygenGainSummerLowFlow_mgL < 0, note: s.netOxygenGainSummerLowFlow_mgL < 0 ? 'a loss: the river is worse off with the scheme' : `${MONTH_SHORT[s.summerLowFlow.month - 1] ?? ''} at ${formatNumber(s.summerLowFlow.flow_m3s, 2)} m³/s`,
    },
  ]
  const mean = (s as Partial<AssessSummary>).meanNetOxygenGain_mgL
  const worst = (s as Partial<AssessSummary>).worstNetOxygenGain_mgL
  if (isNumber(mean) && isNumber(worst)) {
    figures.push({
      // A worry only when it shows as a loss (a mean of −0.001 shows as 0.00).
      key: 'oxygen-year', label: 'Net oxygen change over the year', value: signedMgL(mean), unit: 'mg/L', warn: signedMgL(mean).startsWith('−'),
      note: `mean over the year; worst ${signedMgL(worst)} mg/L at any flow`,
    })
  }
  const recovered = (s as Partial<AssessSummary>).recoveredFraction
  if (isNumber(recovered)) {
    figures.push({ key: 'recovery', label: 'Diffuser recovery', value: formatNumber(recovered * 100, 0), unit: '%', note: 'pressure recovered by the diffuser' })
  }
  figures.push({ key: 'lcoe', label: 'LCOE', value: s.lcoe === null ? 'no energy' : formatNumber(s.lcoe, 0), unit: s.lcoe === null ? '' : moneyUnit(currency, 'MWh') })
  return figures
}

// ——— money ———

export type { StoredMoney }

/** Whether the scheme pays and why not, from the stored figures (worked out again for a run stored without them). */
export function moneyVerdict(m: StoredMoney): { pays: boolean; revenueBelowOpex: boolean; negativeNpv: boolean; breakEvenPrice: number | null } {
  const v = storedVerdict(m)
  return { pays: v.pays, revenueBelowOpex: v.shortfalls.includes('revenue-below-opex'), negativeNpv: v.shortfalls.includes('negative-npv'), breakEvenPrice: v.breakEvenPrice }
}

/**
 * Whether the scheme pays, in one plain sentence with the organisation's currency: "Does not pay:
 * revenue £420 a year is below the operating cost £1,900 a year; NPV −£169,000 at £100 per MWh; it
 * would need £1,830 per MWh to break even."
 */
export function moneySentence(m: StoredMoney, currency: Currency): string {
  const v = moneyVerdict(m)
  const money = (x: number) => formatMoney(x, currency)
  const price = m.exportPrice === undefined ? 'the export price' : `${money(m.exportPrice)} per MWh`
  if (v.pays) return `Pays: NPV ${money(m.npv)} at ${price}${v.breakEvenPrice === null ? '' : `; it breaks even at ${money(v.breakEvenPrice)} per MWh`}.`
  const parts: string[] = []
  if (v.revenueBelowOpex) parts.push(`revenue ${money(m.annualRevenue)} a year is below the operating cost ${money(m.annualOpex)} a year`)
  if (v.negativeNpv) parts.push(`NPV ${money(m.npv)} at ${price}`)
  parts.push(v.breakEvenPrice === null ? 'it makes no energy, so no price would make it pay' : `it would need ${money(v.breakEvenPrice)} per MWh to break even`)
  return `Does not pay: ${parts.join('; ')}.`
}

/** A flag's reason for the screen: the money flag's in the organisation's currency, the others as the engine gave them. */
export function flagReason(f: StoredFlag, money: StoredMoney | null | undefined, currency: Currency): string {
  return f.id === 'does-not-pay' && money ? moneySentence(money, currency) : f.reason
}

// ——— flags ———

/** Plain titles of the flags. */
export const FLAG_TITLES: Record<FlagId, string> = {
  'cavitation': 'Cavitation at the throat',
  'gas-supersaturation': 'Gas supersaturation',
  'scheme-below-target': 'Scheme keeps the river below target',
  'net-oxygen-loss': 'Oxygen cost to the river',
  'oxygen-below-target': 'River below the oxygen target',
  'never-runs': 'Units never run',
  'does-not-pay': 'Does not pay',
}

/** Titles of flags only older engines raised. */
const OLDER_FLAG_TITLES: Record<string, string> = { 'head-limited-never-runs': 'Units never run' }

/** The plain title of a flag, also of one an older engine named. */
export function flagTitle(id: string): string {
  return FLAG_TITLES[id as FlagId] ?? OLDER_FLAG_TITLES[id] ?? id
}

/** How each level of flag is named on screen (beside its colour, never instead of it). */
export const FLAG_LEVEL_LABELS: Record<FlagLevel, string> = { safety: 'Safety', river: 'River caution', money: 'Money caution', note: 'Note' }

const LEVEL_ORDER: Record<FlagLevel, number> = { safety: 0, river: 1, money: 2, note: 3 }

/** A flag as an older engine may have stored it: without a level, share of time or worst value. */
export type StoredFlag = Pick<Flag, 'id' | 'raised' | 'safety' | 'reason'> & Partial<Pick<Flag, 'level' | 'shareOfTime' | 'worst'>>

/** A flag's level; a flag stored without one is a safety flag when it says so, else a note. */
export function flagLevel(f: Pick<StoredFlag, 'safety' | 'level'>): FlagLevel {
  return f.level ?? (f.safety ? 'safety' : 'note')
}

/** The result's flags: raised first, then safety, river cautions, money cautions and notes, each in the engine's order. */
export function orderedFlags(result: { summary: { flags: StoredFlag[] } }): StoredFlag[] {
  return [...result.summary.flags].sort((a, b) => Number(b.raised) - Number(a.raised) || LEVEL_ORDER[flagLevel(a)] - LEVEL_ORDER[flagLevel(b)])
}

/**
 * A flag's share of the year and worst value in a few words ("raised 12 % of the year · worst −0.31
 * mg/L in Aug at 0.62 m³/s"); empty when the run stored neither.
 */
export function flagFacts(f: StoredFlag): string {
  const parts: string[] = []
  if (f.raised && isNumber(f.shareOfTime)) parts.push(`raised ${percentText(f.shareOfTime)} % of the year`)
  const w = f.worst
  if (w && isNumber(w.value)) {
    const value = w.unit === 'mg/L' && f.id === 'net-oxygen-loss' ? signedMgL(w.value) : formatNumber(w.value, w.unit === '%' ? 0 : 2)
    parts.push(`worst ${value} ${w.unit} in ${w.monthName} at ${formatNumber(w.flow_m3s, 2)} m³/s`)
  }
  return parts.join(' · ')
}

/** Plain names of the oxygen methods. */
export const METHOD_NAMES = { 'bubble-model': 'Bubble model', 'field-transfer': 'Field transfer (cross-check)' } as const

// ——— the operating rule ———

/** Plain names of the operating modes. */
export const MODE_NAMES: Record<OperatingMode, string> = { 'energy-first': 'Energy first', 'river-first': 'River first' }

/** How the units share the flow at one river flow, in plain words. */
export const REGIME_WORDS: Record<Regime, string> = {
  'stopped': 'stopped',
  'spilling': 'units full, the rest spills',
  'taking-all': 'units take all they may, pool held',
}

/** Regimes only older engines stored. */
const OLDER_REGIME_WORDS: Record<string, string> = { 'head-limited': 'units full, the rest spills', 'flow-limited': 'units take all the flow' }

/** A per-flow row's regime in plain words, also one an older engine stored. */
export function regimeText(regime: string): string {
  return REGIME_WORDS[regime as Regime] ?? OLDER_REGIME_WORDS[regime] ?? regime
}

/** Why units stay shut at a flow, in plain words. */
export const SHUT_REASON_WORDS: Record<ShutReason, string> = {
  'too-little-flow': 'not enough water to feed a unit at the pool level',
  'no-suction': 'would draw no air',
  'below-cut-in': 'below turbine cut-in',
  'closed-month': 'closed month',
  'river-first': 'shut for the river',
  'no-head': 'no head',
}

/** A shut reason in plain words; '–' when every unit the water can feed runs (or the run did not say). */
export function shutReasonText(reason: ShutReason | null | undefined): string {
  return reason ? (SHUT_REASON_WORDS[reason] ?? reason) : '–'
}

/** Months (1–12) by name, in calendar order ("June, July and August"); "none" for none. */
export function monthsNamed(months: readonly number[]): string {
  const names = [...new Set(months)].sort((a, b) => a - b).map((m) => MONTH_NAMES[m - 1] ?? String(m))
  if (!names.length) return 'none'
  return names.length === 1 ? names[0]! : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`
}

// ——— the month table's bases ———

/** Where a month's flow comes from: a short tag for a cell, and a sentence for under the table. */
export const FLOW_BASIS_WORDS: Record<MonthRow['flowBasis'], { tag: string; sentence: string }> = {
  'record-mean': { tag: 'record mean', sentence: "the mean of the record's days in that month" },
  'profile-median': { tag: 'profile median', sentence: "the median of the annual curve scaled by that month's entered flow (the seasonal profile)" },
  'annual-q50': { tag: 'annual median', sentence: 'the annual median flow (Q50), as there is no seasonal profile' },
}

/** Where a month's energy comes from: a short tag and a sentence. */
export const ENERGY_BASIS_WORDS: Record<MonthRow['energyBasis'], { tag: string; sentence: string }> = {
  'record': { tag: 'record', sentence: "the record's days in that month" },
  'month-curve': { tag: 'month curve', sentence: "the annual curve scaled by that month's entered flow" },
  'annual-curve': { tag: 'annual curve', sentence: "the annual curve at that month's temperature and oxygen" },
}

/** A basis in words (a stored value an older engine wrote is shown as stored). */
export function basisWords<K extends string>(table: Record<K, { tag: string; sentence: string }>, basis: string): { tag: string; sentence: string } {
  return table[basis as K] ?? { tag: basis, sentence: basis }
}

/** The distinct values of a month-row field, in order of first appearance. */
export function distinctOf<K extends 'flowBasis' | 'energyBasis'>(rows: readonly Pick<MonthRow, K>[], key: K): MonthRow[K][] {
  return [...new Set(rows.map((r) => r[key]))]
}

/** True when a curve site's months all read the annual curve (no seasonal profile to shape them). */
export function needsSeasonalProfile(rows: readonly Partial<Pick<MonthRow, 'curveBasis'>>[], hydrologyBasis: 'fdc' | 'record'): boolean {
  return hydrologyBasis === 'fdc' && rows.some((r) => r.curveBasis === 'annual-curve')
}
