// How sure the figures are: the seeded random numbers, the spreads drawn from, the Monte Carlo over
// the uncertain inputs, and the year-by-year figures of a daily record.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { assess, assessWithUncertainty } from '../../../shared/engine/assess'
import { monteCarlo } from '../../../shared/engine/monteCarlo'
import { drawFrom, seededRandom, type Spread } from '../../../shared/engine/random'
import { atExceedance } from '../../../shared/engine/recordYears'
import { draft, parse } from './fixtures'

/** Consecutive days from `start` (YYYY-MM-DD) with flows from a function of the day's index and date. */
function days(start: string, n: number, flowOf: (i: number, date: string) => number | null) {
  const t0 = Date.parse(`${start}T00:00:00Z`)
  return Array.from({ length: n }, (_, i) => {
    const date = new Date(t0 + i * 86_400_000).toISOString().slice(0, 10)
    return { date, flow: flowOf(i, date) }
  })
}

const recordInput = (d: Array<{ date: string, flow: number | null }>) => {
  const x = draft()
  x.hydrology = { kind: 'record', days: d }
  return parse(x)
}

describe('seeded random numbers', () => {
  it('give the same stream for the same seed and another for another seed, all in [0, 1)', () => {
    const a = seededRandom(42)
    const b = seededRandom(42)
    const c = seededRandom(43)
    const xs = Array.from({ length: 1000 }, () => a())
    // identity: a seeded generator is a pure function of its seed, no outside source
    expect(Array.from({ length: 1000 }, () => b())).toEqual(xs)
    expect(Array.from({ length: 1000 }, () => c())).not.toEqual(xs)
    expect(xs.every((x) => x >= 0 && x < 1)).toBe(true)
  })

  it('are uniform: the mean of many is ½ and each tenth of [0, 1) holds a tenth of them', () => {
    const r = seededRandom(2026)
    const n = 50_000
    const bins = new Array<number>(10).fill(0)
    let sum = 0
    for (let i = 0; i < n; i++) {
      const x = r()
      sum += x
      bins[Math.floor(x * 10)]!++
    }
    // law of large numbers: standard error of the mean of U(0,1) is 1/√(12n) ≈ 0.0013
    expect(Math.abs(sum / n - 0.5)).toBeLessThan(0.006)
    // each bin ~ Binomial(n, 0.1): standard deviation √(n·0.09) ≈ 67; 5 σ
    for (const b of bins) expect(Math.abs(b - n / 10)).toBeLessThan(335)
  })
})

describe('drawing from a spread', () => {
  it('a triangular spread has mean (a + b + c)/3, stays within its ends and puts (c − a)/(b − a) of draws below its mode', () => {
    // Evans, Hastings & Peacock, Statistical Distributions (3rd ed.), triangular distribution: mean (a+b+c)/3, F(c) = (c−a)/(b−a) (from memory)
    const spread: Spread = { kind: 'triangular', low: 1, mode: 2, high: 5 }
    const r = seededRandom(7)
    const n = 40_000
    let sum = 0
    let below = 0
    for (let i = 0; i < n; i++) {
      const x = drawFrom(spread, r())
      expect(x).toBeGreaterThanOrEqual(1)
      expect(x).toBeLessThanOrEqual(5)
      sum += x
      if (x < 2) below++
    }
    expect(sum / n).toBeCloseTo(8 / 3, 1)
    expect(below / n).toBeCloseTo(0.25, 1)
  })

  it('inverts each distribution exactly at its ends and at its mode', () => {
    const t: Spread = { kind: 'triangular', low: 0.15, mode: 0.25, high: 0.4 }
    expect(drawFrom(t, 0)).toBe(0.15)
    expect(drawFrom(t, (0.25 - 0.15) / (0.4 - 0.15))).toBeCloseTo(0.25, 12)
    expect(drawFrom(t, 1)).toBeCloseTo(0.4, 12)
    const u: Spread = { kind: 'uniform', low: 0.9, high: 0.97 }
    expect(drawFrom(u, 0.5)).toBeCloseTo(0.935, 12)
  })
})

describe('the figure exceeded p % of the time (Weibull m/(n+1))', () => {
  it('matches hand-worked ranks and refuses to extrapolate', () => {
    // Weibull (1939) plotting position: with n = 9 values, rank m sits at 10·m %
    const nine = [90, 80, 70, 60, 50, 40, 30, 20, 10]
    expect(atExceedance(nine, 50)).toBeCloseTo(50, 12)
    expect(atExceedance(nine, 90)).toBeCloseTo(10, 12)
    expect(atExceedance(nine, 10)).toBeCloseTo(90, 12)
    expect(atExceedance(nine, 45)).toBeCloseTo(55, 12)
    // n = 4: positions 20, 40, 60, 80 %: 90 % lies outside them
    expect(atExceedance([4, 3, 2, 1], 90)).toBeNull()
    expect(atExceedance([4, 3, 2, 1], 50)).toBeCloseTo(2.5, 12)
    expect(atExceedance([], 50)).toBeNull()
  })
})

describe('the Monte Carlo', () => {
  const input = parse(draft())

  it('re-runs to the same figures from the same seed, and to others from another seed', () => {
    const a = monteCarlo(input, 30, 11)
    // identity: seeded draws are a pure function of the input and seed, no outside source
    expect(monteCarlo(input, 30, 11)).toStrictEqual(a)
    expect(monteCarlo(structuredClone(input), 30, 11)).toStrictEqual(a)
    expect(monteCarlo(input, 30, 12)!.energy_MWh).not.toEqual(a!.energy_MWh)
  })

  it('runs the draws and seed the input sets, and none when it sets none', () => {
    const withSeed = parse({ ...draft(), settings: { monteCarloDraws: 20, monteCarloSeed: 5 } })
    const r = assessWithUncertainty(withSeed)
    expect(r.uncertainty).toStrictEqual(monteCarlo(withSeed, 20, 5))
    expect(r.uncertainty!.draws).toBe(20)
    expect(r.uncertainty!.seed).toBe(5)
    expect(assessWithUncertainty(parse({ ...draft(), settings: { monteCarloDraws: 0 } })).uncertainty).toBeNull()
    expect(assess(withSeed).uncertainty).toBeNull()
  })

  it('keeps its order: P90 ≤ P50 ≤ P10, probabilities within 0–1, histograms holding every draw', () => {
    const r = monteCarlo(input, 60, 3)!
    for (const s of [r.energy_MWh, r.npv, r.worstMonthNetGain_mgL]) {
      expect(s.p90!).toBeLessThanOrEqual(s.p50!)
      expect(s.p50!).toBeLessThanOrEqual(s.p10!)
    }
    expect(r.netLossProbability).toBeGreaterThanOrEqual(0)
    expect(r.netLossProbability).toBeLessThanOrEqual(1)
    expect(r.energyHistogram.reduce((s, b) => s + b.count, 0)).toBe(60)
    expect(r.oxygenHistogram.reduce((s, b) => s + b.count, 0)).toBe(60)
    // every input reports its spread and where the spread comes from
    for (const u of r.inputs) expect(u.source).toMatch(/from memory|illustrative|judgement|\b(19|20)\d{2}\b/)
  })

  it('settles: P10, P50 and P90 of 200 draws lie within 5 % of those of 2,400 (the default of 200 rests on this)', () => {
    const few = monteCarlo(input, 200, 1)!
    const many = monteCarlo(input, 2400, 99)!
    for (const k of ['p90', 'p50', 'p10'] as const) {
      expect(Math.abs(few.energy_MWh[k]! / many.energy_MWh[k]! - 1), k).toBeLessThan(0.05)
    }
  }, 60_000)

  it('never gives NaN and never more energy than the water could give at the full head, for random sites and options', () => {
    // energy never created: E ≤ ρ·g·Q·H over the year (conservation of energy), no outside figure
    fc.assert(fc.property(
      fc.double({ min: 0.5, max: 5, noNaN: true }), fc.double({ min: 0.2, max: 1, noNaN: true }), fc.double({ min: 0.5, max: 4, noNaN: true }),
      fc.integer({ min: 1, max: 4 }), fc.constantFrom('energy-first', 'river-first'), fc.integer({ min: 0, max: 2 ** 32 - 1 }),
      (head, throat, depth, units, mode, seed) => {
        const d = draft()
        d.site = { ...d.site, grossHead_m: head }
        d.option = { ...d.option, units, throatDiameter_m: throat, outletDiameter_m: throat * 2, throatDepth_m: depth, operation: { mode } }
        const i = parse(d)
        const r = monteCarlo(i, 12, seed)!
        const meanFlow = assess(i, { compareModes: false }).hydrology.mean
        const waterPower_MWh = (1000 * 9.81 * meanFlow * head * 8760) / 1e6
        for (const s of [r.energy_MWh, r.npv, r.worstMonthNetGain_mgL]) for (const v of [s.p10, s.p50, s.p90]) expect(Number.isNaN(v)).toBe(false)
        expect(r.energy_MWh.p10!).toBeLessThanOrEqual(waterPower_MWh)
      },
    ), { numRuns: 15 })
  }, 60_000)
})

describe('year by year from a daily record', () => {
  it('gives each complete year its energy, the years summing to the record\'s, and leaves out a year short of 95 % of its days', () => {
    // three full years (2001–2003) and 20 days of 2004; the second year wetter
    const d = days('2001-01-01', 365 * 3 + 20, (i) => (i >= 365 && i < 730 ? 9 : 3))
    const r = assess(recordInput(d))
    const y = r.years!
    expect(y.years.map((x) => x.year)).toEqual([2001, 2002, 2003])
    expect(y.incompleteYears).toEqual([2004])
    // energy = power × time: the complete years' energies sum to the record's days at the same power (common practice, no source)
    const total = y.years.reduce((s, x) => s + x.energy_MWh, 0)
    const recordDays = 365 * 3 + 20
    const januaryOf2004 = r.summary.annualEnergy_MWh * (recordDays / 365.25) - total
    expect(januaryOf2004).toBeGreaterThanOrEqual(-1e-9)
    expect(y.driest!.meanFlow_m3s).toBe(3)
    expect(y.years[1]!.meanFlow_m3s).toBe(9)
    // two of the three years alike; P50 is the middle rank
    expect(y.p50Energy_MWh).toBeCloseTo([...y.years].map((x) => x.energy_MWh).sort((a, b) => b - a)[1]!, 9)
    expect(y.p90Energy_MWh).toBeNull()
    expect(y.basis).toMatch(/P90 needs at least 9 complete years/)
  })

  it('scales a year with a few missing days to the whole year, and reads oxygen off the judged flows', () => {
    const d = days('2001-01-01', 365 * 10, (i) => (i % 100 === 0 ? null : 2 + (i % 365) / 100))
    const r = assess(recordInput(d))
    const y = r.years!
    expect(y.years).toHaveLength(10)
    expect(y.p90Energy_MWh).not.toBeNull()
    expect(y.p90Energy_MWh!).toBeLessThanOrEqual(y.p50Energy_MWh!)
    const gains = r.months.map((m) => m.worstNetGain_mgL)
    for (const x of y.years) {
      // a year's mean oxygen change lies between the worst and the best the judged flows give
      expect(x.meanNetGain_mgL).toBeGreaterThanOrEqual(Math.min(...gains) - 1e-12)
      expect(x.worstMonthNetGain_mgL).toBeLessThanOrEqual(x.meanNetGain_mgL + 1e-12)
    }
  })

  it('is absent for an entered curve', () => {
    expect(assess(parse(draft())).years).toBeNull()
  })
})
