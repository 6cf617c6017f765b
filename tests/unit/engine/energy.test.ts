import { describe, expect, it } from 'vitest'
import {
  DAYS_IN_MONTH,
  ENERGY_DEFAULTS,
  MONTH_ANNUAL,
  annualEnergyFromFdc,
  annualEnergyFromRecord,
  loadFigures,
} from '../../../shared/engine/energy'
import { fdcFromPoints, fdcFromRecord, monthlyFdcs } from '../../../shared/engine/hydrology'
import type { DailyFlow } from '../../../shared/engine/hydrology'
import { expectInputError, record } from './fixtures'

// Water at 20 °C, ρ = 998.207 kg/m³ (IAPWS-95); standard gravity g = 9.80665 m/s² (CGPM 1901).
const RHO = 998.207
const G = 9.80665

/** Hydropower P = ρ g Q H η, W (textbook hydropower formula). */
const hydroPower = (q: number, h: number, eta: number): number => RHO * G * q * h * eta

const sum = (xs: readonly (number | null)[]): number => xs.reduce<number>((s, x) => s + (x ?? 0), 0)

describe('the hydropower formula used as a power curve', () => {
  it('gives the textbook values P = ρgQHη', () => {
    // P = ρgQHη (textbook): Q = 1, H = 1, η = 1 → 9789.1 W; Q = 2, H = 3, η = 0.7 → 41114.1 W.
    expect(hydroPower(1, 1, 1)).toBeCloseTo(9789.1, 1)
    expect(hydroPower(2, 3, 0.7)).toBeCloseTo(41114.1, 1)
  })
})

describe('annualEnergyFromRecord', () => {
  // 2001-01-01 … 2004-12-31: 1461 days, one leap day, so exactly 4 years of 365.25 days.
  const fourYears = record('2001-01-01', new Array<number>(1461).fill(2))
  const power = (q: number): number => hydroPower(q, 3, 0.7)

  it('turns a constant 41114.1 W into P · 24 h · 365.25 · availability', () => {
    const r = annualEnergyFromRecord(fourYears, power, { rating_W: 50_000, availability: 0.95 })
    expect(r.years).toBe(4)
    expect(r.daysWithData).toBe(1461)
    // E = Σ P·24 h / years = P·24·365.25 h = P·8766 h per year, × availability (energy = power × time).
    expect(r.annualEnergy_MWh).toBeCloseTo((41114.1 * 8766 * 0.95) / 1e6, 3)
    expect(r.hoursPerYear).toBe(8766)
    // Capacity factor = E / (rating · hours); full-load hours = E / rating (definitions).
    expect(r.capacityFactor).toBeCloseTo((41114.1 * 0.95) / 50_000, 5)
    expect(r.annualFullLoad_h).toBeCloseTo((41114.1 * 8766 * 0.95) / 50_000, 1)
  })

  it('uses availability 0.95 by default (illustrative)', () => {
    expect(ENERGY_DEFAULTS.availability).toEqual({ value: 0.95, unit: '-', source: 'illustrative' })
    const withDefault = annualEnergyFromRecord(fourYears, power, { rating_W: 50_000 })
    const atOne = annualEnergyFromRecord(fourYears, power, { rating_W: 50_000, availability: 1 })
    expect(withDefault.annualEnergy_MWh / atOne.annualEnergy_MWh).toBeCloseTo(0.95, 12)
  })

  it('reaches a capacity factor of 1 when running at rating all year', () => {
    const r = annualEnergyFromRecord(fourYears, () => 10_000, { rating_W: 10_000, availability: 1 })
    expect(r.capacityFactor).toBeCloseTo(1, 12)
    expect(r.annualFullLoad_h).toBeCloseTo(8766, 9)
  })

  it('splits energy by calendar month, worked by hand, and the months sum to the year', () => {
    // 31 January days at 1 m³/s and 28 February days at 2 m³/s, P = 1000·Q W, availability 1:
    // n = 59, years = 59/365.25; January 31·24·1000 Wh = 0.744 MWh → 0.744·365.25/59 = 4.605864 MWh/yr;
    // February 28·24·2000 Wh = 1.344 MWh → 1.344·365.25/59 = 8.320271 MWh/yr.
    const days = record('2001-01-01', [...new Array<number>(31).fill(1), ...new Array<number>(28).fill(2)])
    const r = annualEnergyFromRecord(days, (q) => 1000 * q, { rating_W: 2000, availability: 1 })
    expect(r.energyByMonth_MWh[0]).toBeCloseTo(4.605864, 5)
    expect(r.energyByMonth_MWh[1]).toBeCloseTo(8.320271, 5)
    expect(r.energyByMonth_MWh.slice(2)).toEqual(new Array(10).fill(null))
    expect(r.annualEnergy_MWh).toBeCloseTo(4.605864 + 8.320271, 5)
    expect(r.daysWithDataByMonth).toEqual([31, 28, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0])
  })

  it('keeps the month sum equal to the annual total on a varied two-year record with gaps', () => {
    const flows = Array.from({ length: 730 }, (_, i) => (i % 11 === 0 ? null : 0.2 + ((i * 37) % 50) / 10))
    const r = annualEnergyFromRecord(record('2005-01-01', flows), (q, m) => 500 * q * (1 + m / 12), {
      rating_W: 10_000,
      availability: 0.9,
    })
    expect(sum(r.energyByMonth_MWh)).toBeCloseTo(r.annualEnergy_MWh, 9)
    expect(r.daysWithData).toBe(730 - 67)
  })

  it('passes the calendar month to the power curve', () => {
    // One January day and one July day, P = 100·month W.
    const days: DailyFlow[] = [
      { date: '2001-01-15', flow: 1 },
      { date: '2001-07-15', flow: 1 },
    ]
    const r = annualEnergyFromRecord(days, (_q, m) => 100 * m, { rating_W: 1000, availability: 1 })
    expect((r.energyByMonth_MWh[6] ?? 0) / (r.energyByMonth_MWh[0] ?? 1)).toBeCloseTo(7, 12)
  })

  it('gives zero, not null, for a dry month with data, and null for a month without data', () => {
    const days = record('2001-08-01', [...new Array<number>(31).fill(0), ...new Array<number>(30).fill(3)])
    const r = annualEnergyFromRecord(days, (q) => 1000 * q, { rating_W: 5000, availability: 1 })
    expect(r.energyByMonth_MWh[7]).toBe(0)
    expect(r.energyByMonth_MWh[8]).toBeGreaterThan(0)
    expect(r.energyByMonth_MWh[9]).toBeNull()
  })

  it('gives zeros, never NaN, for zero power or zero rating', () => {
    const none = annualEnergyFromRecord(fourYears, () => 0, { rating_W: 0 })
    expect(none.annualEnergy_MWh).toBe(0)
    expect(none.capacityFactor).toBe(0)
    expect(none.annualFullLoad_h).toBe(0)
    expect(none.energyByMonth_MWh.every((e) => e === 0)).toBe(true)
    const unrated = annualEnergyFromRecord(fourYears, power, { rating_W: 0 })
    expect(unrated.annualEnergy_MWh).toBeGreaterThan(0)
    expect(unrated.capacityFactor).toBe(0)
    expect(unrated.annualFullLoad_h).toBe(0)
  })

  it('refuses an empty record, an all-gap record and bad options', () => {
    expectInputError(() => annualEnergyFromRecord([], power, { rating_W: 1 }), 'days')
    expectInputError(() => annualEnergyFromRecord(record('2001-01-01', [null, null]), power, { rating_W: 1 }), 'days')
    expectInputError(() => annualEnergyFromRecord(fourYears, power, { rating_W: 1, availability: 1.2 }), 'availability')
    expectInputError(() => annualEnergyFromRecord(fourYears, power, { rating_W: -1 }), 'rating_W')
    expectInputError(() => annualEnergyFromRecord([{ date: '2001-02-30x', flow: 1 }], power, { rating_W: 1 }), 'days[0].date')
  })

  it('refuses a power curve that answers NaN or a negative power', () => {
    expectInputError(() => annualEnergyFromRecord(fourYears, () => Number.NaN, { rating_W: 1 }), 'powerAt')
    expectInputError(() => annualEnergyFromRecord(fourYears, () => -5, { rating_W: 1 }), 'powerAt')
  })

  it('asks the power curve once per distinct flow and month', () => {
    let calls = 0
    const days = record('2001-01-01', [1, 1, 2, 1, 2, 2])
    annualEnergyFromRecord(days, (q) => {
      calls++
      return q
    }, { rating_W: 1 })
    expect(calls).toBe(2)
  })
})

describe('annualEnergyFromFdc', () => {
  it('turns a constant power into exactly P · 8760 h · availability', () => {
    const flat = fdcFromPoints([
      { exceedance: 0, flow: 2 },
      { exceedance: 50, flow: 2 },
      { exceedance: 100, flow: 2 },
    ])
    const p = hydroPower(2, 3, 0.7) // 41114.1 W (textbook, above)
    const r = annualEnergyFromFdc(flat, (q) => hydroPower(q, 3, 0.7), { rating_W: 50_000, availability: 0.95 })
    expect(r.annualEnergy_MWh).toBeCloseTo((p * 8760 * 0.95) / 1e6, 9)
    expect(r.hoursPerYear).toBe(8760)
    expect(r.capacityFactor).toBeCloseTo((p * 0.95) / 50_000, 9)
    expect(r.energyByMonth_MWh).toEqual(new Array(12).fill(null))
  })

  it('passes MONTH_ANNUAL (0) to the power curve for the annual curve', () => {
    const months = new Set<number>()
    const flat = fdcFromPoints([
      { exceedance: 0, flow: 1 },
      { exceedance: 50, flow: 1 },
      { exceedance: 100, flow: 1 },
    ])
    annualEnergyFromFdc(flat, (_q, m) => {
      months.add(m)
      return 1
    }, { rating_W: 1, gridPoints: 10 })
    expect([...months]).toEqual([MONTH_ANNUAL])
  })

  it('integrates a log-linear curve: E = k · mean flow · 8760 h for P = kQ', () => {
    // ∫₀¹ kQ(p) dp = k·Q̄; the mean of the entered curve is exact (logarithmic means, see hydrology test).
    const fdc = fdcFromPoints([
      { exceedance: 5, flow: 40 },
      { exceedance: 50, flow: 6 },
      { exceedance: 95, flow: 0.8 },
    ])
    const k = 2500
    const r = annualEnergyFromFdc(fdc, (q) => k * q, { rating_W: 100_000, availability: 1 })
    const expected = (k * fdc.meanFlow * 8760) / 1e6
    expect(Math.abs(r.annualEnergy_MWh / expected - 1)).toBeLessThan(1e-5)
  })

  it('agrees with the record method on the same record, up to 8760 vs 8766 hours', () => {
    // Flows 1…99: the Weibull curve is Q(p) = 100 − p on 1–99 %, held at 99 and 1 beyond, so
    // ∫Q dp = mean = 50 exactly; the record mean is also 50.
    const days = record('2010-01-01', Array.from({ length: 99 }, (_, i) => i + 1))
    const byFdc = annualEnergyFromFdc(fdcFromRecord(days), (q) => 100 * q, { rating_W: 1e4, availability: 1 })
    const byRecord = annualEnergyFromRecord(days, (q) => 100 * q, { rating_W: 1e4, availability: 1 })
    expect(byFdc.annualEnergy_MWh).toBeCloseTo((100 * 50 * 8760) / 1e6, 9)
    expect(byRecord.annualEnergy_MWh).toBeCloseTo((100 * 50 * 8766) / 1e6, 9)
  })

  it('gives energy by month from monthly curves, hours per month of a 365-day year', () => {
    // A constant 1 kW: each month gives 1 kW × days × 24 h; the twelve sum to 8760 h.
    const flows = Array.from({ length: 365 }, (_, i) => 1 + (i % 7))
    const days = record('2003-01-01', flows)
    const r = annualEnergyFromFdc(fdcFromRecord(days), () => 1000, {
      rating_W: 1000,
      availability: 1,
      monthlyFdcs: monthlyFdcs(days),
    })
    r.energyByMonth_MWh.forEach((e, k) => expect(e).toBeCloseTo(((DAYS_IN_MONTH[k] ?? 0) * 24 * 1000) / 1e6, 12))
    expect(sum(r.energyByMonth_MWh)).toBeCloseTo(8.76, 12)
    expect(r.annualEnergy_MWh).toBeCloseTo(8.76, 12)
  })

  it('gives null for a month whose curve is missing and passes the month number', () => {
    const days = record('2003-06-01', new Array<number>(30).fill(4))
    const seen = new Set<number>()
    const r = annualEnergyFromFdc(fdcFromRecord(days), (q, m) => {
      seen.add(m)
      return q
    }, { rating_W: 10, monthlyFdcs: monthlyFdcs(days) })
    expect(r.energyByMonth_MWh.filter((e) => e !== null)).toHaveLength(1)
    expect(r.energyByMonth_MWh[5]).toBeGreaterThan(0)
    expect([...seen].sort()).toEqual([0, 6])
  })

  it('gives zeros for a dry curve and a zero rating', () => {
    const dry = fdcFromRecord(record('2001-08-01', [0, 0, 0]))
    const r = annualEnergyFromFdc(dry, (q) => 1000 * q, { rating_W: 0 })
    expect(r).toMatchObject({ annualEnergy_MWh: 0, capacityFactor: 0, annualFullLoad_h: 0 })
  })

  it('refuses bad grid, hours or monthly curves', () => {
    const fdc = fdcFromRecord(record('2001-01-01', [1, 2, 3]))
    expectInputError(() => annualEnergyFromFdc(fdc, () => 1, { rating_W: 1, gridPoints: 0 }), 'gridPoints')
    expectInputError(() => annualEnergyFromFdc(fdc, () => 1, { rating_W: 1, hoursPerYear: 0 }), 'hoursPerYear')
    expectInputError(() => annualEnergyFromFdc(fdc, () => 1, { rating_W: 1, monthlyFdcs: [fdc] }), 'monthlyFdcs')
    expectInputError(() => annualEnergyFromFdc(fdc, () => Number.POSITIVE_INFINITY, { rating_W: 1 }), 'powerAt')
  })
})

describe('loadFigures', () => {
  it('gives capacity factor and full-load hours by their definitions', () => {
    // 438 MWh/yr from 100 kW: 4380 full-load hours, CF = 4380/8760 = 0.5 (definitions).
    expect(loadFigures(438, 100_000)).toEqual({ capacityFactor: 0.5, annualFullLoad_h: 4380 })
    expect(loadFigures(438, 0)).toEqual({ capacityFactor: 0, annualFullLoad_h: 0 })
  })
})
