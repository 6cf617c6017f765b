import { describe, expect, it } from 'vitest'
import {
  bubbleContact, contactTime, diffuserLength, downstreamFromDeficitRatio, exponentialApproach, fieldTransfer,
  higbieFilmCoefficient, mixStreams, oxygenDiffusivity, oxygenSupply, totalDissolvedGas, unitNitrogen, unitSaturation,
  WATER_QUALITY_A, WEIR_SHAPE_B, weirDeficitRatio,
} from '../../../shared/engine/oxygen'
import { oxygenSaturation } from '../../../shared/engine/oxygenSaturation'
import { waterDensity } from '../../../shared/engine/water'

const g = 9.80665

describe('weir aeration (Butts & Evans 1983)', () => {
  it('worked example: clean water, sharp-crested vertical face, H = 1.5 m, 15 °C', () => {
    // Butts & Evans (1983): r = 1 + 0.38·a·b·H(1 − 0.11H)(1 + 0.046T)
    // = 1 + 0.38·1.8·0.8·1.5·(1 − 0.165)·(1 + 0.69) = 1 + 0.8208·0.835·1.69 = 2.15827
    const r = weirDeficitRatio(WATER_QUALITY_A.clean.value, WEIR_SHAPE_B['sharp-crested-vertical-face'].value, 1.5, 15)
    expect(r).toBeCloseTo(2.1583, 4)
    // C_d = C_s − (C_s − C_u)/r = 10.084 − 4.084/2.15827 = 8.1918 mg/L (Benson & Krause C_s at 15 °C)
    expect(downstreamFromDeficitRatio(10.084, 6, r)).toBeCloseTo(8.192, 3)
    // fraction of the deficit removed E = 1 − 1/r = 0.5367
    expect(1 - 1 / r).toBeCloseTo(0.5367, 4)
  })
  it('holds the published a and b class values', () => {
    // Butts & Evans (1983) a: clean 1.80, slightly polluted 1.60, moderately polluted 1.00, grossly polluted 0.65
    expect([WATER_QUALITY_A.clean.value, WATER_QUALITY_A['slightly-polluted'].value, WATER_QUALITY_A['moderately-polluted'].value, WATER_QUALITY_A['grossly-polluted'].value]).toEqual([1.8, 1.6, 1.0, 0.65])
    // Butts & Evans (1983) b: sharp-crested straight slope 1.05, vertical face 0.80, submerged sluice gate 0.05
    expect(WEIR_SHAPE_B['sharp-crested-straight-slope'].value).toBe(1.05)
    expect(WEIR_SHAPE_B['sharp-crested-vertical-face'].value).toBe(0.8)
    expect(WEIR_SHAPE_B['sluice-gate-submerged'].value).toBe(0.05)
  })
  it('no fall gives no aeration, and the formula is not extrapolated past 4.5 m', () => {
    expect(weirDeficitRatio(1.8, 0.8, 0, 15)).toBe(1)
    expect(downstreamFromDeficitRatio(10, 6, 1)).toBe(6)
    expect(weirDeficitRatio(1.8, 0.8, 8, 15)).toBe(weirDeficitRatio(1.8, 0.8, 4.5, 15))
  })
  it('a supersaturated river loses gas over the weir toward saturation', () => {
    const cd = downstreamFromDeficitRatio(9, 12, 2)
    expect(cd).toBeCloseTo(10.5, 12)
  })
})

describe('exponential approach', () => {
  it('never overshoots saturation', () => {
    let lcg = 99
    const rand = (): number => { lcg = (lcg * 16807) % 2147483647; return lcg / 2147483647 }
    for (let i = 0; i < 1000; i++) {
      const cStar = 5 + 10 * rand()
      const cIn = 15 * rand()
      const c = exponentialApproach(cStar, cIn, 50 * rand())
      expect(Math.abs(c - cStar)).toBeLessThanOrEqual(Math.abs(cIn - cStar) + 1e-12)
      expect((c - cIn) * (cStar - cIn)).toBeGreaterThanOrEqual(0)
    }
    expect(exponentialApproach(10, 4, 1e9)).toBeCloseTo(10, 12)
  })
})

describe('field transfer (ASCE/EWRI 2-06 form)', () => {
  const rho = waterDensity(15)
  const base = {
    cIn_mgL: 7, tC: 15, unitFlow_m3s: 1, airMassFlow_kgs: 0.3, submergence_m: 2, sotePerMetre: 0.03,
    alpha: 0.9, beta: 0.98, theta: 1.024, p_atm: 101325, rho, salinity_gkg: 0,
  }
  it('worked by hand: φ = SOTR·α·θ^(T−20)/(C*₂₀·Q_u)', () => {
    const r = fieldTransfer(base)
    // O₂ supplied 0.2314·0.3 = 0.06942 kg/s; SOTE = 0.03·2 = 0.06; SOTR = 0.0041652 kg/s
    // θ^(15−20) = 1.024⁻⁵ = 0.888178; C*₂₀ at mid-depth 1 m: Benson & Krause at 20 °C and 101325 + ρg·1 Pa
    const cStar20 = oxygenSaturation(20, 101325 + rho * g * 1) * 1e-3
    const phi = (0.0041652 * 0.9 * 0.888178) / (cStar20 * 1)
    expect(r.exponent).toBeCloseTo(phi, 6)
    // C* = β·C_s(15 °C, p_atm + ρg·d/2)
    const cStar = 0.98 * oxygenSaturation(15, 101325 + rho * g * 1)
    expect(r.cStar_mgL).toBeCloseTo(cStar, 10)
    expect(r.cOut_mgL).toBeCloseTo(cStar - (cStar - 7) * Math.exp(-r.exponent), 10)
    expect(r.cOut_mgL).toBeCloseTo(cStar - (cStar - 7) * Math.exp(-phi), 5)
  })
  it('never transfers more oxygen than the air carries', () => {
    for (const sote of [0.01, 0.05, 0.2, 1]) {
      const r = fieldTransfer({ ...base, cIn_mgL: 0, sotePerMetre: sote, submergence_m: 3, alpha: 1, theta: 1 })
      expect(r.transfer_kgs).toBeLessThanOrEqual(oxygenSupply(0.3) + 1e-12)
    }
  })
  it('more submergence raises C* (ASCE/EWRI mid-depth saturation)', () => {
    expect(unitSaturation(15, 101325, rho, 3, 0.98, 0)).toBeGreaterThan(unitSaturation(15, 101325, rho, 1, 0.98, 0))
  })
  it('no water gives no change and no NaN', () => {
    const r = fieldTransfer({ ...base, unitFlow_m3s: 0 })
    expect(r.cOut_mgL).toBe(7)
    expect(r.transfer_kgs).toBe(0)
  })
})

describe('bubble contact (Higbie penetration theory)', () => {
  it('K_L = 2√(D/(π·t_c)) worked by hand for 2 mm bubbles at 0.25 m/s', () => {
    // Higbie (1935): t_c = 0.002/0.25 = 0.008 s; K_L = 2·√(2.1e-9/(π·0.008)) = 5.78122e-4 m/s
    expect(higbieFilmCoefficient(2.1e-9, 0.002, 0.25)).toBeCloseTo(5.78122e-4, 8)
    expect(oxygenDiffusivity(20, 2.1e-9)).toBeCloseTo(2.1e-9, 15)
    // Stokes–Einstein: D rises with temperature
    expect(oxygenDiffusivity(30, 2.1e-9)).toBeGreaterThan(oxygenDiffusivity(10, 2.1e-9))
  })
  it('a = 6ε/d_b and the approach is exponential, capped by the oxygen supplied', () => {
    const b = { cIn_mgL: 6, cStar_mgL: 10.5, tC: 20, unitFlow_m3s: 2, airFlow_m3s: 0.5, airMassFlow_kgs: 0.6, bubbleDiameter_m: 0.002, slipVelocity_ms: 0.25, diffusivity20: 2.1e-9, contactTime_s: 3 }
    const r = bubbleContact(b)
    // ε = 0.5/2.5 = 0.2; a = 6·0.2/0.002 = 600 m²/m³
    expect(r.voidFraction).toBeCloseTo(0.2, 12)
    expect(r.interfacialArea_m2m3).toBeCloseTo(600, 9)
    const x = 5.78122e-4 * 600 * 3
    expect(r.exponent).toBeCloseTo(x, 4)
    expect(r.cOut_mgL).toBeLessThanOrEqual(10.5)
    const starved = bubbleContact({ ...b, airMassFlow_kgs: 0.001 })
    // 0.2314·0.001 kg/s into 2 m³/s → at most 0.1157 mg/L
    expect(starved.cOut_mgL - 6).toBeCloseTo(0.1157, 4)
  })
  it('contact time = diffuser length / mean velocity + plume time', () => {
    // 7° cone from 0.5 to 1.0 m: L = 0.25/tan 3.5° = 4.0870 m
    expect(diffuserLength(0.5, 1, 3.5)).toBeCloseTo(0.25 / Math.tan((3.5 * Math.PI) / 180), 12)
    expect(contactTime(4, 2, 0.2, 0.8, 2)).toBeCloseTo(4 / (2 / 0.5) + 2, 12)
    expect(contactTime(4, 0, 0.2, 0.8, 2)).toBe(2)
  })
})

describe('mixing and total dissolved gas', () => {
  it('mixes by flow weight (mass balance)', () => {
    // (1·8 + 3·6)/4 = 6.5 mg/L
    expect(mixStreams([{ flow_m3s: 1, conc_mgL: 8 }, { flow_m3s: 3, conc_mgL: 6 }], 0)).toBeCloseTo(6.5, 12)
    expect(mixStreams([{ flow_m3s: 0, conc_mgL: 8 }], 7.2)).toBe(7.2)
  })
  it('is 100 % when every gas is at saturation, and rises with either gas', () => {
    // Dalton's law: Σ partial pressures = barometric pressure at saturation
    expect(totalDissolvedGas(15, 101325, 1, 1)).toBeCloseTo(1, 12)
    expect(totalDissolvedGas(15, 101325, 1.2, 1)).toBeGreaterThan(1.03)
    expect(totalDissolvedGas(15, 101325, 1, 1.1)).toBeGreaterThan(1.07)
  })
  it('water saturated at depth is supersaturated at the surface', () => {
    // Henry's law: saturation at 1 atm + ρg·1.5 m is 1.145 atm-equivalent, minus β
    const rho = waterDensity(15)
    const n = unitNitrogen(15, 101325, rho, 3, 1, 0, 1, 1)
    expect(n.cOut_mgL / n.surfaceSaturation_mgL).toBeGreaterThan(1.1)
    const o2 = unitSaturation(15, 101325, rho, 3, 1, 0) / oxygenSaturation(15)
    expect(totalDissolvedGas(15, 101325, o2, n.cOut_mgL / n.surfaceSaturation_mgL)).toBeGreaterThan(1.1)
  })
})
