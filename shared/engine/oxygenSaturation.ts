// Saturation concentrations of dissolved O₂ and N₂ in fresh water, mg/L.
import { rememberRecent } from './memo'
import { P_STD, T_ZERO_C } from './constants'

/** O₂ saturation at 1 atm in water-saturated air, mg/L: Benson & Krause (1984), as in APHA Standard Methods 4500-O and USGS memo WQ 2011.03; 0–40 °C. */
export function oxygenSaturation1atm(tC: number): number {
  const T = tC + T_ZERO_C
  const lnC = -139.34411 + 1.575701e5 / T - 6.642308e7 / T ** 2 + 1.2438e10 / T ** 3 - 8.621949e11 / T ** 4
  return Math.exp(lnC)
}

/** Water vapour pressure in atm, ln p_wv = 11.8571 − 3840.70/T − 216961/T² (APHA Standard Methods 4500-O form; from memory). */
export function vapourPressureAtm(tC: number): number {
  const T = tC + T_ZERO_C
  return Math.exp(11.8571 - 3840.7 / T - 216961 / T ** 2)
}

/** Pressure factor C_p/C₀ = P·(1 − p_wv/P)(1 − θ₀P) / ((1 − p_wv)(1 − θ₀)), θ₀ = 0.000975 − 1.426e-5·t + 6.436e-8·t², P in atm (Benson & Krause 1984; USGS memo WQ 2011.03). */
export function oxygenPressureFactor(tC: number, p_Pa: number): number {
  const P = p_Pa / P_STD
  if (!(P > 0)) return 0
  const pwv = vapourPressureAtm(tC)
  if (P <= pwv) return 0
  const th = 0.000975 - 1.426e-5 * tC + 6.436e-8 * tC ** 2
  return (P * (1 - pwv / P) * (1 - th * P)) / ((1 - pwv) * (1 - th))
}

/** Salinity factor exp(−S·(0.017674 − 10.754/T + 2140.7/T²)), S in g/kg (Benson & Krause 1984, as in USGS memo WQ 2011.03). */
export function oxygenSalinityFactor(tC: number, salinity_gkg: number): number {
  const T = tC + T_ZERO_C
  return Math.exp(-salinity_gkg * (0.017674 - 10.754 / T + 2140.7 / T ** 2))
}

/** O₂ saturation C_s(T, p, S), mg/L: Benson & Krause (1984) with its pressure correction and salinity term (USGS memo WQ 2011.03). Remembers its last few answers: each flow asks about the surface, mid-submergence and 20 °C in turn. */
export const oxygenSaturation = rememberRecent(function oxygenSaturation(tC: number, p_Pa: number = P_STD, salinity_gkg = 0): number {
  return oxygenSaturation1atm(tC) * oxygenPressureFactor(tC, p_Pa) * oxygenSalinityFactor(tC, salinity_gkg)
})

/** Density of N₂ gas at 0 °C and 1 atm, mg/mL (from memory). */
const N2_MG_PER_ML = 1.2506

/** N₂ saturation at 1 atm moist air, mg/L: Weiss (1970) Deep-Sea Res. 17:721 solubility fit in mL/L (coefficients from memory), times the gas density at STP. */
export function nitrogenSaturation1atm(tC: number, salinity_gkg = 0): number {
  const T = (tC + T_ZERO_C) / 100
  const lnC = -172.4965 + 248.4262 / T + 143.0738 * Math.log(T) - 21.712 * T
    + salinity_gkg * (-0.049781 + 0.025018 * T - 0.0034861 * T * T)
  return Math.exp(lnC) * N2_MG_PER_ML
}

/** N₂ saturation at total pressure p, mg/L: Weiss (1970) scaled by the partial-pressure ratio (P − p_wv)/(1 − p_wv) (Henry's law; from memory). Remembers its last few answers (surface and mid-submergence in turn). */
export const nitrogenSaturation = rememberRecent(function nitrogenSaturation(tC: number, p_Pa: number = P_STD, salinity_gkg = 0): number {
  const P = p_Pa / P_STD
  const pwv = vapourPressureAtm(tC)
  if (P <= pwv) return 0
  return nitrogenSaturation1atm(tC, salinity_gkg) * (P - pwv) / (1 - pwv)
})
