// Money: capex, opex, capital recovery factor, LCOE, NPV, simple payback and carbon avoided.
// Amounts are in one unnamed currency; energy in MWh/yr; every default is illustrative.

import { checkNumber } from './errors'
import type { SourcedValue } from './defaults'

/** Money defaults: all illustrative, to be replaced by the project's own figures. */
export const MONEY_DEFAULTS = {
  discountRate: { value: 0.08, unit: '1/yr', source: 'illustrative' },
  life_yr: { value: 25, unit: 'yr', source: 'illustrative' },
  opexFraction: { value: 0.03, unit: '1/yr (of capex)', source: 'illustrative' },
  fixedCost: { value: 50_000, unit: 'currency', source: 'illustrative' },
  ratedPowerPrice: { value: 3_000, unit: 'currency/kW', source: 'illustrative' },
  civilsPerUnit: { value: 40_000, unit: 'currency/unit', source: 'illustrative' },
  exportPrice: { value: 100, unit: 'currency/MWh', source: 'illustrative' },
  gridFactor: { value: 0.2, unit: 't CO2/MWh', source: 'illustrative' },
} as const satisfies Record<string, SourcedValue>

/** Cost inputs of one option. */
export interface CostInputs {
  /** Fixed cost of the scheme (connection, design, consents), currency. */
  fixedCost: number
  /** Cost per kW of electrical rating (turbine, generator, controls), currency/kW. */
  ratedPowerPrice: number
  /** Civil works per venturi unit, currency/unit. */
  civilsPerUnit: number
}

/** Everything `moneySummary` needs. */
export interface MoneyInputs extends CostInputs {
  /** Electrical rating, W. */
  rating_W: number
  /** Number of venturi units. */
  units: number
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
  /** currency/yr: energy × export price */
  annualRevenue: number
  /** t CO₂/yr */
  annualCarbonAvoided_t: number
}

/** Capex = fixed + cost per kW × rating + civils per unit × units (bottom-up estimate, common practice). */
export function capex(costs: CostInputs, rating_W: number, units: number): number {
  const fixed = checkNumber(costs.fixedCost, 'fixedCost', { min: 0 })
  const perKw = checkNumber(costs.ratedPowerPrice, 'ratedPowerPrice', { min: 0 })
  const perUnit = checkNumber(costs.civilsPerUnit, 'civilsPerUnit', { min: 0 })
  const rating = checkNumber(rating_W, 'rating_W', { min: 0 })
  const n = checkNumber(units, 'units', { min: 0, integer: true })
  return fixed + (perKw * rating) / 1000 + perUnit * n
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

/** Carbon avoided, t CO₂/yr = annual energy (MWh/yr) × grid emission factor (t CO₂/MWh) (emission-factor method). */
export function carbonAvoided(annualEnergy_MWh: number, gridFactor: number): number {
  return (
    checkNumber(annualEnergy_MWh, 'annualEnergy_MWh', { min: 0 }) * checkNumber(gridFactor, 'gridFactor', { min: 0 })
  )
}

/** All money figures of one option: capex, opex, CRF, LCOE, NPV, simple payback, carbon (the formulas above). */
export function moneySummary(input: MoneyInputs): MoneySummary {
  const c = capex(input, input.rating_W, input.units)
  const o = annualOpex(c, input.opexFraction)
  const e = checkNumber(input.annualEnergy_MWh, 'annualEnergy_MWh', { min: 0 })
  const price = checkNumber(input.exportPrice, 'exportPrice', { min: 0 })
  return {
    capex: c,
    annualOpex: o,
    capitalRecoveryFactor: capitalRecoveryFactor(input.discountRate, input.life_yr),
    lcoe: lcoe(c, o, e, input.discountRate, input.life_yr),
    npv: npv(c, o, e, price, input.discountRate, input.life_yr),
    simplePayback_yr: simplePayback(c, o, e, price),
    annualRevenue: e * price,
    annualCarbonAvoided_t: carbonAvoided(e, input.gridFactor),
  }
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
