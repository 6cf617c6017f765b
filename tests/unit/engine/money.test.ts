import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { EngineInputError } from '../../../shared/engine/errors'
import { moneyFlag } from '../../../shared/engine/flags'
import {
  MONEY_DEFAULTS,
  annualOpex,
  annuityFactor,
  breakEvenPrice,
  capex,
  capitalRecoveryFactor,
  carbonAvoided,
  lcoe,
  moneySummary,
  npv,
  simplePayback,
  storedVerdict,
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
  const costs = { fixedCost: 50_000, ratedPowerPrice: 3_000, civilsPerDesignFlow: 20_000 }

  it('adds fixed, per-kW equipment and per-m³/s civil costs (bottom-up estimate)', () => {
    // 50 000 + 3 000 × 40 kW + 20 000 × 2 m³/s = 210 000 (worked by hand).
    expect(capex(costs, 40_000, 2)).toBe(210_000)
    // A design flow need not be whole: 50 000 + 20 000 × 1.5 = 80 000 with no rating.
    expect(capex(costs, 0, 1.5)).toBe(80_000)
    expect(capex(costs, 0, 0)).toBe(50_000)
    expectInputError(() => capex(costs, 40_000, -1), 'designFlow_m3s')
    expectInputError(() => capex({ ...costs, ratedPowerPrice: -1 }, 40_000, 2), 'ratedPowerPrice')
    expectInputError(() => capex({ ...costs, civilsPerDesignFlow: Number.NaN }, 40_000, 2), 'civilsPerDesignFlow')
  })

  it('prices civil works on the water handled, not the kW', () => {
    // Doubling the design flow at the same rating adds one more lot of civils only (the civils
    // follow the flow; LGA: civil works dominate low-head costs).
    expect(capex(costs, 40_000, 4) - capex(costs, 40_000, 2)).toBe(40_000)
    expect(capex(costs, 80_000, 2) - capex(costs, 40_000, 2)).toBe(120_000)
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
      civilsPerDesignFlow: 20_000,
      rating_W: 40_000,
      designFlow_m3s: 2,
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
    // It pays: revenue 30 000 > opex 6 300, NPV > 0; break-even = LCOE (same annuity form).
    expect(s.pays).toBe(true)
    expect(s.shortfalls).toEqual([])
    expect(s.breakEvenPrice).toBeCloseTo(129.863, 3)
    expect(s.designFlow_m3s).toBe(2)
    expect(s.exportPrice).toBe(150)
  })

  it('labels every money default with its origin: the LGA\'s published costs, or illustrative', () => {
    for (const d of Object.values(MONEY_DEFAULTS)) expect(d.source).toMatch(/^(LGA small-hydro costs|illustrative)/)
    expect(MONEY_DEFAULTS.discountRate.value).toBe(0.08)
    expect(MONEY_DEFAULTS.life_yr.value).toBe(25)
    expect(MONEY_DEFAULTS.opexFraction.value).toBe(0.03)
  })

  it('works the cost defaults from the LGA\'s low-head costs', () => {
    // LGA (REFERENCES §14), heads under 4 m: £5,000–8,000 per kW; electro-mechanical about 10 %.
    expect(MONEY_DEFAULTS.ratedPowerPrice.value).toBeGreaterThanOrEqual(0.1 * 5_000)
    expect(MONEY_DEFAULTS.ratedPowerPrice.value).toBeLessThanOrEqual(0.1 * 8_000)
    // Civil works 65–75 % of £5,000–8,000 per kW: at 2.5 m and 70 % water-to-wire a conventional
    // scheme makes ηρgH = 0.7 × 1000 × 9.81 × 2.5 / 1000 = 17.17 kW per m³/s, so the civils default
    // per m³/s must sit between 0.65 × 5 000 × 17.17 and 0.75 × 8 000 × 17.17 (worked by hand).
    const kwPerM3s = (0.7 * 1000 * 9.81 * 2.5) / 1000
    expect(MONEY_DEFAULTS.civilsPerDesignFlow.value).toBeGreaterThanOrEqual(0.65 * 5_000 * kwPerM3s)
    expect(MONEY_DEFAULTS.civilsPerDesignFlow.value).toBeLessThanOrEqual(0.75 * 8_000 * kwPerM3s)
  })
})

describe('break-even export price', () => {
  it('is the price at which NPV is zero, worked by hand', () => {
    // capex 1 000, opex 100, 4 MWh/yr, 10 %, 5 yr: AF = 3.790787; p = (1 000/3.790787 + 100)/4 = 90.949
    // (discounted cash flow: −C + (E·p − O)·AF = 0).
    expect(breakEvenPrice(1_000, 100, 4, 0.1, 5)).toBeCloseTo(90.949, 3)
    expect(npv(1_000, 100, 4, 90.94937, 0.1, 5)).toBeCloseTo(0, 3)
    // i = 0: (1 000/5 + 100)/4 = 75
    expect(breakEvenPrice(1_000, 100, 4, 0, 5)).toBeCloseTo(75, 12)
  })

  it('is null when the option makes no energy', () => {
    expect(breakEvenPrice(1_000, 100, 0, 0.08, 25)).toBeNull()
  })

  it('makes NPV zero within 1e-9 of the capex, over random inputs (property)', () => {
    // NPV(p*) = −C + (E·p* − O)·AF = −C + (C/AF)·AF = 0 (discounted cash flow, algebra).
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e8, noNaN: true }),
        fc.double({ min: 0, max: 1e6, noNaN: true }),
        fc.double({ min: 1e-3, max: 1e6, noNaN: true }),
        fc.double({ min: -0.05, max: 0.3, noNaN: true }),
        fc.integer({ min: 1, max: 80 }),
        (c, o, e, i, n) => {
          const p = breakEvenPrice(c, o, e, i, n)!
          const value = npv(c, o, e, p, i, n)
          // Relative to the sums that cancel (capex and the discounted opex), so a zero capex still counts.
          const scale = Math.max(1, c, o * annuityFactor(i, n))
          expect(Math.abs(value) / scale).toBeLessThan(1e-9)
        },
      ),
    )
  })
})

describe('whether the scheme pays, and the money flag', () => {
  const base = { fixedCost: 50_000, ratedPowerPrice: 650, civilsPerDesignFlow: 78_000, opexFraction: 0.03, discountRate: 0.08, life_yr: 25, gridFactor: 0.2 }

  it('does not pay when revenue is below the operating cost, and says what price it would need', () => {
    // capex = 50 000 + 650 × 5 kW + 78 000 × 1.2 m³/s = 146 850; opex 3 % = 4 405.5 a year;
    // revenue 20 MWh × 100 = 2 000 a year < opex; NPV < 0 (worked by hand).
    const m = moneySummary({ ...base, rating_W: 5_000, designFlow_m3s: 1.2, annualEnergy_MWh: 20, exportPrice: 100 })
    expect(m.capex).toBeCloseTo(146_850, 6)
    expect(m.pays).toBe(false)
    expect(m.shortfalls).toEqual(['revenue-below-opex', 'negative-npv'])
    const f = moneyFlag(m, 100)
    expect(f).toMatchObject({ id: 'does-not-pay', level: 'money', raised: true, safety: false, shareOfTime: null, worst: null })
    expect(f.reason).toBe(
      `Does not pay: revenue 2,000 a year is below the operating cost 4,406 a year; NPV −${Math.round(-m.npv).toLocaleString('en-GB')} at 100 per MWh; it would need ${Math.round(m.breakEvenPrice!).toLocaleString('en-GB')} per MWh to break even.`,
    )
  })

  it('does not pay when only the NPV is negative', () => {
    // capex = 50 000 + 3 250 + 156 000 = 209 250, opex 6 277.5; revenue 200 MWh × 100 = 20 000 > opex,
    // but (20 000 − 6 277.5) × AF(8 %, 25 yr) 10.675 = 146 486 < capex (worked by hand).
    const m = moneySummary({ ...base, rating_W: 5_000, designFlow_m3s: 2, annualEnergy_MWh: 200, exportPrice: 100 })
    expect(m.shortfalls).toEqual(['negative-npv'])
    expect(moneyFlag(m, 100).reason).not.toMatch(/operating cost/)
  })

  it('pays, and clears the flag, at a price above break-even', () => {
    const m = moneySummary({ ...base, rating_W: 5_000, designFlow_m3s: 1.2, annualEnergy_MWh: 200, exportPrice: 200 })
    expect(m.pays).toBe(true)
    const f = moneyFlag(m, 200)
    expect(f.raised).toBe(false)
    expect(f.reason).toMatch(/^Pays at 200 per MWh/)
  })

  it('with no energy it never pays and has no break-even price', () => {
    const m = moneySummary({ ...base, rating_W: 0, designFlow_m3s: 1, annualEnergy_MWh: 0, exportPrice: 100 })
    expect(m.breakEvenPrice).toBeNull()
    expect(m.pays).toBe(false)
    expect(moneyFlag(m, 100).reason).toMatch(/no price would make it pay/)
  })

  it('works the verdict out again for a result stored before it was kept', () => {
    expect(storedVerdict({ capex: 100_000, annualOpex: 3_000, annualRevenue: 2_000, npv: -120_000, lcoe: 900 }))
      .toEqual({ pays: false, shortfalls: ['revenue-below-opex', 'negative-npv'], breakEvenPrice: 900 })
    expect(storedVerdict({ capex: 100_000, annualOpex: 3_000, annualRevenue: 20_000, npv: 5_000, lcoe: 80 }).pays).toBe(true)
  })
})
