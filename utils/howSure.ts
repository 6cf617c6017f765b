// How sure the figures are, in the app's words: the results page's card (the Monte Carlo's P90/P50/P10
// rows, each input's spread, the chance of a loss, the preview's form checks and its browser worker's
// messages) and the reviewer's "How sure" lines (the stored Monte Carlo's P90/P50 annual energy and
// chance of a net oxygen loss, the daily record's P90 and driest years). Pure, so it unit-tests in
// node; the landowner's sentences are made on the server (shared/utils/howSure.ts).
import type { HowSure } from '#shared/utils/howSure'
import { signedMgL } from './assessment'
import type { DrawSpread, UncertaintyResult } from '#shared/engine/monteCarlo'
import type { Spread } from '#shared/engine/random'
import type { AssessInput } from '#shared/schemas/assess'
import type { Currency } from '#shared/schemas/organisation'
import { formatCount, formatMoney, formatNumber, formatUpTo, moneyUnit } from './format'

const mwh = (x: number) => `${formatNumber(x, 1)} MWh`

/** The brief's how-sure lines, null-safe for runs without draws, without a record, or from an older engine. */
export function howSureLines(h: HowSure): string[] {
  if (!h.stored) return ['This run comes from an engine before the uncertainty figures: re-run it to see how sure the figures are.']
  const lines: string[] = []
  const mc = h.monteCarlo
  if (mc && mc.draws > 0) {
    const p90 = mc.energyP90_MWh === null ? '–' : mwh(mc.energyP90_MWh)
    const p50 = mc.energyP50_MWh === null ? '–' : mwh(mc.energyP50_MWh)
    lines.push(`Annual energy over ${formatCount(mc.draws)} draws of the uncertain inputs: at least ${p90} in 9 draws of 10 (P90), ${p50} in half of them (P50).`)
    const acceptable = mc.acceptableOxygenLoss_mgL === null ? 'the acceptable loss' : `the acceptable ${formatNumber(mc.acceptableOxygenLoss_mgL, 2)} mg/L`
    lines.push(`The worst month loses more oxygen than ${acceptable} in ${chanceText(mc.netLossProbability)}.`)
  } else {
    lines.push('No Monte Carlo was run for this assessment: the option\'s engine settings ask for no draws.')
  }
  const r = h.record
  if (r) {
    const p90 = r.p90Energy_MWh === null ? `no P90 year yet (it needs 9 complete years, the record has ${formatCount(r.completeYears)})` : `at least ${mwh(r.p90Energy_MWh)} in 9 years of 10 (P90 year)`
    lines.push(`From the daily record: ${p90}.`)
    const d = r.driest
    if (d) lines.push(`Driest year ${d.year} (${formatNumber(d.meanFlow_m3s, 2)} m³/s on average): ${mwh(d.energy_MWh)}, worst month ${d.worstMonthName} ${signedMgL(d.worstMonthNetGain_mgL)} mg/L of oxygen.`)
  }
  return lines
}

// ——— the results page's card ———

/** What the page asks the worker: the stored input with another seed or number of draws. */
export interface UncertaintyWorkerRequest {
  input: AssessInput
  draws: number
  seed: number
}

/** What the worker answers. */
export type UncertaintyWorkerMessage =
  | { type: 'done', result: UncertaintyResult | null }
  | { type: 'error', message: string }

/** Most draws a preview in the browser may run (the stored runs' limit, MAX_MONTE_CARLO_DRAWS, is the same). */
export { MAX_MONTE_CARLO_DRAWS as MAX_PREVIEW_DRAWS } from '#shared/engine/defaults'

/** One row of the Monte Carlo's table: a figure's P90, P50 and P10 as text. */
export interface SpreadRow {
  label: string
  unit: string
  p90: string
  p50: string
  p10: string
}

const energyFigure = (x: number | null) => formatNumber(x, 1)
const mgl = (x: number | null) => (x === null ? '–' : signedMgL(x))

/** The table rows: energy, cost, NPV (in `currency`) and the worst month's oxygen, each as P90 / P50 / P10. */
export function spreadRows(r: UncertaintyResult, currency: Currency): SpreadRow[] {
  const money = (x: number | null) => formatMoney(x, currency)
  const row = (label: string, unit: string, s: DrawSpread, f: (x: number | null) => string): SpreadRow => ({ label, unit, p90: f(s.p90), p50: f(s.p50), p10: f(s.p10) })
  return [
    row('Annual energy', 'MWh/yr', r.energy_MWh, energyFigure),
    row('Levelised cost', moneyUnit(currency, 'MWh'), r.lcoe, money),
    row('Net present value', moneyUnit(currency), r.npv, money),
    row('Net O₂ change, worst month', 'mg/L', r.worstMonthNetGain_mgL, mgl),
  ]
}

/** A spread in words: "triangular 0.15 – 0.25 – 0.40" or "uniform 0.90 – 0.97". */
export function spreadText(s: Spread, unit: string): string {
  const f = (x: number) => (unit === 'm' ? `${formatUpTo(x * 1000, 1)} mm` : formatUpTo(x, 3))
  return s.kind === 'uniform' ? `uniform ${f(s.low)} – ${f(s.high)}` : `triangular ${f(s.low)} – ${f(s.mode)} – ${f(s.high)}`
}

/** A probability (0–1) in words: "none of the draws", "3 % of draws", "every draw". */
export function chanceText(p: number): string {
  if (!(p > 0)) return 'none of the draws'
  if (p >= 1) return 'every draw'
  return `${p < 0.01 ? 'under 1' : formatNumber(p * 100, 0)} % of draws`
}

/** A probability (0–1) as a whole per cent for a table cell: "0", "<1", "21", ">99", "100"; a dash when the Monte Carlo did not run. */
export function chancePercent(p: number | null | undefined): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return '–'
  if (!(p > 0)) return '0'
  if (p >= 1) return '100'
  if (p < 0.01) return '<1'
  if (p > 0.99) return '>99'
  return formatNumber(p * 100, 0)
}

/** The preview's draws and seed read from the form, or why not. */
export function previewRequest(draws: number | null, seed: number | null, max: number): { draws: number, seed: number } | string {
  if (draws === null || !Number.isInteger(draws) || draws < 1 || draws > max) return `Draws: a whole number from 1 to ${formatUpTo(max)}`
  if (seed === null || !Number.isInteger(seed) || seed < 0 || seed > 4_294_967_295) return 'Seed: a whole number from 0 to 4,294,967,295'
  return { draws, seed }
}
