// The reviewer's "How sure" lines: the stored Monte Carlo's P90/P50 annual energy and chance of a net
// oxygen loss, and the daily record's P90 and driest years, each said once in plain words. Pure, so
// it unit-tests in node; the landowner's sentences are made on the server (shared/utils/howSure.ts).
import type { HowSure } from '#shared/utils/howSure'
import { signedMgL } from './assessment'
import { formatCount, formatNumber } from './format'
import { chanceText } from './uncertainty'

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
