import { describe, expect, it } from 'vitest'
import {
  airOperatingPoint, compressibilityFactor, isentropicPower, isentropicWork, maxAirFlow, optimalAirFlow,
  pipeLoss, pipeLossConstant, pumpPressure, usefulCompressionFraction, type AirPathInput,
} from '../../../shared/engine/airPath'
import { constrictionDefaults, unitCapacity, unitHydraulics, vapourSuctionLimit, type UnitGeometry } from '../../../shared/engine/venturi'
import { vapourPressure, waterDensity } from '../../../shared/engine/water'

const g = 9.80665

describe('air thermodynamics', () => {
  it('isentropic expansion work 101325 → 81325 Pa at 293.15 K is 17939 J/kg', () => {
    // w = c_p·T₁·[1 − (p₂/p₁)^((γ−1)/γ)], c_p = 1005, γ = 1.4 (ideal-gas thermodynamics, Dixon ch. 2)
    expect(isentropicWork(293.15, 101325, 81325)).toBeCloseTo(17939, -0.5)
    expect(isentropicWork(293.15, 101325, 101325)).toBe(0)
  })
  it('0.1 m³/s of free air gives 2160 W isentropic, above the 2000 W of Q·Δp', () => {
    // ṁ·w with ρ = p/(RT), R = 287.05: 0.1·1.2041·17939 = 2160 W; incompressible Q·Δp = 0.1·20000 = 2000 W
    expect(isentropicPower(0.1, 101325, 20000)).toBeCloseTo(2160, -0.5)
    expect(compressibilityFactor(101325, 20000)).toBeGreaterThan(1)
    expect(compressibilityFactor(101325, 40000)).toBeGreaterThan(compressibilityFactor(101325, 20000))
  })
})

describe('air pipe (Darcy–Weisbach)', () => {
  it('worked by hand: D 0.3 m, L 10 m, K 1.5, f 0.02, 0.5 m³/s at 1.2 kg/m³', () => {
    // A = 0.0706858 m², v = 7.07355 m/s, K + fL/D = 1.5 + 0.6667 = 2.16667
    // Δp = 2.16667·½·1.2·7.07355² = 65.046 Pa
    const pipe = { diameter_m: 0.3, length_m: 10, lossK: 1.5, frictionFactor: 0.02 }
    expect(pipeLoss(0.5, pipe, 1.2)).toBeCloseTo(65.046, 2)
    expect(pipeLoss(0, pipe, 1.2)).toBe(0)
  })
})

describe('pump line and turbine operating point', () => {
  it('more air flow gives less suction (pump line falls)', () => {
    let last = Number.POSITIVE_INFINITY
    for (let q = 0; q <= 1; q += 0.1) {
      const p = pumpPressure(q, 50000, 1)
      expect(p).toBeLessThan(last)
      last = p
    }
  })
  it('without pipe loss the best load is half the maximum flow at half the shut-off pressure', () => {
    // d/dQ[Q·Δp0(1 − Q/Qmax)] = 0 → Q = Qmax/2, power Δp0·Qmax/4
    expect(optimalAirFlow(40000, 0.8, 0)).toBeCloseTo(0.4, 12)
  })
  it('the closed-form optimum is the maximum of Q·Δp_tb (grid search)', () => {
    const dp0 = 45000
    const qmax = 0.9
    const c = pipeLossConstant({ diameter_m: 0.15, length_m: 8, lossK: 1.5, frictionFactor: 0.02 }, 1.2)
    const power = (q: number): number => q * (dp0 * (1 - q / qmax) - c * q * q)
    const qOpt = optimalAirFlow(dp0, qmax, c)
    let best = 0
    let bestQ = 0
    for (let i = 0; i <= 90000; i++) {
      const q = (i / 90000) * qmax
      if (power(q) > best) { best = power(q); bestQ = q }
    }
    expect(Math.abs(qOpt - bestQ)).toBeLessThan(2e-5)
    expect(power(qOpt)).toBeGreaterThanOrEqual(best * (1 - 1e-9))
  })
  it('bounds Q_a,max by energy and by β_max·Q_u', () => {
    // energy: Δp0·Qmax·φ/4 = η_ej·P_hyd
    const m = maxAirFlow(30000, 101325, 40000, 2, 0.25, 1)
    expect(m.limitedBy).toBe('energy')
    expect((30000 * m.maxAirFlow_m3s * compressibilityFactor(101325, 30000)) / 4).toBeCloseTo(0.25 * 40000, 6)
    const r = maxAirFlow(30000, 101325, 400000, 2, 0.25, 0.5)
    expect(r).toEqual({ maxAirFlow_m3s: 1, limitedBy: 'gas-ratio' })
    expect(maxAirFlow(0, 101325, 40000, 2, 0.25, 1).maxAirFlow_m3s).toBe(0)
  })
})

const venturi: UnitGeometry = { throatDiameter_m: 0.5, outletDiameter_m: 1.0, ...constrictionDefaults('venturi') }

function inputAt(H: number, d: number, over: Partial<AirPathInput> = {}): AirPathInput {
  const rho = waterDensity(15)
  const Q = unitCapacity(H, venturi)
  const h = unitHydraulics(Q, H, d, venturi, { p_atm: 101325, p_v: vapourPressure(15), rho })
  return {
    suction_m: h.suction_m, suctionLimit_m: vapourSuctionLimit(101325, vapourPressure(15), rho), dischargeDepth_m: d, unitFlow_m3s: Q,
    workingHead_m: h.workingHead_m, waterDensity: rho, p_atm: 101325, airTemperature_C: 15,
    jetPumpEfficiency: 0.25, maxGasLiquidRatio: 1,
    pipe: { diameter_m: 0.4, length_m: 12, lossK: 1.5, frictionFactor: 0.02 },
    turbine: { efficiency: 0.6, generatorEfficiency: 0.92, ratedPower_W: null, cutInFraction: 0.1 },
    ...over,
  }
}

describe('energy conservation', () => {
  // deterministic pseudo-random cases (Park–Miller generator)
  let lcg = 12345
  const rand = (): number => { lcg = (lcg * 16807) % 2147483647; return lcg / 2147483647 }
  it('electrical power never exceeds η_ej·ρgQH nor the hydraulic power, in 500 cases', () => {
    for (let i = 0; i < 500; i++) {
      const H = 0.2 + 4 * rand()
      const d = 3 * rand()
      const etaEj = rand()
      const a = airOperatingPoint(inputAt(H, d, {
        jetPumpEfficiency: etaEj, maxGasLiquidRatio: 0.2 + 3 * rand(),
        pipe: { diameter_m: 0.05 + rand(), length_m: 30 * rand(), lossK: 3 * rand(), frictionFactor: 0.05 * rand() },
        turbine: { efficiency: rand(), generatorEfficiency: rand(), ratedPower_W: null, cutInFraction: 0 },
      }))
      expect(a.electricalPower_W).toBeLessThanOrEqual(etaEj * a.hydraulicPower_W * (1 + 1e-12))
      expect(a.electricalPower_W).toBeLessThanOrEqual(a.hydraulicPower_W)
      expect(a.waterToWire).toBeLessThanOrEqual(etaEj + 1e-12)
      expect(Number.isFinite(a.electricalPower_W)).toBe(true)
    }
  })
  it('holds even with a perfect turbine and generator', () => {
    const a = airOperatingPoint(inputAt(3, 0.5, { turbine: { efficiency: 1, generatorEfficiency: 1, ratedPower_W: null, cutInFraction: 0 } }))
    expect(a.electricalPower_W).toBeGreaterThan(0)
    expect(a.waterToWire).toBeLessThanOrEqual(0.25)
  })
  it('only the throat-to-atmosphere share of the compression is useful', () => {
    // isothermal compression p·Q·ln(p₂/p₁) (Cunningham 1974): at d = 0 all of it is useful
    expect(usefulCompressionFraction(101325, 40000, 101325)).toBeCloseTo(1, 12)
    // 1 m deep, Δp₀ = 40 kPa: p_t = 81325; ln(101325/81325)/ln((101325 + 9789.1)/81325) = 0.219880/0.312104 = 0.704508
    expect(usefulCompressionFraction(101325, 40000, 101325 + 9789.1)).toBeCloseTo(0.704508, 5)
  })
  it('hydraulic power is ρgQH', () => {
    // P = ρgQH: ρ = 998.207 (IAPWS-95, 20 °C), Q = 1 m³/s, H = 1 m → 9789.1 W
    const a = airOperatingPoint({ ...inputAt(2, 1), unitFlow_m3s: 1, workingHead_m: 1, waterDensity: 998.207 })
    expect(a.hydraulicPower_W).toBeCloseTo(9789.1, 1)
  })
  it('water-to-wire with defaults stays below η_ej', () => {
    const a = airOperatingPoint(inputAt(2, 1))
    expect(a.state).toBe('running')
    expect(a.waterToWire).toBeGreaterThan(0)
    expect(a.waterToWire).toBeLessThan(0.25)
    // pressures add up along the air path: pump = pipe + turbine
    expect(a.pipeLoss_Pa + a.turbinePressureDrop_Pa).toBeCloseTo(a.pumpPressure_Pa, 6)
  })
})

describe('rating, cut-in and no suction', () => {
  it('caps at the rating and stops below cut-in', () => {
    const free = airOperatingPoint(inputAt(2, 1))
    const capped = airOperatingPoint(inputAt(2, 1, { turbine: { efficiency: 0.6, generatorEfficiency: 0.92, ratedPower_W: free.electricalPower_W / 2, cutInFraction: 0.1 } }))
    expect(capped.electricalPower_W).toBeCloseTo(free.electricalPower_W / 2, 8)
    expect(capped.state).toBe('at-rating')
    const idle = airOperatingPoint(inputAt(2, 1, { turbine: { efficiency: 0.6, generatorEfficiency: 0.92, ratedPower_W: free.electricalPower_W * 20, cutInFraction: 0.1 } }))
    expect(idle.electricalPower_W).toBe(0)
    expect(idle.state).toBe('below-cut-in')
    // the air still flows through the bypass when the turbine is idle
    expect(idle.airFlow_m3s).toBeGreaterThan(0)
  })
  it('a throat deeper than its suction draws no air and makes no power', () => {
    const a = airOperatingPoint(inputAt(0.5, 4))
    expect(a.state).toBe('no-suction')
    expect(a.airFlow_m3s).toBe(0)
    expect(a.electricalPower_W).toBe(0)
  })
  it('zero flow and zero head give zeros, not NaN', () => {
    const a = airOperatingPoint({ ...inputAt(2, 1), unitFlow_m3s: 0, workingHead_m: 0, suction_m: -1 })
    for (const v of Object.values(a)) if (typeof v === 'number') expect(Number.isFinite(v)).toBe(true)
    expect(a.electricalPower_W).toBe(0)
    expect(a.waterToWire).toBe(0)
  })
  it('more head gives more air and more power; deeper submergence less', () => {
    const p = (H: number, d: number): number => airOperatingPoint(inputAt(H, d)).electricalPower_W
    expect(p(2.5, 1)).toBeGreaterThan(p(2, 1))
    expect(p(2, 1.5)).toBeLessThan(p(2, 1))
    expect(g).toBeCloseTo(9.80665, 10)
  })
})
