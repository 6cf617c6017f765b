import { describe, expect, it } from 'vitest'
import {
  downstreamFromDeficitRatio, exponentialApproach, fieldTransfer,
  mixTwoStreams, oxygenSupply, unitSaturation,
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
    inDeviceTransfer: 0, alpha: 0.9, beta: 0.98, theta: 1.024, p_atm: 101325, rho, salinity_gkg: 0,
  }
  it('worked by hand: φ = SOTR·α·θ^(T−20)/(C*₂₀·Q_u)', () => {
    const r = fieldTransfer(base)
    // O₂ supplied 0.2314·0.3 = 0.06942 kg/s; SOTE = 0.03·2 + 0 in the device = 0.06; SOTR = 0.0041652 kg/s
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
  it('adds the depth-independent in-device term to the per-metre efficiency', () => {
    // SOTE = 0.03·2 + 0.02 = 0.08 against 0.06 alone: φ scales with SOTE (ASCE/EWRI 2-06 form)
    const withDevice = fieldTransfer({ ...base, inDeviceTransfer: 0.02 })
    expect(withDevice.exponent / fieldTransfer(base).exponent).toBeCloseTo(0.08 / 0.06, 10)
    // a throat at the surface still transfers through the device alone (one venturi study found no depth effect)
    expect(fieldTransfer({ ...base, submergence_m: 0, inDeviceTransfer: 0.02 }).transfer_kgs).toBeGreaterThan(0)
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

describe('mixing', () => {
  it('mixes by flow weight (mass balance)', () => {
    // (1·8 + 3·6)/4 = 6.5 mg/L
    expect(mixTwoStreams(1, 8, 3, 6, 0)).toBeCloseTo(6.5, 12)
    // no water: the fallback; one stream dry: the other alone
    expect(mixTwoStreams(0, 8, 0, 6, 7.2)).toBe(7.2)
    expect(mixTwoStreams(0, 8, 2, 6, 7.2)).toBe(6)
  })
})
