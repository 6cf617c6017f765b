// The reviewer's "How sure" lines (utils/howSure.ts).
import { describe, expect, it } from 'vitest'
import type { HowSure } from '../../../shared/utils/howSure'
import { howSureLines } from '../../../utils/howSure'

const full: HowSure = {
  stored: true,
  monteCarlo: { draws: 200, energyP90_MWh: 8.24, energyP50_MWh: 9.6, netLossProbability: 0.215, acceptableOxygenLoss_mgL: 0.1 },
  record: { completeYears: 12, p50Energy_MWh: 9.1, p90Energy_MWh: 7.46, driest: { year: 2003, energy_MWh: 6.12, meanFlow_m3s: 1.9, worstMonthName: 'August', worstMonthNetGain_mgL: -0.001 } },
}

describe('the brief\'s how-sure lines', () => {
  it('say the P90/P50 energy, the chance of a loss past the acceptable one, the record\'s P90 year and its driest year', () => {
    expect(howSureLines(full)).toEqual([
      'Annual energy over 200 draws of the uncertain inputs: at least 8.2 MWh in 9 draws of 10 (P90), 9.6 MWh in half of them (P50).',
      'The worst month loses more oxygen than the acceptable 0.10 mg/L in 22 % of draws.',
      'From the daily record: at least 7.5 MWh in 9 years of 10 (P90 year).',
      // a change that rounds to nothing carries no sign
      'Driest year 2003 (1.90 m³/s on average): 6.1 MWh, worst month August 0.00 mg/L of oxygen.',
    ])
  })

  it('say what is missing: no draws, a short record, an older run', () => {
    const short: HowSure = { stored: true, monteCarlo: null, record: { ...full.record!, completeYears: 5, p90Energy_MWh: null, driest: null } }
    expect(howSureLines(short)).toEqual([
      'No Monte Carlo was run for this assessment: the option\'s engine settings ask for no draws.',
      'From the daily record: no P90 year yet (it needs 9 complete years, the record has 5).',
    ])
    expect(howSureLines({ stored: false, monteCarlo: null, record: null })).toEqual(['This run comes from an engine before the uncertainty figures: re-run it to see how sure the figures are.'])
  })
})
