// Money: capex, opex, capital recovery factor, LCOE, NPV, simple payback, the break-even export
// price, whether the scheme pays, and carbon avoided. Amounts are in one unnamed currency (the
// organisation's, which only the app and the CSVs name); energy in MWh/yr. The cost defaults are
// £ figures from the Local Government Association's small-hydro costs (REFERENCES §14) where they
// say so, illustrative elsewhere.

import { checkNumber } from './errors'
import type { SourcedValue } from './defaults'

/**
 * The LGA's UK costs for heads under 4 m (REFERENCES §14): £5,000–8,000 per kW installed, civil works
 * 65–75 % of it, electro-mechanical plant about 10 %, consents 15–20 %. The midpoints the defaults
 * below are worked from.
 */
const LGA_COST_PER_KW = 6_500
const LGA_CIVILS_SHARE = 0.7
const LGA_EQUIPMENT_SHARE = 0.1
/**
 * kW a conventional low-head scheme makes per m³/s at the head the civils default is worked at:
 * 1000 kg/m³ × 9.81 m/s² × 2.5 m × 0.70 water-to-wire / 1000 = 17.2 kW per m³/s (P = ηρgQH).
 */
const REFERENCE_KW_PER_M3S = (1000 * 9.81 * 2.5 * 0.7) / 1000

/** Money defaults, each with its origin; every one is the project's to replace with its own figures. */
export const MONEY_DEFAULTS = {
  discountRate: { value: 0.08, unit: '1/yr', source: 'illustrative' },
  life_yr: { value: 25, unit: 'yr', source: 'illustrative' },
  opexFraction: { value: 0.03, unit: '1/yr (of capex)', source: 'illustrative' },
  fixedCost: { value: 50_000, unit: 'currency', source: 'illustrative (connection, design, consents; the LGA puts consents at 15–20 % of a low-head scheme\'s cost)' },
  ratedPowerPrice: {
    value: Math.round((LGA_COST_PER_KW * LGA_EQUIPMENT_SHARE) / 50) * 50,
    unit: 'currency/kW',
    source: 'LGA small-hydro costs, heads under 4 m: electro-mechanical plant about 10 % of £5,000–8,000 per kW (midpoint); taken for the air turbine set: illustrative',
  },
  civilsPerDesignFlow: {
    value: Math.round((LGA_COST_PER_KW * LGA_CIVILS_SHARE * REFERENCE_KW_PER_M3S) / 1000) * 1000,
    unit: 'currency/(m3/s)',
    source: 'LGA small-hydro costs, heads under 4 m: civil works 65–75 % of £5,000–8,000 per kW (midpoints), per m³/s of a conventional scheme at 2.5 m head and 70 % water-to-wire (17.2 kW per m³/s)',
  },
  exportPrice: { value: 100, unit: 'currency/MWh', source: 'illustrative' },
  gridFactor: { value: 0.2, unit: 't CO2/MWh', source: 'illustrative' },
} as const satisfies Record<string, SourcedValue>

/** Cost inputs of one option. */
export interface CostInputs {
  /** Fixed cost of the scheme (connection, design, consents), currency. */
  fixedCost: number
  /** Cost per kW of electrical rating (turbine, generator, controls), currency/kW. */
  ratedPowerPrice: number
  /** Civil works per m³/s of the scheme's design flow (intake, channel, weir works follow the water handled, not the kW), currency/(m³/s). */
  civilsPerDesignFlow: number
}

/** Everything `moneySummary` needs. */
export interface MoneyInputs extends CostInputs {
  /** Electrical rating, W. */
  rating_W: number
  /** Design flow of the scheme: units × one unit's capacity at the gross head, m³/s. */
  designFlow_m3s: number
  /** Annual energy after availability, MWh/yr. */
  annualEnergy_MWh: number
  /** Opex as a fraction of capex per year. */
  opexFraction: number
  /** Real discount rate i per year (> −1). */
  discountRate: number
  /** Economic life n, years (> 0). */
  life_yr: number
  /** Export price of electricity, currency/MWh. */
  exportPrice: number
  /** Grid emission factor, t CO₂/MWh. */
  gridFactor: number
}

/** Headline money figures of one option. */
export interface MoneySummary {
  /** currency */
  capex: number
  /** currency/yr */
  annualOpex: number
  /** 1/yr */
  capitalRecoveryFactor: number
  /** currency/MWh; null when the option makes no energy */
  lcoe: number | null
  /** currency, at the export price over the life */
  npv: number
  /** years; null when the yearly net income is never positive */
  simplePayback_yr: number | null
  /** currency/MWh: the export price the NPV, payback and revenue are at */
  exportPrice: number
  /** currency/yr: energy × export price */
  annualRevenue: number
  /** t CO₂/yr */
  annualCarbonAvoided_t: number
  /** m³/s: the flow the civils are priced on */
  designFlow_m3s: number
  /** currency/MWh: the export price at which NPV is zero; null when the option makes no energy */
  breakEvenPrice: number | null
  /** False when revenue is below the operating cost or NPV is negative at the export price. */
  pays: boolean
  /** Why it does not pay (empty when it pays). */
  shortfalls: MoneyShortfall[]
}

/** Why a scheme does not pay: its revenue is below its operating cost, or its NPV is negative at the export price. */
export type MoneyShortfall = 'revenue-below-opex' | 'negative-npv'

/**
 * Capex = fixed + equipment per kW × rating + civils per m³/s × design flow (bottom-up estimate,
 * common practice; civils priced on the water handled, as the LGA's low-head costs are dominated by
 * civil works).
 */
export function capex(costs: CostInputs, rating_W: number, designFlow_m3s: number): number {
  const fixed = checkNumber(costs.fixedCost, 'fixedCost', { min: 0 })
  const perKw = checkNumber(costs.ratedPowerPrice, 'ratedPowerPrice', { min: 0 })
  const perFlow = checkNumber(costs.civilsPerDesignFlow, 'civilsPerDesignFlow', { min: 0 })
  const rating = checkNumber(rating_W, 'rating_W', { min: 0 })
  const flow = checkNumber(designFlow_m3s, 'designFlow_m3s', { min: 0 })
  return fixed + (perKw * rating) / 1000 + perFlow * flow
}

/** Opex per year = opex fraction × capex (common practice). */
export function annualOpex(capexValue: number, opexFraction: number): number {
  return checkNumber(capexValue, 'capex', { min: 0 }) * checkNumber(opexFraction, 'opexFraction', { min: 0 })
}

/** Capital recovery factor CRF = i(1+i)^n / ((1+i)^n − 1), and 1/n at i = 0 (engineering economics, A/P factor). */
export function capitalRecoveryFactor(discountRate: number, life_yr: number): number {
  const i = checkDiscountRate(discountRate)
  const n = checkLife(life_yr)
  if (i === 0) return 1 / n
  // Same value as i / (1 − (1+i)^−n), written with expm1/log1p to stay exact for small i.
  return i / -Math.expm1(-n * Math.log1p(i))
}

/** Present-worth annuity factor Σ_{t=1..n} (1+i)^−t = 1 / CRF, and n at i = 0 (engineering economics, P/A factor). */
export function annuityFactor(discountRate: number, life_yr: number): number {
  return 1 / capitalRecoveryFactor(discountRate, life_yr)
}

/** LCOE = (capex · CRF + opex) / annual energy, currency/MWh; null when energy is 0, or so near 0 that the cost per MWh overflows (levelised cost of energy, annuity form). */
export function lcoe(
  capexValue: number,
  opexValue: number,
  annualEnergy_MWh: number,
  discountRate: number,
  life_yr: number,
): number | null {
  const c = checkNumber(capexValue, 'capex', { min: 0 })
  const o = checkNumber(opexValue, 'annualOpex', { min: 0 })
  const e = checkNumber(annualEnergy_MWh, 'annualEnergy_MWh', { min: 0 })
  const crf = capitalRecoveryFactor(discountRate, life_yr)
  if (e === 0) return null
  const perMWh = (c * crf + o) / e
  return Number.isFinite(perMWh) ? perMWh : null
}

/** NPV = −capex + (E · price − opex) · Σ_{t=1..n} (1+i)^−t, end-of-year cash flows (discounted cash flow). */
export function npv(
  capexValue: number,
  opexValue: number,
  annualEnergy_MWh: number,
  exportPrice: number,
  discountRate: number,
  life_yr: number,
): number {
  const c = checkNumber(capexValue, 'capex', { min: 0 })
  return -c + netIncome(opexValue, annualEnergy_MWh, exportPrice) * annuityFactor(discountRate, life_yr)
}

/** Simple payback = capex / (E · price − opex), years; null when the yearly net income is not positive (undiscounted). */
export function simplePayback(
  capexValue: number,
  opexValue: number,
  annualEnergy_MWh: number,
  exportPrice: number,
): number | null {
  const c = checkNumber(capexValue, 'capex', { min: 0 })
  const net = netIncome(opexValue, annualEnergy_MWh, exportPrice)
  if (c === 0) return 0
  return net > 0 ? c / net : null
}

/**
 * Break-even export price: the price at which NPV = 0, p = (capex / annuity factor + opex) / E,
 * currency/MWh (discounted cash flow: −C + (E·p − O)·AF = 0). With end-of-year flows and no price
 * escalation, 1/AF is the capital recovery factor, so it is the LCOE: the same formula, named for the
 * question it answers. Null when energy is 0, or so near 0 that the price overflows.
 */
export function breakEvenPrice(
  capexValue: number,
  opexValue: number,
  annualEnergy_MWh: number,
  discountRate: number,
  life_yr: number,
): number | null {
  return lcoe(capexValue, opexValue, annualEnergy_MWh, discountRate, life_yr)
}

/** Carbon avoided, t CO₂/yr = annual energy (MWh/yr) × grid emission factor (t CO₂/MWh) (emission-factor method). */
export function carbonAvoided(annualEnergy_MWh: number, gridFactor: number): number {
  return (
    checkNumber(annualEnergy_MWh, 'annualEnergy_MWh', { min: 0 }) * checkNumber(gridFactor, 'gridFactor', { min: 0 })
  )
}

/** All money figures of one option: capex, opex, CRF, LCOE, NPV, simple payback, break-even price, whether it pays, carbon (the formulas above). */
export function moneySummary(input: MoneyInputs): MoneySummary {
  const flow = checkNumber(input.designFlow_m3s, 'designFlow_m3s', { min: 0 })
  const c = capex(input, input.rating_W, flow)
  const o = annualOpex(c, input.opexFraction)
  const e = checkNumber(input.annualEnergy_MWh, 'annualEnergy_MWh', { min: 0 })
  const price = checkNumber(input.exportPrice, 'exportPrice', { min: 0 })
  const revenue = e * price
  const value = npv(c, o, e, price, input.discountRate, input.life_yr)
  const shortfalls: MoneyShortfall[] = []
  if (revenue < o) shortfalls.push('revenue-below-opex')
  if (value < 0) shortfalls.push('negative-npv')
  return {
    capex: c,
    annualOpex: o,
    capitalRecoveryFactor: capitalRecoveryFactor(input.discountRate, input.life_yr),
    lcoe: lcoe(c, o, e, input.discountRate, input.life_yr),
    npv: value,
    simplePayback_yr: simplePayback(c, o, e, price),
    exportPrice: price,
    annualRevenue: revenue,
    annualCarbonAvoided_t: carbonAvoided(e, input.gridFactor),
    designFlow_m3s: flow,
    breakEvenPrice: breakEvenPrice(c, o, e, input.discountRate, input.life_yr),
    pays: shortfalls.length === 0,
    shortfalls,
  }
}

/** The money figures a stored result holds: runs from older engines lack the export price, break-even price and verdict. */
export type StoredMoney = Pick<MoneySummary, 'capex' | 'annualOpex' | 'annualRevenue' | 'npv' | 'lcoe'>
  & Partial<Pick<MoneySummary, 'exportPrice' | 'breakEvenPrice' | 'pays' | 'shortfalls'>>

/** Whether a stored result pays and why not, worked out again from its figures when it was stored without them. */
export function storedVerdict(m: StoredMoney): Pick<MoneySummary, 'pays' | 'shortfalls' | 'breakEvenPrice'> {
  const shortfalls: MoneyShortfall[] = m.shortfalls ?? [
    ...(m.annualRevenue < m.annualOpex ? ['revenue-below-opex' as const] : []),
    ...(m.npv < 0 ? ['negative-npv' as const] : []),
  ]
  // With end-of-year flows and no escalation the break-even price is the LCOE (see breakEvenPrice).
  return { pays: m.pays ?? shortfalls.length === 0, shortfalls, breakEvenPrice: m.breakEvenPrice !== undefined ? m.breakEvenPrice : m.lcoe }
}

// ——— internals ———

function netIncome(opexValue: number, annualEnergy_MWh: number, exportPrice: number): number {
  const o = checkNumber(opexValue, 'annualOpex', { min: 0 })
  const e = checkNumber(annualEnergy_MWh, 'annualEnergy_MWh', { min: 0 })
  const price = checkNumber(exportPrice, 'exportPrice', { min: 0 })
  return e * price - o
}

function checkDiscountRate(i: number): number {
  return checkNumber(i, 'discountRate', { min: -1, minExclusive: true })
}

function checkLife(n: number): number {
  return checkNumber(n, 'life_yr', { min: 0, minExclusive: true })
}
