import { describe, expect, it } from 'vitest'
import { vapourPressure, waterDensity, waterKinematicViscosity, waterViscosity, waterViscosityAt } from '../../../shared/engine/water'
import { airDensity, isaPressure, isaTemperature } from '../../../shared/engine/atmosphere'
import {
  nitrogenSaturation, nitrogenSaturation1atm, oxygenSaturation, oxygenSaturation1atm, oxygenSalinityFactor,
} from '../../../shared/engine/oxygenSaturation'

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b)

describe('water density (Kell 1975)', () => {
  // Kell (1975) eq. 16 evaluated from its published coefficients; IAPWS-95 in brackets, 0.101325 MPa
  const table: Array<[number, number, number]> = [
    [0, 999.84, 999.843], [10, 999.7, 999.702], [20, 998.204, 998.207], [30, 995.647, 995.649], [40, 992.216, 992.216],
  ]
  it.each(table)('%d °C', (t, kell, iapws95) => {
    expect(Math.abs(waterDensity(t) - kell)).toBeLessThan(0.002)
    // Kell (1975): ±0.01 kg/m³ against IAPWS-95 over 0–40 °C
    expect(Math.abs(waterDensity(t) - iapws95)).toBeLessThan(0.02)
  })
  it('has its maximum near 4 °C at 999.975 kg/m³', () => {
    // IAPWS-95 / CRC Handbook: maximum density of water 999.975 kg/m³ at 3.98 °C
    // Kell (1975) stated accuracy ±0.01 kg/m³
    expect(Math.abs(waterDensity(4) - 999.975)).toBeLessThan(0.01)
    expect(waterDensity(4)).toBeGreaterThan(waterDensity(2))
    expect(waterDensity(4)).toBeGreaterThan(waterDensity(6))
  })
})

describe('water viscosity (IAPWS R12-08)', () => {
  it('reproduces the R12-08 check value at 298.15 K, 998 kg/m³', () => {
    // IAPWS R12-08 Table 4 verification value: μ = 889.735100 µPa·s
    expect(waterViscosityAt(298.15, 998) * 1e6).toBeCloseTo(889.7351, 3)
  })
  // IAPWS R12-08 at IAPWS-95 density, 0.101325 MPa; CRC Handbook tables agree to the digits shown (from memory)
  const table: Array<[number, number, number]> = [
    [0, 1.7918, 1.792], [10, 1.3059, 1.3063], [20, 1.0016, 1.0034], [30, 0.7972, 0.8007], [40, 0.6527, 0.6578],
  ]
  it.each(table)('%d °C', (t, mu_mPas, nu_mm2s) => {
    expect(rel(waterViscosity(t) * 1e3, mu_mPas)).toBeLessThan(0.003)
    expect(rel(waterKinematicViscosity(t) * 1e6, nu_mm2s)).toBeLessThan(0.003)
  })
})

describe('vapour pressure (IAPWS-IF97 Region 4)', () => {
  it('reproduces the IF97 verification value at 300 K', () => {
    // IAPWS-IF97 Table 35: T = 300 K → p_s = 0.353658941e-2 MPa
    expect(vapourPressure(300 - 273.15)).toBeCloseTo(3536.58941, 3)
  })
  // IAPWS-IF97 saturation pressure, Pa
  const table: Array<[number, number]> = [[0, 611.21], [10, 1228.18], [20, 2339.21], [30, 4246.69], [40, 7384.43]]
  it.each(table)('%d °C', (t, p) => {
    expect(rel(vapourPressure(t), p)).toBeLessThan(0.001)
  })
  it('agrees with the ASHRAE Hyland–Wexler values within 0.05 %', () => {
    // ASHRAE Handbook Fundamentals (Hyland & Wexler 1983), as computed by psychrolib 1.1.1
    expect(rel(vapourPressure(20), 2338.8)).toBeLessThan(0.0005)
    expect(rel(vapourPressure(40), 7383.46)).toBeLessThan(0.0005)
  })
})

describe('ISA troposphere (ICAO Doc 7488), geopotential altitude', () => {
  // ICAO standard atmosphere: p = 101325(1 − 2.25577e-5 h)^5.25588
  const table: Array<[number, number]> = [[0, 101325], [500, 95460.8], [1000, 89874.6], [1500, 84556], [2000, 79495.2], [3000, 70108.5]]
  it.each(table)('%d m', (h, p) => {
    expect(Math.abs(isaPressure(h) - p)).toBeLessThan(1)
  })
  it('has the ISA lapse rate 6.5 K/km from 288.15 K', () => {
    // ICAO Doc 7488: T0 = 288.15 K, lapse −0.0065 K/m
    expect(isaTemperature(0)).toBe(288.15)
    expect(isaTemperature(1000)).toBeCloseTo(281.65, 10)
  })
  it('gives ISA sea-level air density 1.225 kg/m³ and dry air at 20 °C 1.2041 kg/m³', () => {
    // ICAO Doc 7488: ρ0 = 1.225 kg/m³ at 288.15 K, 101325 Pa
    expect(airDensity(101325, 15)).toBeCloseTo(1.225, 3)
    // ideal gas, R = 287.05 J/(kg·K); ASHRAE (psychrolib GetDryAirDensity) gives 1.2042
    expect(Math.abs(airDensity(101325, 20) - 1.2041)).toBeLessThan(0.0002)
  })
})

describe('dissolved-oxygen saturation (Benson & Krause 1984)', () => {
  // Benson & Krause (1984), fresh water, 1 atm; USGS DOTABLES agree to 2 decimals
  const table: Array<[number, number]> = [
    [0, 14.621], [5, 12.771], [10, 11.288], [15, 10.084], [20, 9.092], [25, 8.263], [30, 7.559], [35, 6.949], [40, 6.413],
  ]
  it.each(table)('%d °C', (t, c) => {
    expect(Math.abs(oxygenSaturation1atm(t) - c)).toBeLessThan(0.005)
    expect(Math.abs(oxygenSaturation(t) - c)).toBeLessThan(0.005)
  })
  it('corrects for pressure with the Benson & Krause form, not a plain C0·P', () => {
    // Benson & Krause (1984) pressure correction (USGS memo WQ 2011.03) at 2000 m ISA, P = 0.78456 atm, 20 °C → 7.088 mg/L
    const c = oxygenSaturation(20, isaPressure(2000))
    expect(Math.abs(c - 7.088)).toBeLessThan(0.002)
    expect(Math.abs(c - 9.092 * 0.78456)).toBeGreaterThan(0.02)
  })
  it('sits within 0.5 % of the Zison (1978) elevation shortcut at 1000 m', () => {
    // Zison et al. (1978): C = C0(1 − 0.0001148 z) → 8.048 mg/L at 1000 m, 20 °C
    expect(rel(oxygenSaturation(20, isaPressure(1000)), 8.048)).toBeLessThan(0.005)
  })
  it('falls with salinity by the Benson & Krause salinity term', () => {
    // Benson & Krause (1984): ln C_S = ln C0 − S(0.017674 − 10.754/T + 2140.7/T²)
    const T = 293.15
    const expected = Math.exp(Math.log(9.092) - 35 * (0.017674 - 10.754 / T + 2140.7 / T ** 2))
    expect(Math.abs(oxygenSaturation(20, 101325, 35) - expected)).toBeLessThan(0.005)
    // UNESCO seawater tables: about 7.4 mg/L at 20 °C and S = 35 (from memory)
    expect(Math.abs(oxygenSaturation(20, 101325, 35) - 7.4)).toBeLessThan(0.1)
    expect(oxygenSalinityFactor(20, 0)).toBe(1)
  })
  it('agrees with the Garcia & Gordon (1992) refit within 0.2 % at 20 °C', () => {
    // Garcia & Gordon (1992), Benson & Krause data, µmol/kg → mg/L with the Kell density: 9.084 mg/L
    expect(rel(oxygenSaturation(20), 9.084)).toBeLessThan(0.002)
  })
})

describe('nitrogen saturation', () => {
  it('is about 14.9 mg/L at 20 °C and falls with temperature', () => {
    // Weiss (1970) N₂ solubility, fresh water; about 14.9 mg/L at 20 °C // from memory
    expect(Math.abs(nitrogenSaturation1atm(20) - 14.9)).toBeLessThan(0.3)
    expect(nitrogenSaturation1atm(5)).toBeGreaterThan(nitrogenSaturation1atm(25))
  })
  it('scales with the dry-gas partial pressure (Henry law)', () => {
    // Henry's law: C ∝ (P − p_wv)
    const c2 = nitrogenSaturation(20, 2 * 101325)
    expect(c2 / nitrogenSaturation(20)).toBeGreaterThan(2)
    expect(c2 / nitrogenSaturation(20)).toBeLessThan(2.05)
  })
})
