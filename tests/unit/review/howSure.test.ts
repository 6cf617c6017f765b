// How sure the figures are, for the reviewer's brief and the landowner summary (shared/utils/howSure.ts).
import { describe, expect, it } from 'vitest'
import type { AssessResult } from '../../../shared/engine/results'
import { drawsInWords, howSureOf, howSureSentences, plainEnergy, type HowSure } from '../../../shared/utils/howSure'

const spread = (p90: number | null, p50: number | null) => ({ p90, p50, p10: null })
const driest = { year: 2003, daysWithData: 365, meanFlow_m3s: 1.9, energy_MWh: 6.12, meanNetGain_mgL: 0.1, worstMonthNetGain_mgL: -0.04, worstMonth: 8, worstMonthName: 'August' }
/** A stored result holding only what the figures are read from. */
const stored = (over: Partial<AssessResult>) => ({ ...over }) as AssessResult

const full: HowSure = {
  stored: true,
  monteCarlo: { draws: 200, energyP90_MWh: 8.24, energyP50_MWh: 9.6, netLossProbability: 0.2, acceptableOxygenLoss_mgL: 0 },
  record: { completeYears: 12, p50Energy_MWh: 9.1, p90Energy_MWh: 7.46, driest: null },
}

describe('howSureOf', () => {
  it('reads the Monte Carlo and the record\'s years from a stored result, with the acceptable loss of its input', () => {
    const h = howSureOf(stored({
      uncertainty: { draws: 200, energy_MWh: spread(8.24, 9.6), netLossProbability: 0.215 } as AssessResult['uncertainty'],
      years: { years: Array(12).fill(driest), p50Energy_MWh: 9.1, p90Energy_MWh: 7.46, driest } as unknown as AssessResult['years'],
    }), 0.1)
    expect(h).toEqual({
      stored: true,
      monteCarlo: { draws: 200, energyP90_MWh: 8.24, energyP50_MWh: 9.6, netLossProbability: 0.215, acceptableOxygenLoss_mgL: 0.1 },
      record: { completeYears: 12, p50Energy_MWh: 9.1, p90Energy_MWh: 7.46, driest: { year: 2003, energy_MWh: 6.12, meanFlow_m3s: 1.9, worstMonthName: 'August', worstMonthNetGain_mgL: -0.04 } },
    })
  })

  it('tells a run without draws or a record from one stored before these figures existed', () => {
    expect(howSureOf(stored({ uncertainty: null, years: null }), 0.1)).toEqual({ stored: true, monteCarlo: null, record: null })
    expect(howSureOf(stored({}), 0.1)).toEqual({ stored: false, monteCarlo: null, record: null })
  })
})

describe('the landowner\'s sentences', () => {
  it('say the record\'s P90 year and the chance of a loss as plain frequencies', () => {
    expect(howSureSentences(full)).toEqual([
      'In 9 years of 10 the scheme would make at least 7.5 MWh, judged from the 12 complete years of the daily flow record.',
      'In 1 draw of 5 of the uncertain inputs, the river would lose oxygen in its worst month.',
    ])
  })

  it('fall back on the Monte Carlo\'s P90 without 9 record years, and name an acceptable loss above zero', () => {
    const h: HowSure = { ...full, monteCarlo: { ...full.monteCarlo!, netLossProbability: 0.215, acceptableOxygenLoss_mgL: 0.1 }, record: { ...full.record!, p90Energy_MWh: null } }
    expect(howSureSentences(h)).toEqual([
      'In 9 draws of 10 of the uncertain inputs, the scheme would make at least 8.2 MWh in an average year.',
      'In about 1 draw of 5 of the uncertain inputs, the river would lose more than 0.1 mg/L of oxygen in its worst month.',
    ])
  })

  it('say "none" and "every" plainly, nothing without draws or a record, and that an older run cannot say', () => {
    const none = howSureSentences({ ...full, record: null, monteCarlo: { ...full.monteCarlo!, netLossProbability: 0 } })
    expect(none[1]).toBe('In none of the 200 draws of the uncertain inputs would the river lose oxygen in its worst month.')
    expect(howSureSentences({ ...full, monteCarlo: { ...full.monteCarlo!, netLossProbability: 1 } })[1]).toMatch(/^In every draw of the uncertain inputs/)
    expect(howSureSentences({ stored: true, monteCarlo: null, record: null })).toEqual([])
    expect(howSureSentences({ stored: false, monteCarlo: null, record: null })[0]).toMatch(/older run/)
  })
})

describe('plain numbers', () => {
  it('round energy by its size, one rule, never a signed zero', () => {
    expect(plainEnergy(61.4)).toBe('61')
    expect(plainEnergy(8.24)).toBe('8.2')
    expect(plainEnergy(0.347)).toBe('0.35')
    expect(plainEnergy(12_345.6)).toBe('12,346')
    expect(plainEnergy(-0.001)).toBe('0')
    expect(plainEnergy(-0)).toBe('0')
  })

  it('give a share of draws to the nearest tenth in lowest terms, "about" when rounded', () => {
    expect(drawsInWords(0.2)).toBe('1 draw of 5')
    expect(drawsInWords(0.215)).toBe('about 1 draw of 5')
    expect(drawsInWords(0.5)).toBe('1 draw of 2')
    expect(drawsInWords(0.3)).toBe('3 draws of 10')
    expect(drawsInWords(0.38)).toBe('about 2 draws of 5')
    expect(drawsInWords(0.01)).toBe('fewer than 1 draw of 20')
    expect(drawsInWords(0.97)).toBe('more than 19 draws of 20')
  })
})
