import { describe, expect, it } from 'vitest'
import { EngineInputError } from '../../../shared/engine/errors'
import {
  MONEY_DEFAULTS,
  annualOpex,
  annuityFactor,
  capex,
  capitalRecoveryFactor,
  carbonAvoided,
  lcoe,
  moneySummary,
  npv,
  simplePayback,
} from '../../../shared/engine/money'

function expectInputError(fn: () => unknown, field: string): void {
  try {
    fn()
  } catch (e) {
    expect(e).toBeInstanceOf(EngineInputError)
    expect((e as EngineInputError).field).toBe(field)
    return
  }
  throw new Error(`expected an EngineInputError on ${field}`)
}

describe('capital recovery factor', () => {
  it('matches engineering-economics interest tables (A/P factor)', () => {
    // Compound-interest tables, capital recovery factor (A/P, i, n) — from memory:
    expect(capitalRecoveryFactor(0.08, 25)).toBeCloseTo(0.093679, 6) // 8 %, 25 yr
    expect(capitalRecoveryFactor(0.1, 10)).toBeCloseTo(0.16275, 5) // 10 %, 10 yr
    expect(capitalRecoveryFactor(0.05, 20)).toBeCloseTo(0.08024, 5) // 5 %, 20 yr
  })

  it('agrees with the identity CRF = i / (1 − (1+i)^−n) and with i(1+i)^n/((1+i)^n − 1)', () => {
    // Both are the A/P factor written two ways (engineering economics).
    for (const [i, n] of [
      [0.03, 7],
      [0.08, 25],
      [0.12, 40],
      [-0.02, 10],
    ] as const) {
      const crf = capitalRecoveryFactor(i, n)
      expect(crf).toBeCloseTo(i / (1 - (1 + i) ** -n), 12)
      expect(crf).toBeCloseTo((i * (1 + i) ** n) / ((1 + i) ** n - 1), 12)
    }
  })

  it('is 1/n at i = 0 and continuous just above it', () => {
    // With no interest, capital is simply spread evenly: A/P = 1/n (limit of the formula).
    expect(capitalRecoveryFactor(0, 25)).toBe(1 / 25)
    expect(capitalRecoveryFactor(1e-12, 25)).toBeCloseTo(1 / 25, 10)
    expect(annuityFactor(0, 25)).toBeCloseTo(25, 12)
  })

  it('refuses a rate of −100 % or less and a life of zero', () => {
    expectInputError(() => capitalRecoveryFactor(-1, 10), 'discountRate')
    expectInputError(() => capitalRecoveryFactor(0.08, 0), 'life_yr')
    expectInputError(() => capitalRecoveryFactor(Number.NaN, 10), 'discountRate')
  })
})

describe('capex, opex and LCOE', () => {
  const costs = { fixedCost: 50_000, ratedPowerPrice: 3_000, civilsPerUnit: 20_000 }

  it('adds fixed, per-kW and per-unit civil costs (bottom-up estimate)', () => {
    // 50 000 + 3 000 × 40 kW + 20 000 × 2 units = 210 000 (worked by hand).
    expect(capex(costs, 40_000, 2)).toBe(210_000)
    expect(capex(costs, 0, 0)).toBe(50_000)
    expectInputError(() => capex(costs, 40_000, 1.5), 'units')
    expectInputError(() => capex({ ...costs, ratedPowerPrice: -1 }, 40_000, 2), 'ratedPowerPrice')
  })

  it('takes opex as a fraction of capex a year', () => {
    // 3 % of 210 000 = 6 300 a year (worked by hand).
    expect(annualOpex(210_000, 0.03)).toBeCloseTo(6_300, 9)
  })

  it('levelises cost over the energy, worked by hand', () => {
    // LCOE = (capex · CRF + opex)/E = (210 000 × 0.0936788 + 6 300)/200 MWh = 129.863 per MWh
    // (annuity form of the levelised cost of energy).
    expect(lcoe(210_000, 6_300, 200, 0.08, 25)).toBeCloseTo(129.863, 3)
    // i = 0: (210 000/25 + 6 300)/200 = 73.5
    expect(lcoe(210_000, 6_300, 200, 0, 25)).toBeCloseTo(73.5, 12)
  })

  it('gives null, not Infinity, when there is no energy', () => {
    expect(lcoe(210_000, 6_300, 0, 0.08, 25)).toBeNull()
  })
})

describe('NPV and simple payback', () => {
  it('discounts end-of-year cash flows, worked by hand', () => {
    // capex 1 000, income 300 a year for 5 years at 10 %:
    // 300/1.1 + 300/1.1² + 300/1.1³ + 300/1.1⁴ + 300/1.1⁵
    //   = 272.727 + 247.934 + 225.394 + 204.904 + 186.276 = 1 137.236 → NPV = 137.236.
    // Here income 300 = 4 MWh × 100 − opex 100.
    expect(npv(1_000, 100, 4, 100, 0.1, 5)).toBeCloseTo(137.236, 3)
    // i = 0: −1 000 + 5 × 300 = 500
    expect(npv(1_000, 100, 4, 100, 0, 5)).toBeCloseTo(500, 12)
    // Income below opex: NPV = −capex − 5 × 50 at i = 0
    expect(npv(1_000, 250, 2, 100, 0, 5)).toBeCloseTo(-1_250, 12)
  })

  it('pays back capex / net income, or never (null)', () => {
    // 1 000 / 300 a year = 3.333 years (worked by hand).
    expect(simplePayback(1_000, 100, 4, 100)).toBeCloseTo(10 / 3, 12)
    expect(simplePayback(1_000, 400, 4, 100)).toBeNull() // income equals opex
    expect(simplePayback(1_000, 500, 4, 100)).toBeNull() // opex exceeds income
    expect(simplePayback(0, 0, 0, 100)).toBe(0)
  })
})

describe('carbon avoided', () => {
  it('multiplies energy by the grid factor', () => {
    // 200 MWh/yr × 0.2 t CO₂/MWh = 40 t CO₂/yr (emission-factor method, worked by hand).
    expect(carbonAvoided(200, 0.2)).toBeCloseTo(40, 12)
    expect(carbonAvoided(0, 0.2)).toBe(0)
    expectInputError(() => carbonAvoided(200, -0.1), 'gridFactor')
  })
})

describe('moneySummary and defaults', () => {
  it('puts the figures together, worked by hand', () => {
    const s = moneySummary({
      fixedCost: 50_000,
      ratedPowerPrice: 3_000,
      civilsPerUnit: 20_000,
      rating_W: 40_000,
      units: 2,
      annualEnergy_MWh: 200,
      opexFraction: 0.03,
      discountRate: 0.08,
      life_yr: 25,
      exportPrice: 150,
      gridFactor: 0.2,
    })
    expect(s.capex).toBe(210_000)
    expect(s.annualOpex).toBeCloseTo(6_300, 9)
    expect(s.capitalRecoveryFactor).toBeCloseTo(0.093679, 6)
    expect(s.lcoe).toBeCloseTo(129.863, 3)
    expect(s.annualRevenue).toBe(30_000)
    // NPV = −210 000 + (30 000 − 6 300)/0.0936788 = −210 000 + 252 992.2 = 42 992.2
    expect(s.npv).toBeCloseTo(42_992.2, 1)
    // payback = 210 000 / 23 700 = 8.861 years
    expect(s.simplePayback_yr).toBeCloseTo(8.861, 3)
    expect(s.annualCarbonAvoided_t).toBeCloseTo(40, 12)
  })

  it('labels every money default illustrative', () => {
    for (const d of Object.values(MONEY_DEFAULTS)) expect(d.source).toBe('illustrative')
    expect(MONEY_DEFAULTS.discountRate.value).toBe(0.08)
    expect(MONEY_DEFAULTS.life_yr.value).toBe(25)
    expect(MONEY_DEFAULTS.opexFraction.value).toBe(0.03)
  })
})
