// Money: capex, opex, capital recovery factor, LCOE, NPV, simple payback and carbon avoided.
// Amounts are in one unnamed currency; energy in MWh/yr; every default is illustrative.

import { checkNumber } from './errors'
import type { SourcedValue } from './defaults'

/** Money defaults: all illustrative, to be replaced by the project's own figures. */
export const MONEY_DEFAULTS = {
  discountRate: { value: 0.08, unit: '1/yr', source: 'illustrative' },
  lifeYears: { value: 25, unit: 'yr', source: 'illustrative' },
  opexFraction: { value: 0.03, unit: '1/yr (of capex)', source: 'illustrative' },
  fixedCost: { value: 50_000, unit: 'currency', source: 'illustrative' },
  costPerKw: { value: 3_000, unit: 'currency/kW', source: 'illustrative' },
  civilsPerUnit: { value: 40_000, unit: 'currency/unit', source: 'illustrative' },
  exportPrice: { value: 100, unit: 'currency/MWh', source: 'illustrative' },
  gridFactor: { value: 0.2, unit: 't CO2/MWh', source: 'illustrative' },
} as const satisfies Record<string, SourcedValue>

/** Cost inputs of one option. */
export interface CostInputs {
  /** Fixed cost of the scheme (connection, design, consents), currency. */
  fixedCost: number
  /** Cost per kW of electrical rating (turbine, generator, controls), currency/kW. */
  costPerKw: number
  /** Civil works per venturi unit, currency/unit. */
  civilsPerUnit: number
}

/** Everything `moneySummary` needs. */
export interface MoneyInputs extends CostInputs {
  /** Electrical rating, W. */
  ratingW: number
  /** Number of venturi units. */
  units: number
  /** Annual energy after availability, MWh/yr. */
  annualEnergyMWh: number
  /** Opex as a fraction of capex per year. */
  opexFraction: number
  /** Real discount rate i per year (> −1). */
  discountRate: number
  /** Economic life n, years (> 0). */
  lifeYears: number
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
  opexPerYear: number
  /** 1/yr */
  capitalRecoveryFactor: number
  /** currency/MWh; null when the option makes no energy */
  lcoe: number | null
  /** currency, at the export price over the life */
  npv: number
  /** years; null when the yearly net income is never positive */
  simplePaybackYears: number | null
  /** currency/yr: energy × export price */
  revenuePerYear: number
  /** t CO₂/yr */
  carbonAvoidedT: number
}

/** Capex = fixed + cost per kW × rating + civils per unit × units (bottom-up estimate, common practice). */
export function capex(costs: CostInputs, ratingW: number, units: number): number {
  const fixed = checkNumber(costs.fixedCost, 'fixedCost', { min: 0 })
  const perKw = checkNumber(costs.costPerKw, 'costPerKw', { min: 0 })
  const perUnit = checkNumber(costs.civilsPerUnit, 'civilsPerUnit', { min: 0 })
  const rating = checkNumber(ratingW, 'ratingW', { min: 0 })
  const n = checkNumber(units, 'units', { min: 0, integer: true })
  return fixed + (perKw * rating) / 1000 + perUnit * n
}

/** Opex per year = opex fraction × capex (common practice). */
export function annualOpex(capexValue: number, opexFraction: number): number {
  return checkNumber(capexValue, 'capex', { min: 0 }) * checkNumber(opexFraction, 'opexFraction', { min: 0 })
}

/** Capital recovery factor CRF = i(1+i)^n / ((1+i)^n − 1), and 1/n at i = 0 (engineering economics, A/P factor). */
export function capitalRecoveryFactor(discountRate: number, lifeYears: number): number {
  const i = checkDiscountRate(discountRate)
  const n = checkLife(lifeYears)
  if (i === 0) return 1 / n
  // Same value as i / (1 − (1+i)^−n), written with expm1/log1p to stay exact for small i.
  return i / -Math.expm1(-n * Math.log1p(i))
}

/** Present-worth annuity factor Σ_{t=1..n} (1+i)^−t = 1 / CRF, and n at i = 0 (engineering economics, P/A factor). */
export function annuityFactor(discountRate: number, lifeYears: number): number {
  return 1 / capitalRecoveryFactor(discountRate, lifeYears)
}

/** LCOE = (capex · CRF + opex) / annual energy, currency/MWh; null when energy is 0, or so near 0 that the cost per MWh overflows (levelised cost of energy, annuity form). */
export function lcoe(
  capexValue: number,
  opexPerYear: number,
  annualEnergyMWh: number,
  discountRate: number,
  lifeYears: number,
): number | null {
  const c = checkNumber(capexValue, 'capex', { min: 0 })
  const o = checkNumber(opexPerYear, 'opexPerYear', { min: 0 })
  const e = checkNumber(annualEnergyMWh, 'annualEnergyMWh', { min: 0 })
  const crf = capitalRecoveryFactor(discountRate, lifeYears)
  if (e === 0) return null
  const perMWh = (c * crf + o) / e
  return Number.isFinite(perMWh) ? perMWh : null
}

/** NPV = −capex + (E · price − opex) · Σ_{t=1..n} (1+i)^−t, end-of-year cash flows (discounted cash flow). */
export function npv(
  capexValue: number,
  opexPerYear: number,
  annualEnergyMWh: number,
  exportPrice: number,
  discountRate: number,
  lifeYears: number,
): number {
  const c = checkNumber(capexValue, 'capex', { min: 0 })
  return -c + netIncome(opexPerYear, annualEnergyMWh, exportPrice) * annuityFactor(discountRate, lifeYears)
}

/** Simple payback = capex / (E · price − opex), years; null when the yearly net income is not positive (undiscounted). */
export function simplePayback(
  capexValue: number,
  opexPerYear: number,
  annualEnergyMWh: number,
  exportPrice: number,
): number | null {
  const c = checkNumber(capexValue, 'capex', { min: 0 })
  const net = netIncome(opexPerYear, annualEnergyMWh, exportPrice)
  if (c === 0) return 0
  return net > 0 ? c / net : null
}

/** Carbon avoided, t CO₂/yr = annual energy (MWh/yr) × grid emission factor (t CO₂/MWh) (emission-factor method). */
export function carbonAvoided(annualEnergyMWh: number, gridFactor: number): number {
  return (
    checkNumber(annualEnergyMWh, 'annualEnergyMWh', { min: 0 }) * checkNumber(gridFactor, 'gridFactor', { min: 0 })
  )
}

/** All money figures of one option: capex, opex, CRF, LCOE, NPV, simple payback, carbon (the formulas above). */
export function moneySummary(input: MoneyInputs): MoneySummary {
  const c = capex(input, input.ratingW, input.units)
  const o = annualOpex(c, input.opexFraction)
  const e = checkNumber(input.annualEnergyMWh, 'annualEnergyMWh', { min: 0 })
  const price = checkNumber(input.exportPrice, 'exportPrice', { min: 0 })
  return {
    capex: c,
    opexPerYear: o,
    capitalRecoveryFactor: capitalRecoveryFactor(input.discountRate, input.lifeYears),
    lcoe: lcoe(c, o, e, input.discountRate, input.lifeYears),
    npv: npv(c, o, e, price, input.discountRate, input.lifeYears),
    simplePaybackYears: simplePayback(c, o, e, price),
    revenuePerYear: e * price,
    carbonAvoidedT: carbonAvoided(e, input.gridFactor),
  }
}

// ——— internals ———

function netIncome(opexPerYear: number, annualEnergyMWh: number, exportPrice: number): number {
  const o = checkNumber(opexPerYear, 'opexPerYear', { min: 0 })
  const e = checkNumber(annualEnergyMWh, 'annualEnergyMWh', { min: 0 })
  const price = checkNumber(exportPrice, 'exportPrice', { min: 0 })
  return e * price - o
}

function checkDiscountRate(i: number): number {
  return checkNumber(i, 'discountRate', { min: -1, minExclusive: true })
}

function checkLife(n: number): number {
  return checkNumber(n, 'lifeYears', { min: 0, minExclusive: true })
}
