import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  AS_ASSESSED_TOLERANCE, MANOMETER_FLUIDS, commissioningCheck, manometerFlow, oxygenTransfer, verdictOf, verdictWords,
  type CommissioningMeasurement, type ManometerFlowInput,
} from '../../../shared/engine/commissioning'
import { oxygenSaturation } from '../../../shared/engine/oxygenSaturation'
import { isaPressure } from '../../../shared/engine/atmosphere'
import { draft, expectInputError, parse } from './fixtures'
import { num } from './arbitraries'

const mercury: ManometerFlowInput = {
  reading_m: 0.1, readingUnit: 'm-of-manometer-fluid', manometerDensity_kgm3: 13546, manometerFluid: 'mercury',
  waterTemp_C: 20, throatDiameter_m: 0.1, upstreamTapDiameter_m: null, dischargeCoefficient: 0.984,
}

describe('unit flow from a manometer (ISO 5167-1:2003 eq. 1, ISO 5167-4:2003)', () => {
  it('worked by hand: 100 mm of mercury under water at 20 °C, tap in the head pool', () => {
    // ρ = 998.204 kg/m³ (Kell 1975 at 20 °C); mercury 13,546 kg/m³ at 20 °C (CRC Handbook, from memory)
    // Δp = (13546 − 998.204)·9.80665·0.1 = 12305.18 Pa
    // Q = 0.984 (ISO 5167-4:2003 §5.5.4, as-cast) · π·0.1²/4 · √(2·12305.18/998.204) = 0.0383738 m³/s
    const r = manometerFlow(mercury)
    expect(r.differential_Pa).toBeCloseTo(12305.18, 1)
    expect(r.flow_m3s).toBeCloseTo(0.0383738, 6)
    expect(r.beta).toBe(0)
    expect(r.warnings).toEqual([])
  })
  it('the velocity of approach factor 1/√(1 − β⁴) at β = 0.5 (ISO 5167-1:2003 eq. 1)', () => {
    // √(1/(1 − 0.0625)) = 1.032796: Q = 0.0383738 · 1.032796 = 0.0396322 m³/s
    expect(manometerFlow({ ...mercury, upstreamTapDiameter_m: 0.2 }).flow_m3s).toBeCloseTo(0.0396322, 6)
  })
  it('refuses an upstream tap no wider than the throat, naming the field', () => {
    expectInputError(() => manometerFlow({ ...mercury, upstreamTapDiameter_m: 0.1 }), 'upstreamTapDiameter_m')
  })
    it('an air-over-water inverted U-tube reads (ρ − ρ_air)·g·h', () => {
    // hydrostatics: (998.204 − 1.204)·9.80665·0.5 = 4888.62 Pa; 1.204 kg/m³ dry air at 20 °C (ideal gas, R = 287.05)
    const r = manometerFlow({ ...mercury, reading_m: 0.5, manometerFluid: 'water', manometerDensity_kgm3: MANOMETER_FLUIDS.water.value })
    expect(r.differential_Pa).toBeCloseTo(4888.62, 1)
  })
  it('a light gauge oil above the water reads in an inverted U-tube: (ρ − ρ_oil)·g·h, positive', () => {
    const r = manometerFlow({ ...mercury, manometerFluid: 'gauge-oil', manometerDensity_kgm3: 827 })
    expect(r.differential_Pa).toBeCloseTo((998.204 - 827) * 9.80665 * 0.1, 1)
    expect(r.flow_m3s).toBeGreaterThan(0)
  })
  it('warns when a head in metres of water was read on mercury, and not on water columns', () => {
    // ENGINE.md §2: the same 0.1 m as a mercury column is 12.6 times the differential
    const asWater = manometerFlow({ ...mercury, readingUnit: 'm-of-water' })
    expect(asWater.warnings).toHaveLength(1)
    expect(asWater.warnings[0]).toMatch(/metres of water/)
    expect(asWater.differential_Pa).toBeCloseTo(998.204 * 9.80665 * 0.1, 1)
    const columns = manometerFlow({ ...mercury, readingUnit: 'm-of-water', manometerFluid: 'water', manometerDensity_kgm3: 1.204 })
    expect(columns.warnings).toEqual([])
  })
  it('flow rises with the reading and is never NaN (property)', () => {
    fc.assert(fc.property(num(0.001, 5), num(0.001, 5), num(0, 40), fc.constantFrom('mercury', 'gauge-oil', 'water') as fc.Arbitrary<'mercury' | 'gauge-oil' | 'water'>, (a, b, t, fluid) => {
      const base = { ...mercury, waterTemp_C: t, manometerFluid: fluid, manometerDensity_kgm3: MANOMETER_FLUIDS[fluid].value }
      const qa = manometerFlow({ ...base, reading_m: Math.min(a, b) }).flow_m3s
      const qb = manometerFlow({ ...base, reading_m: Math.max(a, b) }).flow_m3s
      expect(Number.isFinite(qa) && Number.isFinite(qb)).toBe(true)
      expect(qb).toBeGreaterThanOrEqual(qa)
      // strictly, once the readings differ by more than rounding
      if (Math.abs(b - a) > 1e-9 * Math.max(a, b)) expect(qb).toBeGreaterThan(qa)
    }))
  })
})

describe('oxygen transfer back-calculated from measurements', () => {
  it('the Butts & Evans (1983) worked example read backwards: C_s 10.084, C_u 6.0, C_d 8.192 → E 0.5367, r 2.158', () => {
    // REFERENCES §5 worked example: clean water, vertical face, H 1.5 m, 15 °C gives r = 2.1583 and C_d = 8.192 mg/L;
    // C_s 10.084 mg/L at 15 °C, 1 atm (Benson & Krause 1984; USGS DOTABLES)
    const r = oxygenTransfer({ upstreamOxygen_mgL: 6, downstreamOxygen_mgL: 8.192, waterTemp_C: 15, altitude_m: 0, salinity_gkg: 0 })
    expect(r.saturation_mgL).toBeCloseTo(10.084, 2)
    expect(r.deficitClosed).toBeCloseTo(0.5367, 3)
    expect(r.deficitRatio!).toBeCloseTo(2.158, 2)
    expect(r.warnings).toEqual([])
  })
  it('takes saturation at the site pressure (ISA) and temperature', () => {
    const r = oxygenTransfer({ upstreamOxygen_mgL: 5, downstreamOxygen_mgL: 6, waterTemp_C: 20, altitude_m: 2000, salinity_gkg: 0 })
    // Benson & Krause with the pressure correction at 2000 m ISA: 7.088 mg/L at 20 °C (REFERENCES §3, USGS memo WQ 2011.03)
    expect(r.saturation_mgL).toBeCloseTo(7.088, 2)
    expect(r.deficitClosed).toBeCloseTo(1 / (7.088 - 5), 2)
  })
  it('refuses an upstream at or above saturation, naming the field', () => {
    expectInputError(() => oxygenTransfer({ upstreamOxygen_mgL: 9.2, downstreamOxygen_mgL: 9.5, waterTemp_C: 20, altitude_m: 0, salinity_gkg: 0 }), 'upstreamOxygen_mgL')
  })
  it('flags supersaturated and falling water without refusing it', () => {
    const cs = oxygenSaturation(20, isaPressure(0), 0)
    expect(oxygenTransfer({ upstreamOxygen_mgL: 6, downstreamOxygen_mgL: cs + 1, waterTemp_C: 20, altitude_m: 0, salinity_gkg: 0 }).deficitRatio).toBeNull()
    expect(oxygenTransfer({ upstreamOxygen_mgL: 6, downstreamOxygen_mgL: 5, waterTemp_C: 20, altitude_m: 0, salinity_gkg: 0 }).warnings[0]).toMatch(/lost oxygen/)
  })
  it('E ≤ 1 whenever the downstream is at or below saturation, never NaN (property)', () => {
    fc.assert(fc.property(num(0, 40), num(0, 3000), num(0, 1), num(0, 1), (t, z, fu, fd) => {
      const cs = oxygenSaturation(t, isaPressure(z), 0)
      const cu = fu * (cs - 0.1)
      const cd = fd * cs
      const r = oxygenTransfer({ upstreamOxygen_mgL: cu, downstreamOxygen_mgL: cd, waterTemp_C: t, altitude_m: z, salinity_gkg: 0 })
      expect(Number.isFinite(r.deficitClosed)).toBe(true)
      expect(r.deficitClosed).toBeLessThanOrEqual(1 + 1e-12)
      if (r.deficitRatio !== null) expect(r.deficitRatio).toBeGreaterThan(0)
    }))
  })
})

describe('verdict against the assessment', () => {
  it('within the tolerance performs as assessed, else below or above by the difference', () => {
    expect(AS_ASSESSED_TOLERANCE.source).toMatch(/illustrative/)
    expect(verdictOf(0.95, 1).kind).toBe('as-assessed')
    expect(verdictOf(1.1, 1).kind).toBe('as-assessed')
    const below = verdictOf(0.8, 1)
    expect(below.kind).toBe('below')
    expect(verdictWords(below)).toBe('below the assessment by 20 %')
    expect(verdictWords(verdictOf(1.15, 1))).toBe('above the assessment by 15 %')
    expect(verdictOf(1, 0).kind).toBe('not-comparable')
  })
})

describe('commissioning check against a stored assessment input', () => {
  const input = parse(draft())
  const base: CommissioningMeasurement = {
    measuredAt: '2027-05-12T10:30:00Z', riverFlow_m3s: 8, waterTemp_C: 12, manometerFluid: 'mercury', manometerDensity_kgm3: 13546,
    reading_m: 0.1, readingUnit: 'm-of-manometer-fluid', upstreamTapDiameter_m: null, dischargeCoefficient: null,
    upstreamOxygen_mgL: 8.5, downstreamOxygen_mgL: 9.5, oxygenMeasuredAt: 'unit-outlet',
  }
  const first = commissioningCheck(input, base)
  // A reading that makes exactly the assessed unit flow: Q ∝ √h.
  const h = 0.1 * (first.assessed.unitFlow_m3s / first.measured.flow.flow_m3s) ** 2

  it('reads the assessment under the site\'s flow rules: a maximum take below one unit\'s flow keeps every unit shut', () => {
    // the scheme the assessment itself ran (assess.ts builds it with the rules); common practice, no source
    const capped = parse({ ...draft(), flowRules: { preset: 'custom', maxTake: { kind: 'fixed', flow_m3s: first.assessed.unitFlow_m3s / 2 }, keptShare_pct: 0, passFlow_m3s: 0 } })
    const check = commissioningCheck(capped, base)
    expect(check.assessed.unitsRunning).toBe(0)
    expect(check.flowVerdict.kind).toBe('not-comparable')
  })
  it('the engine runs units at this flow, with the option\'s own discharge coefficient', () => {
    expect(first.assessed.unitsRunning).toBeGreaterThan(0)
    expect(first.measured.dischargeCoefficient).toBe(0.98)
  })
  it('a reading that gives the assessed unit flow performs as assessed; 64 % of it (80 % of the flow) is below by 20 %', () => {
    const same = commissioningCheck(input, { ...base, reading_m: h })
    expect(same.flowVerdict.kind).toBe('as-assessed')
    const low = commissioningCheck(input, { ...base, reading_m: h * 0.64 })
    expect(low.flowVerdict.kind).toBe('below')
    if (low.flowVerdict.kind === 'below') expect(low.flowVerdict.difference).toBeCloseTo(-0.2, 9)
  })
  it('the oxygen verdict reads the assessed transfer at the point measured', () => {
    const cs = first.assessed.saturation_mgL
    for (const at of ['unit-outlet', 'below-weir'] as const) {
      const a = commissioningCheck(input, { ...base, oxygenMeasuredAt: at })
      const assessedDown = a.assessed.downstreamOxygen_mgL
      const matching = commissioningCheck(input, { ...base, oxygenMeasuredAt: at, downstreamOxygen_mgL: assessedDown })
      expect(matching.oxygenVerdict.kind).toBe('as-assessed')
      expect(matching.measured.oxygen.deficitClosed).toBeCloseTo((assessedDown - 8.5) / (cs - 8.5), 9)
    }
    const mixed = commissioningCheck(input, { ...base, oxygenMeasuredAt: 'below-weir' }).assessed.downstreamOxygen_mgL
    const unit = first.assessed.downstreamOxygen_mgL
    expect(mixed).not.toBeCloseTo(unit, 3)
  })
  it('a closed month keeps the units shut: nothing to compare', () => {
    const closed = parse({ ...draft(), option: { ...draft().option, operation: { closedMonths: [5] } } })
    const r = commissioningCheck(closed, base)
    expect(r.flowVerdict.kind).toBe('not-comparable')
    expect(r.oxygenVerdict.kind).toBe('not-comparable')
  })
})
