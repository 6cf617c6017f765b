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

/** Pump line of the throat as a water-jet air pump, Δp_pump = Δp₀·(1 − Q_a/Q_a,max), Pa (linear jet-pump characteristic; common practice, no source). */
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

/** Q_a,max from energy (peak isentropic pneumatic power Δp₀Q_a,max·φ(Δp₀)/4 = η_ej·ρgQ_uH_w) and from β_max·Q_u (φ keeps the bound on the expansion work; energy balance, no outside source). */
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

/**
 * What one unit's air path shares across river flows at one water temperature: ρg, the discharge
 * pressure, the intake air density and the pipe constant. An assessment evaluates thousands of flows
 * at a handful of temperatures, so these are worked out once per temperature; `airPointInto` then
 * uses them exactly as `airOperatingPoint` would (the same operations in the same order).
 */
export interface AirPathSetting {
  /** ρg of the water, N/m³. */
  rhoG: number
  p_atm: number
  /** Suction at which the throat would boil, m. */
  suctionLimit_m: number
  /** Absolute pressure where the air leaves with the water, p_atm + ρg·d, Pa. */
  dischargePressure_Pa: number
  /** Intake air density, kg/m³. */
  rhoAir: number
  /** Pipe-loss constant c in Δp_pipe = c·Q_a², Pa·s²/m⁶. */
  pipeConstant: number
  jetPumpEfficiency: number
  maxGasLiquidRatio: number
  turbine: AirTurbine
}

/** The flow-independent part of an air-path input (see AirPathSetting). */
export function airPathSetting(a: Omit<AirPathInput, 'suction_m' | 'unitFlow_m3s' | 'workingHead_m'>): AirPathSetting {
  const rhoG = a.waterDensity * G
  const rhoAir = airDensity(a.p_atm, a.airTemperature_C)
  return {
    rhoG, p_atm: a.p_atm, suctionLimit_m: a.suctionLimit_m,
    dischargePressure_Pa: a.p_atm + rhoG * Math.max(0, a.dischargeDepth_m),
    rhoAir, pipeConstant: pipeLossConstant(a.pipe, rhoAir),
    jetPumpEfficiency: a.jetPumpEfficiency, maxGasLiquidRatio: a.maxGasLiquidRatio, turbine: a.turbine,
  }
}

/** An operating point with every figure zero, its fields in the order `airPointInto` fills them. */
export function blankAirPoint(): AirOperatingPoint {
  return {
    shutOffPressure_Pa: 0, effectivePumpEfficiency: 0, maxAirFlow_m3s: 0, limitedBy: 'none', airFlow_m3s: 0, airMassFlow_kgs: 0,
    pumpPressure_Pa: 0, pipeLoss_Pa: 0, turbinePressureDrop_Pa: 0, hydraulicPower_W: 0,
    shaftPower_W: 0, availableElectricalPower_W: 0, electricalPower_W: 0, waterToWire: 0, state: 'no-suction',
  }
}

/** Operating point of one unit's air path: pump line with η_ej times the useful compression share, turbine loaded for maximum shaft power, rating cap and cut-in. */
export function airOperatingPoint(a: AirPathInput): AirOperatingPoint {
  return airPointInto(airPathSetting(a), a.suction_m, a.unitFlow_m3s, a.workingHead_m, blankAirPoint())
}

/**
 * `airOperatingPoint` at one suction, unit flow and working head, written into `out` (no allocation,
 * for the engine's inner loops). ρg·Q·H, ρg·s and p_atm + ρg·d associate exactly as in the formulas,
 * so the figures are the same to the last bit as a fresh `airOperatingPoint`.
 */
export function airPointInto(set: AirPathSetting, suction_m: number, unitFlow_m3s: number, workingHead_m: number, out: AirOperatingPoint): AirOperatingPoint {
  const hydraulic = set.rhoG * Math.max(0, unitFlow_m3s) * Math.max(0, workingHead_m)
  const s = Math.min(suction_m, set.suctionLimit_m)
  const dp0 = s > 0 ? set.rhoG * s : 0
  const etaEff = set.jetPumpEfficiency * usefulCompressionFraction(set.p_atm, dp0, set.dischargePressure_Pa)
  const qmax = maxAirFlow(dp0, set.p_atm, hydraulic, unitFlow_m3s, etaEff, set.maxGasLiquidRatio)
  const c = set.pipeConstant
  const qa = optimalAirFlow(dp0, qmax.maxAirFlow_m3s, c)
  out.shutOffPressure_Pa = dp0
  out.effectivePumpEfficiency = etaEff
  out.maxAirFlow_m3s = qmax.maxAirFlow_m3s
  out.limitedBy = qmax.limitedBy
  out.hydraulicPower_W = hydraulic
  if (!(qa > 0)) {
    out.airFlow_m3s = 0
    out.airMassFlow_kgs = 0
    out.pumpPressure_Pa = dp0
    out.pipeLoss_Pa = 0
    out.turbinePressureDrop_Pa = 0
    out.shaftPower_W = 0
    out.availableElectricalPower_W = 0
    out.electricalPower_W = 0
    out.waterToWire = 0
    out.state = 'no-suction'
    return out
  }
  const pump = pumpPressure(qa, dp0, qmax.maxAirFlow_m3s)
  const loss = c * qa * qa
  const dpt = Math.max(0, pump - loss)
  const shaft = Math.max(0, set.turbine.efficiency) * isentropicPower(qa, set.p_atm, dpt)
  const avail = Math.max(0, set.turbine.generatorEfficiency) * shaft
  const rated = set.turbine.ratedPower_W
  let pe = avail
  let state: TurbineState = 'running'
  if (rated !== null && rated >= 0) {
    if (pe >= rated) { pe = rated; state = 'at-rating' }
    if (pe < set.turbine.cutInFraction * rated || rated === 0) { pe = 0; state = 'below-cut-in' }
  }
  out.airFlow_m3s = qa
  out.airMassFlow_kgs = set.rhoAir * qa
  out.pumpPressure_Pa = pump
  out.pipeLoss_Pa = loss
  out.turbinePressureDrop_Pa = dpt
  out.shaftPower_W = shaft
  out.availableElectricalPower_W = avail
  out.electricalPower_W = pe
  out.waterToWire = hydraulic > 0 ? pe / hydraulic : 0
  out.state = state
  return out
}
