// The air path: the throat as a water-jet air pump, the air pipe, and the air turbine with its generator.
import { CP_AIR, G, GAMMA_AIR, R_AIR } from './constants'
import { airDensity } from './atmosphere'
import { circleArea } from './venturi'

/** Exponent (γ − 1)/γ of an isentropic change of air. */
const K_ISEN = (GAMMA_AIR - 1) / GAMMA_AIR

/** Isentropic expansion work of air w = c_p·T₁·[1 − (p₂/p₁)^((γ−1)/γ)], J/kg (ideal-gas thermodynamics, e.g. Dixon, Fluid Mechanics and Thermodynamics of Turbomachinery ch. 2). */
export function isentropicWork(T1_K: number, p1_Pa: number, p2_Pa: number): number {
  if (!(p1_Pa > 0) || !(p2_Pa > 0) || p2_Pa >= p1_Pa) return 0
  return CP_AIR * T1_K * (1 - (p2_Pa / p1_Pa) ** K_ISEN)
}

/** Isentropic power of a free-air flow Q_a expanding by Δp from p_in, P = Q_a·(c_p/R)·p_in·[1 − (1 − Δp/p_in)^((γ−1)/γ)], W (ṁ·w with ṁ = ρ_a·Q_a, ideal gas). */
export function isentropicPower(airFlow_m3s: number, p_in: number, dp: number): number {
  if (!(airFlow_m3s > 0) || !(dp > 0) || !(p_in > 0)) return 0
  const x = Math.min(dp / p_in, 1)
  return airFlow_m3s * (CP_AIR / R_AIR) * p_in * (1 - (1 - x) ** K_ISEN)
}

/** Ratio of isentropic to incompressible (Q·Δp) power at a pressure drop, φ(Δp) ≥ 1, rising with Δp (ideal gas). */
export function compressibilityFactor(p_in: number, dp: number): number {
  if (!(dp > 0)) return (CP_AIR / R_AIR) * K_ISEN
  return isentropicPower(1, p_in, dp) / dp
}

/** Air pipe data. */
export interface AirPipe {
  diameter_m: number
  length_m: number
  /** Sum of intake, bend and valve loss coefficients. */
  lossK: number
  /** Darcy friction factor f. */
  frictionFactor: number
}

/** Pipe-loss constant c in Δp_pipe = c·Q_a², c = (K + fL/D)·½ρ_a/A², Pa·s²/m⁶ (Darcy–Weisbach). */
export function pipeLossConstant(pipe: AirPipe, rhoAir: number): number {
  const A = circleArea(pipe.diameter_m)
  if (!(A > 0)) return Number.POSITIVE_INFINITY
  const k = pipe.lossK + (pipe.frictionFactor * Math.max(0, pipe.length_m)) / pipe.diameter_m
  return (k * 0.5 * rhoAir) / (A * A)
}

/** Pressure loss of the air pipe Δp = (K + fL/D)·½ρ_a·v², Pa (Darcy–Weisbach, incompressible at intake density). */
export function pipeLoss(airFlow_m3s: number, pipe: AirPipe, rhoAir: number): number {
  const c = pipeLossConstant(pipe, rhoAir)
  return airFlow_m3s > 0 ? c * airFlow_m3s * airFlow_m3s : 0
}

/** Pump line of the throat as a water-jet air pump, Δp_pump = Δp₀·(1 − Q_a/Q_a,max), Pa (ENGINE §3, linear jet-pump characteristic). */
export function pumpPressure(airFlow_m3s: number, shutOff_Pa: number, maxAirFlow_m3s: number): number {
  if (!(maxAirFlow_m3s > 0)) return 0
  return Math.max(0, shutOff_Pa * (1 - airFlow_m3s / maxAirFlow_m3s))
}

/** Useful share of the jet's compression ln(p_atm/p_t)/ln(p_d/p_t), p_t = p_atm − Δp₀/2: the water compresses air from the throat to the discharge depth p_d, but only throat-to-atmosphere work can drive the turbine (isothermal compression, Cunningham 1974). */
export function usefulCompressionFraction(p_atm: number, shutOff_Pa: number, dischargePressure_Pa: number): number {
  const pt = p_atm - shutOff_Pa / 2
  if (!(shutOff_Pa > 0) || !(pt > 0)) return 0
  const whole = Math.log(Math.max(dischargePressure_Pa, p_atm) / pt)
  return whole > 0 ? Math.log(p_atm / pt) / whole : 0
}

/** Bounds on the free-air flow at zero back-pressure. */
export interface MaxAirFlow {
  maxAirFlow_m3s: number
  limitedBy: 'energy' | 'gas-ratio' | 'none'
}

/** Q_a,max from energy (peak isentropic pneumatic power Δp₀Q_a,max·φ(Δp₀)/4 = η_ej·ρgQ_uH_w) and from β_max·Q_u (ENGINE §3; φ keeps the bound on the expansion work). */
export function maxAirFlow(
  shutOff_Pa: number, p_atm: number, hydraulicPower_W: number, unitFlow_m3s: number,
  jetPumpEfficiency: number, maxGasLiquidRatio: number,
): MaxAirFlow {
  if (!(shutOff_Pa > 0) || !(hydraulicPower_W > 0) || !(unitFlow_m3s > 0)) return { maxAirFlow_m3s: 0, limitedBy: 'none' }
  const byEnergy = (4 * Math.max(0, jetPumpEfficiency) * hydraulicPower_W) / (shutOff_Pa * compressibilityFactor(p_atm, shutOff_Pa))
  const byRatio = Math.max(0, maxGasLiquidRatio) * unitFlow_m3s
  return byEnergy <= byRatio ? { maxAirFlow_m3s: byEnergy, limitedBy: 'energy' } : { maxAirFlow_m3s: byRatio, limitedBy: 'gas-ratio' }
}

/** Air flow that maximises turbine power Q_a·Δp_tb, root of 3cQ² + (2Δp₀/Q_max)Q − Δp₀ = 0, m³/s (closed form of d/dQ_a[Q_a·Δp_tb] = 0). */
export function optimalAirFlow(shutOff_Pa: number, maxAirFlow_m3s: number, pipeConstant: number): number {
  if (!(shutOff_Pa > 0) || !(maxAirFlow_m3s > 0) || !Number.isFinite(pipeConstant)) return 0
  const b = (2 * shutOff_Pa) / maxAirFlow_m3s
  const c = Math.max(0, pipeConstant)
  return (2 * shutOff_Pa) / (b + Math.sqrt(b * b + 12 * c * shutOff_Pa))
}

/** Turbine and generator data of one unit. */
export interface AirTurbine {
  efficiency: number
  generatorEfficiency: number
  /** Electrical rating of one unit, W; null for no cap. */
  ratedPower_W: number | null
  /** Cut-in as a fraction of the rating. */
  cutInFraction: number
}

/** Inputs of the air-path operating point of one unit. */
export interface AirPathInput {
  /** Suction head with the air valve shut, m. */
  suction_m: number
  /** Suction at which the throat would boil, m; the shut-off pressure is capped there. */
  suctionLimit_m: number
  /** Depth below the tail-pool surface where the air leaves with the water, m. */
  dischargeDepth_m: number
  unitFlow_m3s: number
  workingHead_m: number
  waterDensity: number
  p_atm: number
  airTemperature_C: number
  jetPumpEfficiency: number
  maxGasLiquidRatio: number
  pipe: AirPipe
  turbine: AirTurbine
}

/** What the turbine is doing. */
export type TurbineState = 'no-suction' | 'below-cut-in' | 'running' | 'at-rating'

/** Air-path operating point of one unit. */
export interface AirOperatingPoint {
  shutOffPressure_Pa: number
  /** η_ej times the useful compression share. */
  effectivePumpEfficiency: number
  maxAirFlow_m3s: number
  limitedBy: MaxAirFlow['limitedBy']
  /** Free-air flow at intake conditions, m³/s. */
  airFlow_m3s: number
  airMassFlow_kgs: number
  pumpPressure_Pa: number
  pipeLoss_Pa: number
  turbinePressureDrop_Pa: number
  hydraulicPower_W: number
  shaftPower_W: number
  /** Electrical power before the rating cap and cut-in, W. */
  availableElectricalPower_W: number
  electricalPower_W: number
  /** P_e/(ρgQ_uH_w); always below η_ej. */
  waterToWire: number
  state: TurbineState
}

/** Operating point of one unit's air path: pump line with η_ej times the useful compression share, turbine loaded for maximum shaft power, rating cap and cut-in (ENGINE §3). */
export function airOperatingPoint(a: AirPathInput): AirOperatingPoint {
  const hydraulic = a.waterDensity * G * Math.max(0, a.unitFlow_m3s) * Math.max(0, a.workingHead_m)
  const rhoAir = airDensity(a.p_atm, a.airTemperature_C)
  const s = Math.min(a.suction_m, a.suctionLimit_m)
  const dp0 = s > 0 ? a.waterDensity * G * s : 0
  const none: AirOperatingPoint = {
    shutOffPressure_Pa: dp0, effectivePumpEfficiency: 0, maxAirFlow_m3s: 0, limitedBy: 'none', airFlow_m3s: 0, airMassFlow_kgs: 0,
    pumpPressure_Pa: dp0, pipeLoss_Pa: 0, turbinePressureDrop_Pa: 0, hydraulicPower_W: hydraulic,
    shaftPower_W: 0, availableElectricalPower_W: 0, electricalPower_W: 0, waterToWire: 0, state: 'no-suction',
  }
  const pd = a.p_atm + a.waterDensity * G * Math.max(0, a.dischargeDepth_m)
  const etaEff = a.jetPumpEfficiency * usefulCompressionFraction(a.p_atm, dp0, pd)
  const qmax = maxAirFlow(dp0, a.p_atm, hydraulic, a.unitFlow_m3s, etaEff, a.maxGasLiquidRatio)
  const c = pipeLossConstant(a.pipe, rhoAir)
  const qa = optimalAirFlow(dp0, qmax.maxAirFlow_m3s, c)
  if (!(qa > 0)) return { ...none, effectivePumpEfficiency: etaEff, maxAirFlow_m3s: qmax.maxAirFlow_m3s, limitedBy: qmax.limitedBy }
  const pump = pumpPressure(qa, dp0, qmax.maxAirFlow_m3s)
  const loss = c * qa * qa
  const dpt = Math.max(0, pump - loss)
  const shaft = Math.max(0, a.turbine.efficiency) * isentropicPower(qa, a.p_atm, dpt)
  const avail = Math.max(0, a.turbine.generatorEfficiency) * shaft
  const rated = a.turbine.ratedPower_W
  let pe = avail
  let state: TurbineState = 'running'
  if (rated !== null && rated >= 0) {
    if (pe >= rated) { pe = rated; state = 'at-rating' }
    if (pe < a.turbine.cutInFraction * rated || rated === 0) { pe = 0; state = 'below-cut-in' }
  }
  return {
    shutOffPressure_Pa: dp0, effectivePumpEfficiency: etaEff, maxAirFlow_m3s: qmax.maxAirFlow_m3s, limitedBy: qmax.limitedBy,
    airFlow_m3s: qa, airMassFlow_kgs: rhoAir * qa, pumpPressure_Pa: pump, pipeLoss_Pa: loss,
    turbinePressureDrop_Pa: dpt, hydraulicPower_W: hydraulic, shaftPower_W: shaft,
    availableElectricalPower_W: avail, electricalPower_W: pe,
    waterToWire: hydraulic > 0 ? pe / hydraulic : 0, state,
  }
}
