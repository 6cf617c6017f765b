import { operate } from '../../../shared/engine/operation'
import { describe, expect, it } from 'vitest'
import {
  cavitationIndex, cavitationMargin, constrictionDefaults, headAtFlow, headForUnitFlow, lossFactor,
  orificePermanentLossFraction, permanentLossFraction, recoveredFraction, suctionHead,
  throatAreaRatio, throatVelocity, unitCapacity, unitHydraulics, unitLossFactor, venturiLossWithinIso,
  vapourSuctionLimit, type UnitGeometry,
} from '../../../shared/engine/venturi'
import {
  flowFromDifferential, flowFromManometer, manometerDifferential, orificeDischargeCoefficient, VENTURI_DISCHARGE_COEFFICIENT,
} from '../../../shared/engine/metering'
import { DIFFUSER_EFFICIENCY, FLOW_COEFFICIENT } from '../../../shared/engine/defaults'
import { vapourPressure, waterDensity } from '../../../shared/engine/water'
import { isaPressure } from '../../../shared/engine/atmosphere'

const g = 9.80665
const venturi: UnitGeometry = { throatDiameter_m: 0.5, outletDiameter_m: 1.0, ...constrictionDefaults('venturi') }
const env20 = { p_atm: 101325, p_v: vapourPressure(20), rho: waterDensity(20) }

describe('loss factor and capacity', () => {
  it('K = k_in + (1 − η_d)(1 − r²) + r²', () => {
    // r = (0.5/1.0)² = 0.25, r² = 0.0625: K = 0.04 + 0.12·0.9375 + 0.0625 = 0.215
    expect(throatAreaRatio(venturi)).toBe(0.25)
    expect(unitLossFactor(venturi)).toBeCloseTo(0.215, 12)
    // plate, no recovery: K = k_in + 1
    expect(lossFactor(0.04, 0, 0.3)).toBeCloseTo(1.04, 12)
  })
  it('Q_cap = C·A_t·√(2gH/K), worked by hand at H = 2 m', () => {
    // A_t = π·0.5²/4 = 0.196350 m²; C·A_t = 0.98·0.196350 = 0.192423 m²
    // V = √(2·9.80665·2/0.215) = √182.449 = 13.5074 m/s; Q_cap = 0.192423·13.5074 = 2.59912 m³/s
    expect(unitCapacity(2, venturi)).toBeCloseTo(2.59912, 4)
    expect(unitCapacity(0, venturi)).toBe(0)
    expect(unitCapacity(-1, venturi)).toBe(0)
  })
  it('head for the capacity flow is the head it was computed from (inverse functions)', () => {
    expect(headForUnitFlow(unitCapacity(1.7, venturi), venturi)).toBeCloseTo(1.7, 10)
  })
})

describe('level control: regimes worked by hand', () => {
  const curve = { capacityAt: (h: number) => unitCapacity(h, venturi), headFor: (q: number) => headForUnitFlow(q, venturi) }
  const run = () => null
  it('taking all: 2.6 m³/s river, 0.05 reserved, one unit of 2.599 m³/s at 2 m, 0.05 m allowed drawdown', () => {
    // Q_cap ∝ √H, so Q_cap(1.95) = Q_cap(2)·√(1.95/2) = 2.59912·0.98742 = 2.56643 m³/s, the least a unit
    // passes at the allowed level; take 2.55 m³/s < 2.56643 → the unit cannot be fed and stays shut
    expect(unitCapacity(1.95, venturi)).toBeCloseTo(unitCapacity(2, venturi) * Math.sqrt(1.95 / 2), 12)
    expect(unitCapacity(1.95, venturi)).toBeCloseTo(2.56643, 4)
    const shut = operate({ riverFlow_m3s: 2.6, reservedFlow_m3s: 0.05, grossHead_m: 2, units: 1, allowedDrawdown_m: 0.05 }, curve, false, run)
    expect(shut.regime).toBe('stopped')
    expect(shut.shutReason).toBe('too-little-flow')
    expect(shut.spill_m3s).toBeCloseTo(2.55, 12)
    // take 2.58 ≥ 2.56643 → one unit takes it all at H_w = 0.215·(2.58/0.192423)²/2g = 1.97080 m (≥ 1.95)
    const s = operate({ riverFlow_m3s: 2.63, reservedFlow_m3s: 0.05, grossHead_m: 2, units: 1, allowedDrawdown_m: 0.05 }, curve, false, run)
    expect(s.regime).toBe('taking-all')
    expect(s.unitFlow_m3s).toBeCloseTo(2.58, 12)
    expect(s.workingHead_m).toBeCloseTo(headForUnitFlow(2.58, venturi), 12)
    expect(s.workingHead_m).toBeGreaterThanOrEqual(1.95)
    expect(s.spill_m3s).toBe(0)
    expect(s.reserved_m3s + s.unitsRunning * s.unitFlow_m3s + s.spill_m3s).toBeCloseTo(2.63, 12)
  })
  it('spilling: 10 m³/s river, 0.5 reserved, two units at 2 m', () => {
    const s = operate({ riverFlow_m3s: 10, reservedFlow_m3s: 0.5, grossHead_m: 2, units: 2, allowedDrawdown_m: 0.05 }, curve, false, run)
    // take 9.5 > 2·2.59912 = 5.19825 → both units at full head; spill 9.5 − 5.19825 = 4.30175
    expect(s.regime).toBe('spilling')
    expect(s.unitsRunning).toBe(2)
    expect(s.unitFlow_m3s).toBeCloseTo(2.59912, 4)
    expect(s.spill_m3s).toBeCloseTo(4.30175, 4)
    // H_w = 2 m; s = η_d(1 − r²)H/K − d_t = 0.88·0.9375·2/0.215 − 1 = 6.67442 m
    const h = unitHydraulics(s.unitFlow_m3s, 2, 1.0, venturi, env20)
    expect(h.workingHead_m).toBeCloseTo(2, 8)
    expect(h.suction_m).toBeCloseTo(6.67442, 4)
    expect(s.reserved_m3s + s.unitsRunning * s.unitFlow_m3s + s.spill_m3s).toBeCloseTo(10, 10)
  })
  it('units open one at a time, the pool never drawn past its allowance, and continuity holds', () => {
    const cap = unitCapacity(2, venturi)
    for (const river of [0, 0.2, 0.7, 1.3, 2.7, 3.1, 5.4, 6.4, 9, 30]) {
      const x = operate({ riverFlow_m3s: river, reservedFlow_m3s: 0.5, grossHead_m: 2, units: 3, allowedDrawdown_m: 0.05 }, curve, false, run)
      expect(x.reserved_m3s + x.unitsRunning * x.unitFlow_m3s + x.spill_m3s).toBeCloseTo(river, 10)
      expect(x.unitFlow_m3s).toBeLessThanOrEqual(cap + 1e-12)
      if (x.unitsRunning > 0) expect(x.workingHead_m).toBeGreaterThanOrEqual(2 - 0.05 - 1e-12)
      // as many units as can each be fed at the allowed level, never more
      expect(x.unitsRunning).toBe(Math.min(3, Math.floor(Math.max(0, river - 0.5) / unitCapacity(1.95, venturi))))
    }
  })
  it('a check that refuses a candidate tries one unit fewer, and a closed month shuts all', () => {
    const i = { riverFlow_m3s: 9, reservedFlow_m3s: 0.5, grossHead_m: 2, units: 3, allowedDrawdown_m: 0.05 }
    const s = operate(i, curve, false, (c) => (c.units > 1 ? 'river-first' : null))
    expect(s.unitsRunning).toBe(1)
    expect(s.shutReason).toBe('river-first')
    expect(operate(i, curve, true, run)).toMatchObject({ regime: 'stopped', unitsRunning: 0, shutReason: 'closed-month' })
  })
  it('gives zeros, not NaN, with zero flow or zero head', () => {
    const z = operate({ riverFlow_m3s: 0, reservedFlow_m3s: 0.5, grossHead_m: 2, units: 2, allowedDrawdown_m: 0.05 }, curve, false, run)
    expect(z).toEqual({ regime: 'stopped', unitsRunning: 0, unitFlow_m3s: 0, workingHead_m: 0, spill_m3s: 0, reserved_m3s: 0, shutReason: 'too-little-flow' })
    expect(operate({ riverFlow_m3s: 5, reservedFlow_m3s: 0.5, grossHead_m: 0, units: 2, allowedDrawdown_m: 0.05 }, curve, false, run).shutReason).toBe('no-head')
    const h = unitHydraulics(0, 0, 1, venturi, env20)
    expect(h.workingHead_m).toBe(0)
    expect(h.throatVelocity_ms).toBe(0)
    expect(Number.isFinite(h.suction_m)).toBe(true)
    expect(h.cavitationIndex).toBeNull()
  })
})

describe('suction and cavitation', () => {
  it('more head gives more suction; deeper throat gives less', () => {
    const at = (H: number, d: number): number => unitHydraulics(unitCapacity(H, venturi), H, d, venturi, env20).suction_m
    for (const H of [0.5, 1, 1.5, 2, 3]) expect(at(H + 0.25, 1)).toBeGreaterThan(at(H, 1))
    for (const d of [0.5, 1, 2, 3]) expect(at(2, d + 0.5)).toBeLessThan(at(2, d))
  })
  it('a sharp plate with no recovery holds no suction (s = −d_t)', () => {
    const plate: UnitGeometry = { throatDiameter_m: 0.5, outletDiameter_m: 1, ...constrictionDefaults('sharp-plate') }
    const h = unitHydraulics(unitCapacity(2, plate), 2, 1, plate, env20)
    expect(h.suction_m).toBeCloseTo(-1, 10)
  })
  it('the vapour limit is 10.11 m at 20 °C at sea level and 8.94 m at 1000 m', () => {
    // (p_atm − p_v)/ρg with IF97 p_v and ISA p_atm, 20 °C
    expect(vapourSuctionLimit(101325, vapourPressure(20), waterDensity(20))).toBeCloseTo(10.11, 2)
    expect(vapourSuctionLimit(isaPressure(1000), vapourPressure(20), waterDensity(20))).toBeCloseTo(8.94, 2)
    expect(cavitationMargin(101325, vapourPressure(20), waterDensity(20), 7)).toBeCloseTo(3.11, 2)
  })
  it('cavitation index σ = (p_t − p_v)/(½ρV²) is zero at the vapour limit', () => {
    const rho = waterDensity(20)
    const sv = vapourSuctionLimit(101325, vapourPressure(20), rho)
    expect(cavitationIndex(101325, vapourPressure(20), rho, sv, 10)).toBeCloseTo(0, 10)
    // σ = 2g·m/V² by the definition
    expect(cavitationIndex(101325, vapourPressure(20), rho, sv - 3, 10)).toBeCloseTo((2 * g * 3) / 100, 10)
  })
  it('suction follows Bernoulli: s = (1 + k_in)V²/2g − H_w − d_t', () => {
    expect(suctionHead(1, 0.5, Math.sqrt(2 * g * 4), 0.04)).toBeCloseTo(1.04 * 4 - 1.5, 12)
    expect(throatVelocity(0, venturi)).toBe(0)
  })
})

describe('ISO 5167 checks', () => {
  it('orifice plate permanent loss (ISO 5167-2:2003 §5.4.2)', () => {
    // ISO 5167-2 formula as computed by ChEDL fluids dP_orifice(D = 0.07366, d = 0.05, Δp = 17000, C = 0.61512) = 9069.47 Pa
    expect(orificePermanentLossFraction(0.05 / 0.07366, 0.61512) * 17000).toBeCloseTo(9069.47, 1)
    // ISO 5167-2: about 73 % of the differential at β = 0.5 (C ≈ 0.605)
    expect(orificePermanentLossFraction(0.5, 0.605)).toBeCloseTo(0.73, 2)
    // ISO 5167-2 approximation 1 − β^1.9
    expect(Math.abs(orificePermanentLossFraction(0.5, 0.605) - (1 - 0.5 ** 1.9))).toBeLessThan(0.01)
  })
  it('Reader-Harris/Gallagher discharge coefficient (ISO 5167-2:2003 eq. 4)', () => {
    // ChEDL fluids C_Reader_Harris_Gallagher(D = 0.07391, d = 0.0222, ρ = 1.165, μ = 1.85e-5, ṁ = 0.12, flange) = 0.5990326
    const D = 0.07391
    const Re = (4 * 0.12) / (Math.PI * D * 1.85e-5)
    expect(orificeDischargeCoefficient(D, 0.0222, Re, 'flange')).toBeCloseTo(0.5990326, 6)
    // practitioner figure: plate C ≈ 0.60–0.62 (common practice, no source); RHG 0.605 at β = 0.5, Re = 3e5
    const c = orificeDischargeCoefficient(0.2, 0.1, 3e5, 'corner')
    expect(c).toBeGreaterThan(0.6)
    expect(c).toBeLessThan(0.62)
  })
  it('the default venturi loses 5–20 % of its differential (ISO 5167-4:2003 §5.4, from memory)', () => {
    const r = throatAreaRatio(venturi)
    const loss = permanentLossFraction(venturi.inletLoss, venturi.diffuserEfficiency, r)
    expect(venturiLossWithinIso(loss)).toBe(true)
    // ISO 5167-4 classical venturi C: as-cast 0.984, machined 0.995, rough-welded 0.985
    expect(VENTURI_DISCHARGE_COEFFICIENT['as-cast']).toBe(0.984)
    expect(VENTURI_DISCHARGE_COEFFICIENT.machined).toBe(0.995)
  })
  it('a well-made venturi recovers up to about 96 % and never more', () => {
    // common practice, no source: recovery ≤ 96 %; recovered ≤ η_d for any r
    for (const r of [0.05, 0.1, 0.25, 0.4, 0.6]) {
      expect(recoveredFraction(0.04, 0.96, r)).toBeLessThanOrEqual(0.96)
      expect(recoveredFraction(0.04, DIFFUSER_EFFICIENCY.venturi.value, r)).toBeLessThan(0.96)
    }
    // default types ranked by recovery: venturi > short nozzle > plate = 0
    const rec = (t: 'venturi' | 'short-nozzle' | 'sharp-plate'): number => recoveredFraction(0.04, DIFFUSER_EFFICIENCY[t].value, 0.25)
    expect(rec('venturi')).toBeGreaterThan(rec('short-nozzle'))
    expect(rec('sharp-plate')).toBe(0)
  })
  it('default discharge coefficients are 0.6–0.7 for plates and 0.9–0.99 for venturis', () => {
    // common practice, no source
    expect(FLOW_COEFFICIENT['sharp-plate'].value).toBeGreaterThanOrEqual(0.6)
    expect(FLOW_COEFFICIENT['sharp-plate'].value).toBeLessThanOrEqual(0.7)
    expect(FLOW_COEFFICIENT.venturi.value).toBeGreaterThanOrEqual(0.9)
    expect(FLOW_COEFFICIENT.venturi.value).toBeLessThanOrEqual(0.99)
  })
})

describe('metering (ISO 5167-1)', () => {
  it('Δp = (ρ_m − ρ)gh on a mercury manometer', () => {
    // hydrostatics: 0.1 m of mercury (13546 kg/m³, CRC Handbook at 20 °C) under water (998.2)
    expect(manometerDifferential(0.1, 13546, 998.2)).toBeCloseTo((13546 - 998.2) * g * 0.1, 8)
  })
  it('Q = C·A_t·√(2Δp/(ρ(1 − β⁴))) worked by hand', () => {
    // d = 0.1, D = 0.2: β⁴ = 0.0625; A = 0.00785398; √(2·10000/(1000·0.9375)) = √21.3333 = 4.618802
    // Q = 0.984·0.00785398·4.61880 = 0.0356956 m³/s
    expect(flowFromDifferential(0.984, 0.1, 0.2, 10000, 1000)).toBeCloseTo(0.0356956, 6)
    expect(flowFromDifferential(0.984, 0.1, 0.2, 0, 1000)).toBe(0)
  })
  it('warns when a head in metres of water was read on mercury', () => {
    const base = { reading_m: 0.1, manometerFluidDensity: 13546, waterDensity: 998.2, dischargeCoefficient: 0.984, throatDiameter_m: 0.1, pipeDiameter_m: 0.2 }
    const asWater = flowFromManometer({ ...base, readingUnit: 'm-of-water' })
    expect(asWater.warnings.length).toBe(1)
    expect(asWater.warnings[0]).toMatch(/metres of water/)
    const asFluid = flowFromManometer({ ...base, readingUnit: 'm-of-manometer-fluid' })
    expect(asFluid.warnings).toEqual([])
    // the mercury column means 12.6 times the differential of the same head of water
    expect(asFluid.differential_Pa / asWater.differential_Pa).toBeCloseTo((13546 - 998.2) / 998.2, 8)
    const water = flowFromManometer({ ...base, manometerFluidDensity: 998.2, readingUnit: 'm-of-water' })
    expect(water.warnings).toEqual([])
  })
})

describe('head-vs-flow table', () => {
  const table = [{ flow_m3s: 1, head_m: 2 }, { flow_m3s: 10, head_m: 1.5 }, { flow_m3s: 30, head_m: 0.5 }]
  it('interpolates linearly and holds the ends', () => {
    expect(headAtFlow(table, 5.5, 9)).toBeCloseTo(1.75, 12)
    expect(headAtFlow(table, 20, 9)).toBeCloseTo(1.0, 12)
    expect(headAtFlow(table, 0, 9)).toBe(2)
    expect(headAtFlow(table, 100, 9)).toBe(0.5)
    expect(headAtFlow([], 3, 1.8)).toBe(1.8)
  })
})
