import { describe, expect, it } from 'vitest'
import {
  HYDROLOGY_DEFAULTS,
  exceedanceGrid,
  exceedanceOfFlow,
  fdcFromPoints,
  fdcFromRecord,
  fdcStats,
  flowAtExceedance,
  monthOf,
  monthlyFdcs,
  reservedFlow,
  scaleByAreaRatio,
  scaleFdcByAreaRatio,
  scaleSampleByAreaRatio,
  readRecord,
  recordCurves,
} from '../../../shared/engine/hydrology'
import { expectInputError, record } from './fixtures'

describe('fdcFromRecord — Weibull plotting position', () => {
  // Sample 3, 1, 4, 1, 5, (gap), 9, 2: n = 7 days with data.
  // Hand-ranked descending, P = m/(n+1) = m/8 (Weibull 1939 plotting position, as in the
  // hydrology texts' flow-duration method):
  //   m: 1  2  3    4  5    6  7
  //   Q: 9  5  4    3  2    1  1
  //   P: 12.5 25 37.5 50 62.5 75 87.5 %
  const days = record('2001-03-01', [3, 1, 4, 1, 5, null, 9, 2])
  const fdc = fdcFromRecord(days)

  it('ranks the days with data and gives each P = m/(n+1)', () => {
    expect(fdc.count).toBe(7)
    expect(Array.from(fdc.flow)).toEqual([9, 5, 4, 3, 2, 1, 1])
    expect(Array.from(fdc.exceedance)).toEqual([12.5, 25, 37.5, 50, 62.5, 75, 87.5])
    expect(fdc.meanFlow).toBeCloseTo(25 / 7, 12)
  })

  it("matches numpy's quantile(method='weibull') (Hyndman & Fan 1996, type 6)", () => {
    // Type 6 by hand on the ascending sample x = 1,1,2,3,4,5,9 at non-exceedance F = 1 − p/100:
    // h = (n+1)F, Q = x_⌊h⌋ + (h − ⌊h⌋)(x_⌊h⌋+1 − x_⌊h⌋), held at x_1 / x_n outside 1 ≤ h ≤ n.
    //   p = 70 → h = 2.4 → 1 + 0.4·(2 − 1) = 1.4
    //   p = 45 → h = 4.4 → 3 + 0.4·(4 − 3) = 3.4
    //   p = 10 → h = 7.2 → x_7 = 9;  p = 95 → h = 0.4 → x_1 = 1;  p = 50 → h = 4 → 3
    // numpy 2.4 np.quantile(x, 1 - p/100, method='weibull') printed the same: 1.4, 3.4, 9.0, 1.0, 3.0.
    expect(flowAtExceedance(fdc, 70)).toBeCloseTo(1.4, 12)
    expect(flowAtExceedance(fdc, 45)).toBeCloseTo(3.4, 12)
    expect(flowAtExceedance(fdc, 10)).toBe(9)
    expect(flowAtExceedance(fdc, 95)).toBe(1)
    expect(flowAtExceedance(fdc, 50)).toBe(3)
  })

  it("matches numpy's weibull quantiles on a 365-day sample", () => {
    // q_i = ((i·7919) mod 1009)/100, i = 0…364. Values printed by numpy 2.4,
    // np.quantile(q, 1 - p/100, method='weibull') (Hyndman & Fan 1996 type 6), and np.mean(q).
    const flows = Array.from({ length: 365 }, (_, i) => ((i * 7919) % 1009) / 100)
    const year = fdcFromRecord(record('2003-01-01', flows))
    expect(flowAtExceedance(year, 5)).toBeCloseTo(9.628, 9)
    expect(flowAtExceedance(year, 10)).toBeCloseTo(9.104, 9)
    expect(flowAtExceedance(year, 50)).toBeCloseTo(5.09, 9)
    expect(flowAtExceedance(year, 95)).toBeCloseTo(0.503, 9)
    expect(flowAtExceedance(year, 99.5)).toBeCloseTo(0.0083, 9)
    expect(year.meanFlow).toBeCloseTo(5.055178082191781, 12)
  })

  it('gives Q95, Q50, Q10 and the mean of the flows 1…99', () => {
    // n = 99, P_m = m/100, ranked flow 100 − m, so Q_p = 100 − p:
    // numpy quantile(1..99, 0.05, method='weibull') = 5.0 (Hyndman & Fan type 6).
    const fdc99 = fdcFromRecord(record('2010-01-01', Array.from({ length: 99 }, (_, i) => i + 1)))
    const s = fdcStats(fdc99)
    expect(s.q95).toBeCloseTo(5, 12)
    expect(s.q50).toBeCloseTo(50, 12)
    expect(s.q10).toBeCloseTo(90, 12)
    expect(s.mean).toBeCloseTo(50, 12)
  })

  it('ranks a 36,525-day record with gaps: every day with data counts, the curve falls and its mean is the record mean', () => {
    // Its speed is a benchmark figure (npm run bench, "FDC from a 36,525-day record"), not a test.
    const flows = Array.from({ length: 36_525 }, (_, i) => (i % 17 === 0 ? null : 0.5 + ((i * 7919) % 10007) / 1000))
    const fdc = fdcFromRecord(record('1900-01-01', flows))
    const data = flows.filter((q): q is number => q !== null)
    expect(fdc.count).toBe(data.length)
    expect(Array.from(fdc.flow).every((q, i) => i === 0 || q <= fdc.flow[i - 1]!)).toBe(true)
    expect(fdc.meanFlow).toBeCloseTo(data.reduce((a, q) => a + q, 0) / data.length, 9)
    expect(fdc.flow[0]).toBe(Math.max(...data))
  })

  it('rejects an empty record, an all-gap record and a negative flow', () => {
    expectInputError(() => fdcFromRecord([]), 'days')
    expectInputError(() => fdcFromRecord(record('2001-01-01', [null, null, null])), 'days')
    expectInputError(() => fdcFromRecord(record('2001-01-01', [1, -0.5, 2])), 'days[1].flow')
    expectInputError(() => fdcFromRecord(record('2001-01-01', [1, Number.NaN])), 'days[1].flow')
  })

  it('keeps a record of zero flows at zero, never NaN', () => {
    const dry = fdcFromRecord(record('2001-08-01', [0, 0, 0, 0]))
    expect(fdcStats(dry)).toEqual({ q95: 0, q50: 0, q10: 0, mean: 0 })
    expect(exceedanceOfFlow(dry, 0)).toBe(100)
    expect(exceedanceOfFlow(dry, 0.1)).toBe(0)
  })
})

describe('fdcFromPoints — log-linear interpolation', () => {
  const fdc = fdcFromPoints([
    { exceedance: 10, flow: 10 },
    { exceedance: 50, flow: 1 },
    { exceedance: 90, flow: 0.1 },
  ])

  it('interpolates linearly in ln Q: half-way between nodes is their geometric mean', () => {
    // ln Q = ln Qa + t(ln Qb − ln Qa); at t = ½, Q = √(Qa·Qb) (definition of log-linear interpolation).
    expect(flowAtExceedance(fdc, 30)).toBeCloseTo(Math.sqrt(10), 12)
    expect(flowAtExceedance(fdc, 70)).toBeCloseTo(Math.sqrt(0.1), 12)
    // t = ¼ between 10 and 1: 10·(1/10)^¼ = 10^0.75
    expect(flowAtExceedance(fdc, 20)).toBeCloseTo(10 ** 0.75, 12)
  })

  it('holds the end values outside the entered range', () => {
    expect(flowAtExceedance(fdc, 0)).toBe(10)
    expect(flowAtExceedance(fdc, 100)).toBe(0.1)
  })

  it('inverts flowAtExceedance with exceedanceOfFlow', () => {
    for (const p of [12, 30, 49.5, 50, 63, 89]) {
      expect(exceedanceOfFlow(fdc, flowAtExceedance(fdc, p))).toBeCloseTo(p, 9)
    }
    expect(exceedanceOfFlow(fdc, 20)).toBe(0)
    expect(exceedanceOfFlow(fdc, 10)).toBe(10)
    expect(exceedanceOfFlow(fdc, 0.05)).toBe(100)
  })

  it('interpolates linearly into a zero flow', () => {
    const intermittent = fdcFromPoints([
      { exceedance: 0, flow: 4 },
      { exceedance: 50, flow: 2 },
      { exceedance: 90, flow: 0 },
      { exceedance: 100, flow: 0 },
    ])
    expect(flowAtExceedance(intermittent, 70)).toBeCloseTo(1, 12)
    expect(flowAtExceedance(intermittent, 95)).toBe(0)
    expect(exceedanceOfFlow(intermittent, 1)).toBeCloseTo(70, 12)
    expect(exceedanceOfFlow(intermittent, 0)).toBe(100)
  })

  it('gives the exact mean of the curve: logarithmic mean on log-linear segments', () => {
    // ∫ of a·(b/a)^t over t∈[0,1] = (b − a)/ln(b/a) (logarithmic mean); a linear segment averages (a + b)/2.
    const c = fdcFromPoints([
      { exceedance: 0, flow: 4 },
      { exceedance: 50, flow: 2 },
      { exceedance: 100, flow: 0 },
    ])
    const expected = 0.5 * (2 / Math.LN2) + 0.5 * 1
    expect(c.meanFlow).toBeCloseTo(expected, 12)
    // and a 100,000-cell midpoint sum of Q(p) agrees
    const grid = exceedanceGrid(100_000)
    const numeric = grid.reduce((s, p) => s + flowAtExceedance(c, p), 0) / grid.length
    expect(numeric).toBeCloseTo(expected, 6)
    // held end values count in the mean: Q = 10 from 0–10 %, 0.1 from 90–100 %
    const heldEnds = 0.1 * 10 + 0.4 * (9 / Math.log(10)) + 0.4 * (0.9 / Math.log(10)) + 0.1 * 0.1
    expect(fdc.meanFlow).toBeCloseTo(heldEnds, 12)
  })

  it('rejects too few, unsorted, rising, negative or out-of-range points', () => {
    expectInputError(() => fdcFromPoints([{ exceedance: 10, flow: 2 }, { exceedance: 90, flow: 1 }]), 'points')
    expectInputError(
      () =>
        fdcFromPoints([
          { exceedance: 10, flow: 3 },
          { exceedance: 10, flow: 2 },
          { exceedance: 90, flow: 1 },
        ]),
      'points[1].exceedance',
    )
    expectInputError(
      () =>
        fdcFromPoints([
          { exceedance: 10, flow: 3 },
          { exceedance: 50, flow: 2 },
          { exceedance: 90, flow: 2.5 },
        ]),
      'points[2].flow',
    )
    expectInputError(
      () =>
        fdcFromPoints([
          { exceedance: 10, flow: 3 },
          { exceedance: 50, flow: -1 },
          { exceedance: 90, flow: -2 },
        ]),
      'points[1].flow',
    )
    expectInputError(
      () =>
        fdcFromPoints([
          { exceedance: 10, flow: 3 },
          { exceedance: 50, flow: 2 },
          { exceedance: 101, flow: 1 },
        ]),
      'points[2].exceedance',
    )
    expectInputError(() => flowAtExceedance(fdc, -1), 'exceedance')
  })
})

describe('monthlyFdcs', () => {
  it('builds one curve per month with data and null for the others', () => {
    // 31 January days of 1…31 m³/s, then 28 February days of 0 (a dry month).
    const jan = Array.from({ length: 31 }, (_, i) => i + 1)
    const feb = Array.from({ length: 28 }, () => 0)
    const months = monthlyFdcs(record('2002-01-01', [...jan, ...feb]))
    expect(months).toHaveLength(12)
    const [january, february, ...rest] = months
    // January: n = 31, P_m = m/32, ranked flow 32 − m, so Q50 at m = 16 is 16 (Weibull 1939).
    expect(january?.count).toBe(31)
    expect(january && flowAtExceedance(january, 50)).toBeCloseTo(16, 12)
    expect(january?.meanFlow).toBeCloseTo(16, 12)
    expect(february && fdcStats(february)).toEqual({ q95: 0, q50: 0, q10: 0, mean: 0 })
    expect(rest.every((m) => m === null)).toBe(true)
  })

  it('gives twelve nulls for an empty or all-gap record', () => {
    expect(monthlyFdcs([])).toEqual(new Array(12).fill(null))
    expect(monthlyFdcs(record('2002-05-01', [null, null]))).toEqual(new Array(12).fill(null))
  })

  it('points at a malformed date', () => {
    expectInputError(
      () =>
        monthlyFdcs([
          { date: '2002-05-01', flow: 1 },
          { date: '2002-13-01', flow: 1 },
        ]),
      'days[1].date',
    )
    expectInputError(() => monthOf('1/5/2002'), 'date')
    expect(monthOf('2002-12-31')).toBe(12)
  })
})

describe('reserved flow', () => {
  const fdc99 = fdcFromRecord(record('2010-01-01', Array.from({ length: 99 }, (_, i) => i + 1)))

  it('takes Q95 when set as the 95 % exceedance flow', () => {
    // Hands-off flow at Q95: common practice, no source. Q95 of 1…99 by Weibull is 5 (see above).
    expect(HYDROLOGY_DEFAULTS.reservedFlowExceedance.value).toBe(95)
    expect(reservedFlow({ kind: 'percentile', exceedance: 95 }, fdc99)).toBeCloseTo(5, 12)
  })

  it('keeps a fixed value and rejects a negative one', () => {
    expect(reservedFlow({ kind: 'fixed', flow: 0.35 }, fdc99)).toBe(0.35)
    expectInputError(() => reservedFlow({ kind: 'fixed', flow: -1 }, fdc99), 'reservedFlow.flow')
    expectInputError(() => reservedFlow({ kind: 'percentile', exceedance: 120 }, fdc99), 'reservedFlow.exceedance')
  })
})

describe('area-ratio scaling', () => {
  // Q_site = Q_gauge · A_site / A_gauge (area-ratio method): common practice, no source.
  it('scales flows by the catchment-area ratio and keeps gaps', () => {
    expect(scaleByAreaRatio([4, null, 2], 150, 200)).toEqual([3, null, 1.5])
    expect(scaleByAreaRatio([8], 50, 25)).toEqual([16])
  })

  it('scales a record and a curve alike, so Q95 scales by the same ratio', () => {
    const days = record('2001-01-01', [5, 4, null, 3, 2, 1])
    const read = readRecord(days)
    const site = scaleSampleByAreaRatio(read, 30, 120)
    expect(Array.from(site.flows)).toEqual([1.25, 1, 0.75, 0.5, 0.25])
    expect(site.months).toBe(read.months)
    const fromRecord = fdcStats(recordCurves(site).annual)
    const fromCurve = fdcStats(scaleFdcByAreaRatio(fdcFromRecord(days), 30, 120))
    expect(fromCurve.q95).toBeCloseTo(fromRecord.q95, 12)
    expect(fromCurve.mean).toBeCloseTo(fromRecord.mean, 12)
  })

  it('rejects a zero or negative area', () => {
    expectInputError(() => scaleByAreaRatio([1], 0, 10), 'siteArea')
    expectInputError(() => scaleByAreaRatio([1], 10, -5), 'gaugeArea')
  })
})

describe('exceedanceGrid', () => {
  it('gives cell midpoints in %', () => {
    expect(exceedanceGrid(4)).toEqual([12.5, 37.5, 62.5, 87.5])
    expect(exceedanceGrid(1)).toEqual([50])
    expectInputError(() => exceedanceGrid(0), 'gridPoints')
    expectInputError(() => exceedanceGrid(2.5), 'gridPoints')
  })
})
