// The words of the "how sure" card: spreads, chances and the preview's form checks.
import { describe, expect, it } from 'vitest'
import { chancePercent, chanceText, previewRequest, spreadRows, spreadText } from '../../../utils/howSure'
import type { UncertaintyResult } from '../../../shared/engine/monteCarlo'

describe('the how-sure card', () => {
  it('writes a spread in the input\'s own unit, bubble sizes in millimetres', () => {
    expect(spreadText({ kind: 'triangular', low: 0.001, mode: 0.003, high: 0.005 }, 'm')).toBe('triangular 1 mm – 3 mm – 5 mm')
    expect(spreadText({ kind: 'uniform', low: 0.9, high: 0.97 }, '-')).toBe('uniform 0.9 – 0.97')
  })

  it('says a chance in words, never "0 %" or "100 %"', () => {
    expect(chanceText(0)).toBe('none of the draws')
    expect(chanceText(0.004)).toBe('under 1 % of draws')
    expect(chanceText(0.25)).toBe('25 % of draws')
    expect(chanceText(1)).toBe('every draw')
  })

  it('gives a chance as a whole per cent for a table cell, "<1" and ">99" rather than a rounded 0 or 100, a dash when not run', () => {
    expect(chancePercent(null)).toBe('–')
    expect(chancePercent(undefined)).toBe('–')
    expect(chancePercent(0)).toBe('0')
    expect(chancePercent(0.004)).toBe('<1')
    expect(chancePercent(0.21)).toBe('21')
    expect(chancePercent(0.996)).toBe('>99')
    expect(chancePercent(1)).toBe('100')
  })

  it('refuses a preview with no draws, too many, or a seed that does not fit 32 bits, naming the field', () => {
    expect(previewRequest(400, 2, 2000)).toEqual({ draws: 400, seed: 2 })
    expect(previewRequest(0, 2, 2000)).toMatch(/^Draws:/)
    expect(previewRequest(2001, 2, 2000)).toMatch(/^Draws:/)
    expect(previewRequest(1.5, 2, 2000)).toMatch(/^Draws:/)
    expect(previewRequest(10, -1, 2000)).toMatch(/^Seed:/)
    expect(previewRequest(10, 2 ** 32, 2000)).toMatch(/^Seed:/)
    expect(previewRequest(null, 1, 2000)).toMatch(/^Draws:/)
  })

  it('shows a missing percentile as a dash and oxygen with its sign', () => {
    const r = {
      energy_MWh: { p90: 10.04, p50: 12, p10: 15 }, lcoe: { p90: null, p50: 900.4, p10: 1200 }, npv: { p90: -2000, p50: -1000, p10: 10 },
      worstMonthNetGain_mgL: { p90: -0.3, p50: 0, p10: 0.12 },
    } as unknown as UncertaintyResult
    const rows = spreadRows(r, { code: 'GBP', symbol: '£' })
    expect(rows[0]).toMatchObject({ label: 'Annual energy', p90: '10.0', p50: '12.0', p10: '15.0' })
    expect(rows[1]!.p90).toBe('–')
    expect(rows[1]!.p50).toBe('£900')
    expect(rows[2]).toMatchObject({ unit: '£', p90: '−£2,000', p10: '£10' })
    expect(rows[3]).toMatchObject({ p90: '−0.30', p50: '0.00', p10: '+0.12' })
  })
})
