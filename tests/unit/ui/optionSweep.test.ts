// The sweep page's grid from typed ranges (with the 400-point cap) and its pick of the best safe point.
import { describe, expect, it } from 'vitest'
import { bestPoint, sweep, sweepReason } from '../../../shared/engine/sweep'
import { SweepGridSchema } from '../../../shared/schemas/assess'
import { gridFromRanges, rangesAround, rangeValues, type SweepRanges, unitValues } from '../../../utils/sweep'
import { draft, parse } from '../engine/fixtures'

const ranges = (over: Partial<SweepRanges> = {}): SweepRanges => ({
  throatFrom: 0.4, throatTo: 0.6, throatStep: 0.1, units: '1, 2', depthFrom: 1, depthTo: 2, depthStep: 0.5, ...over,
})

describe('sweep grid from ranges', () => {
  it('steps from/to inclusive without floating-point creep', () => {
    expect(rangeValues(0.4, 0.7, 0.1, 'Throat diameter', 0.01, 10)).toEqual([0.4, 0.5, 0.6, 0.7])
    expect(rangeValues(1, 2, 0.5, 'Throat submergence', 0, 30)).toEqual([1, 1.5, 2])
  })

  it('reads unit lists and spans, and refuses what is not a whole number', () => {
    expect(unitValues('3, 1 2')).toEqual([1, 2, 3])
    expect(unitValues('1-4')).toEqual([1, 2, 3, 4])
    expect(unitValues('1.5')).toMatch(/not a whole number/)
    expect(unitValues('')).toMatch(/at least one/)
  })

  it('builds a grid the server schema accepts, with its size', () => {
    const g = gridFromRanges(ranges())
    expect(g.errors).toEqual([])
    expect(g.count).toBe(3 * 2 * 3)
    expect(SweepGridSchema.safeParse(g.grid).success).toBe(true)
  })

  it('caps the grid at 400 points with a clear message, and names a bad range', () => {
    const big = gridFromRanges(ranges({ throatFrom: 0.1, throatTo: 2.0, throatStep: 0.1, units: '1-5', depthFrom: 0, depthTo: 2, depthStep: 0.5 }))
    expect(big.count).toBe(20 * 5 * 5)
    expect(big.grid).toBeNull()
    expect(big.errors.join(' ')).toMatch(/500 points is more than the 400/)
    const backwards = gridFromRanges(ranges({ depthFrom: 3, depthTo: 1 }))
    expect(backwards.errors.join(' ')).toMatch(/Throat submergence: "to" must not be below "from"/)
  })

  it('starts around the option so its own design is on the grid', () => {
    const g = gridFromRanges(rangesAround({ throatDiameter_m: 0.55, units: 2, throatDepth_m: 2.5 }))
    expect(g.errors).toEqual([])
    expect(g.grid!.throatDiameters_m).toContain(0.55)
    expect(g.grid!.units).toContain(2)
    expect(g.grid!.throatDepths_m).toContain(2.5)
  })
})

describe('best acceptable point', () => {
  it('picks the point the engine\'s own sweep picks (the worker runs points one by one)', () => {
    // A weir that aerates little (submerged sluice): some points are safe, the most energetic are not.
    const d = draft()
    d.site.weirShape = 'sluice-gate-submerged'
    const grid = { throatDiameters_m: [0.4, 0.6, 0.8], units: [1, 2], throatDepths_m: [0.5, 1.5, 3] }
    const whole = sweep(parse(d), grid)
    expect(whole.best).not.toBeNull()
    const oneByOne = grid.throatDiameters_m.flatMap((dt) => grid.units.flatMap((n) => grid.throatDepths_m.map((z) => sweep(parse(d), { throatDiameters_m: [dt], units: [n], throatDepths_m: [z] }).points[0]!)))
    expect(oneByOne).toEqual(whole.points)
    expect(bestPoint(oneByOne)).toEqual(whole.best)
  })

  it('never picks an unsafe point, one that costs the river too much oxygen, or one without energy', () => {
    const p = { throatDiameter_m: 1, outletDiameter_m: 2, units: 1, throatDepth_m: 1, capacityFactor: 0.5, ratedPower_kW: 10, minCavitationMargin_m: 3, netOxygenGainSummerLowFlow_mgL: 0.1, meanNetOxygenGain_mgL: 0.05, worstNetOxygenGain_mgL: -0.05, maxUnitTotalDissolvedGas: 1, lcoe: 100, raisedFlags: [] }
    const unsafe = { ...p, annualEnergy_MWh: 90, safe: false, acceptable: false, raisedFlags: ['cavitation' as const] }
    const costly = { ...p, annualEnergy_MWh: 80, safe: true, acceptable: false, raisedFlags: ['net-oxygen-loss' as const] }
    const none = { ...p, annualEnergy_MWh: 0, safe: true, acceptable: true }
    const ok = { ...p, annualEnergy_MWh: 40, safe: true, acceptable: true }
    expect(bestPoint([unsafe, costly, none, ok])).toBe(ok)
    expect(bestPoint([unsafe, costly, none])).toBeNull()
    // the reason counts what stopped each point
    expect(sweepReason([unsafe, costly, none], null)).toMatch(/1 make no energy; 1 could cavitate; 1 cost the river more oxygen than is acceptable/)
  })
})
