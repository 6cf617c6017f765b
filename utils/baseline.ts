// The one plain line that sets a scheme against the conventional turbine at the same weir, shared by
// the results card, the comparison, the reviewer's brief and the landowner summary.
import type { BaselineLine } from '#shared/engine/results'
import { plainEnergy } from '#shared/utils/howSure'
import { signedMgL } from './assessment'

/** Energy a year with as many decimals as its size needs: 61, 4.2, 0.35 (the landowner summary's one rule). */
export const energyText = plainEnergy

/**
 * "A conventional Archimedes screw at this weir would make 61 MWh a year against this scheme's 4.2;
 * the scheme gives up 57 MWh a year for +0.08 mg/L on average." Says plainly when the scheme gives up
 * energy for no oxygen, and when it gives up none.
 */
export function baselineSentence(b: BaselineLine): string {
  const head = `A conventional ${b.kindLabel} at this weir would make ${energyText(b.annualEnergy_MWh)} MWh a year against this scheme's ${energyText(b.schemeEnergy_MWh)}`
  if (!(b.energyGivenUp_MWh > 0)) return `${head}: the scheme gives up no energy against it.`
  const given = `the scheme gives up ${energyText(b.energyGivenUp_MWh)} MWh a year`
  if (!(b.oxygenGainedOverBaseline_mgL > 0)) {
    return `${head}; ${given} and gains no oxygen for the river over it (${signedMgL(b.oxygenGainedOverBaseline_mgL)} mg/L on average).`
  }
  return `${head}; ${given} for ${signedMgL(b.oxygenGainedOverBaseline_mgL)} mg/L on average.`
}
