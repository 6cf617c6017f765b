// Longer than most files: the path (diffuser, rise), the exact exchange step and the gas bookkeeping belong together.
// Oxygen and nitrogen exchange between one unit's bubbles and its water: a discrete-bubble model in the
// style of McGinnis & Little (2002) and Wüest, Brooks & Imboden (1992), followed from the throat through
// the diffuser and up through the tail pool; plus total dissolved gas before and after mixing.
//
// Assumptions, stated once:
// - The free air Q_a is counted as dry air at the intake (p_atm, air temperature), as the air path does.
// - Bubbles form at the throat with diameter d_b, take the water temperature and are saturated with
//   water vapour; their dry gas is O₂ and N₂ (argon lumped with N₂, as constants.ts does); ideal gas;
//   surface tension (about 100 Pa for a 3 mm bubble) is neglected.
// - In the diffuser the bubbles move with the unit's water; the pressure recovers linearly in time from
//   the throat to the outlet (linear in distance at the mean velocity), and the residence time is the
//   diffuser length over the mean of the throat and outlet velocities.
// - In the tail pool the bubbles rise from the outlet depth at their slip velocity plus a plume velocity,
//   under hydrostatic pressure.
// - The bubbles exchange gas only with the unit's own water (Q_u), along the whole path: the water-side
//   concentration follows from the mass balance over the bubble flux per cubic metre of that water.
//   Mixing with the pool or the spill is left to mixDissolvedGas.
// - Henry's constants come from the engine's saturation functions at the site's barometric pressure,
//   so water at surface saturation has a total dissolved gas of exactly 100 %.
import { G, N2_AR_MOLE_FRACTION, O2_MOLE_FRACTION, P_STD, T_ZERO_C } from './constants'
import { DEFAULTS, type SourcedValue } from './defaults'
import { rememberRecent } from './memo'
import { filmCoefficientOf, filmParameters, riseVelocity, type FilmModel, type FilmParameters } from './bubbleFilm'
import { oxygenDiffusivity } from './oxygen'
import { nitrogenSaturation, oxygenSaturation, vapourPressureAtm } from './oxygenSaturation'
import { waterDensity, waterKinematicViscosity } from './water'

export type { FilmModel } from './bubbleFilm'

const v = (value: number, unit: string, source: string): SourcedValue => ({ value, unit, source })

/** Defaults of the discrete-bubble model, each with its origin; the two an option may set live in defaults.ts. */
export const BUBBLE_DEFAULTS = {
  bubbleDiameter: DEFAULTS.bubbleDiameter,
  plumeVelocity: DEFAULTS.plumeVelocity,
  nitrogenDiffusivityRatio: v(1.88 / 2.1, '-', 'from memory: D_N₂/D_O₂ = 1.88/2.10 (×10⁻⁹ m²/s at 25 °C, Cussler, Diffusion, table of gases in water)'),
  integrationSteps: v(60, '-', 'illustrative: fixed steps, half in the diffuser and half in the rise; 60 keep ΔP within about 1 mmHg of a 4000-step run (second-order method), and fewer lose accuracy, never stability'),
} as const satisfies Record<string, SourcedValue>

/** Molar gas constant R, J/(mol·K) (CODATA 2018, exact). */
export const R_GAS = 8.314462618

/** Molar mass of O₂, kg/mol (IUPAC standard atomic weights). */
export const M_O2 = 31.9988e-3

/** Molar mass of the lumped N₂ (+Ar), kg/mol: N₂'s, because nitrogenSaturation counts N₂'s mass (IUPAC). */
export const M_N2 = 28.0134e-3

/** Pascals in one millimetre of mercury, 101325/760 (definition of the conventional mmHg). */
export const PA_PER_MMHG = P_STD / 760

/** Smallest dry-gas pressure a bubble is given, Pa: below it the throat is cavitating (flagged by the venturi stage). */
const MIN_DRY_PRESSURE = 1000
/** Flows below these carry nothing, m³/s (keeps bubble-per-water ratios and residence times finite). */
const MIN_FLOW = 1e-9
/** A bubble whose dry moles fall below this share of its start has dissolved. */
const DISSOLVED_SHARE = 1e-9
/** Largest bubble flux per cubic metre of water, 1/m³ (an air/water ratio far past any unit's). */
const MAX_BUBBLES_PER_M3 = 1e200
const MAX_STEPS = 4000

/** Henry's constants of the two lumped gases at a temperature and barometric pressure. */
export interface HenryConstants {
  /** O₂, mol/(m³·Pa) of its partial pressure. */
  readonly o2: number
  /** N₂ (+Ar), mol/(m³·Pa). */
  readonly n2: number
  /** Water vapour pressure the saturation functions use, Pa. */
  readonly vapour_Pa: number
}

/**
 * Henry's constants H_i = C_s,i(T, p, S) / (x_i·(p − p_wv)), mol/(m³·Pa), from the engine's saturation
 * functions at pressure p (Benson & Krause 1984 for O₂, Weiss 1970 for N₂; Dalton's and Henry's laws).
 * p falls back to 1 atm where it is not above the vapour pressure.
 */
export function henryConstants(tC: number, p_Pa: number, salinity_gkg: number): HenryConstants {
  return recentHenry(tC, p_Pa, salinity_gkg)
}

// One assessment asks the same few (temperature, pressure, salinity) thousands of times: remember the
// last few (memo.ts; the answers are those of computing afresh).
const recentHenry = rememberRecent((tC: number, p_Pa = P_STD, salinity_gkg = 0): HenryConstants => freshHenryConstants(tC, p_Pa, salinity_gkg), 4)

function freshHenryConstants(tC: number, p_Pa: number, salinity_gkg: number): HenryConstants {
  const pv = vapourPressureAtm(tC) * P_STD
  const p = p_Pa > pv + MIN_DRY_PRESSURE ? p_Pa : P_STD
  const dry = Math.max(p - pv, MIN_DRY_PRESSURE)
  return {
    o2: oxygenSaturation(tC, p, salinity_gkg) / (M_O2 * 1e3) / (O2_MOLE_FRACTION * dry),
    n2: nitrogenSaturation(tC, p, salinity_gkg) / (M_N2 * 1e3) / (N2_AR_MOLE_FRACTION * dry),
    vapour_Pa: pv,
  }
}

/** Dissolved O₂ and N₂ of a water and its total dissolved gas. */
export interface DissolvedGasState {
  o2_mgL: number
  n2_mgL: number
  /** Total dissolved gas pressure over the barometric pressure (1 = 100 % of saturation). */
  tdgFraction: number
  /** Total dissolved gas pressure minus the barometric pressure, mmHg (ΔP; negative when undersaturated). */
  tdgExcess_mmHg: number
}

/** Total dissolved gas pressure P_TDG = C_O₂/H_O₂ + C_N₂/H_N₂ + p_wv, Pa (Dalton's and Henry's laws; N₂ + Ar lumped). */
export function totalDissolvedGasPressure(o2_mgL: number, n2_mgL: number, h: HenryConstants): number {
  const o2 = h.o2 > 0 ? Math.max(0, o2_mgL) / (M_O2 * 1e3) / h.o2 : 0
  const n2 = h.n2 > 0 ? Math.max(0, n2_mgL) / (M_N2 * 1e3) / h.n2 : 0
  return o2 + n2 + h.vapour_Pa
}

/** A water's O₂, N₂ and total dissolved gas: fraction P_TDG/p_atm and ΔP = P_TDG − p_atm in mmHg (Fidler & Miller 1994 definition of ΔP). */
export function dissolvedGasState(o2_mgL: number, n2_mgL: number, tC: number, p_atm: number, salinity_gkg: number, h = henryConstants(tC, p_atm, salinity_gkg)): DissolvedGasState {
  const p = totalDissolvedGasPressure(o2_mgL, n2_mgL, h)
  return {
    o2_mgL, n2_mgL,
    tdgFraction: p_atm > 0 ? p / p_atm : 0,
    tdgExcess_mmHg: (p - p_atm) / PA_PER_MMHG,
  }
}

/** One stream in a dissolved-gas mix. */
export interface GasStream {
  flow_m3s: number
  o2_mgL: number
  n2_mgL: number
}

/**
 * Full mixing of streams: flow-weighted O₂ and N₂ (ΣQC/ΣQ, mass balance), then their total dissolved gas.
 * With no flow, the first stream's water (or none) stands for the mix.
 */
export function mixDissolvedGas(streams: ReadonlyArray<GasStream>, tC: number, p_atm: number, salinity_gkg: number): DissolvedGasState & { flow_m3s: number } {
  let q = 0
  let o2 = 0
  let n2 = 0
  for (const s of streams) {
    if (s.flow_m3s > 0) {
      q += s.flow_m3s
      o2 += s.flow_m3s * s.o2_mgL
      n2 += s.flow_m3s * s.n2_mgL
    }
  }
  const first = streams[0]
  const o2Mix = q > 0 ? o2 / q : first?.o2_mgL ?? 0
  const n2Mix = q > 0 ? n2 / q : first?.n2_mgL ?? 0
  return { ...dissolvedGasState(o2Mix, n2Mix, tC, p_atm, salinity_gkg), flow_m3s: q }
}

/** One unit's water and air path, as the discrete-bubble model needs it. */
export interface BubbleUnitInput {
  /** Water temperature, °C. */
  tC: number
  /** Intake air temperature, °C (the free-air flow is given at it). */
  airTemperatureC: number
  /** Barometric pressure at the site, Pa. */
  p_atm: number
  salinity_gkg: number
  /** Water through the unit Q_u, m³/s. */
  unitFlow_m3s: number
  /** Free-air flow Q_a at intake conditions, m³/s. */
  airFlow_m3s: number
  /**
   * How far the throat pressure lies below the local hydrostatic pressure at the throat depth, m of
   * water: the throat is at p_atm + ρg·(throatDepth_m − suction_m). The venturi's own suction head
   * (vacuum against the atmosphere) s gives suction_m = throatDepth_m + s.
   */
  suction_m: number
  /** Throat centreline depth below the tail-pool surface, m. */
  throatDepth_m: number
  /** Outlet depth below the tail-pool surface, where the bubbles leave the diffuser, m. */
  outletDepth_m: number
  throatArea_m2: number
  outletArea_m2: number
  diffuserLength_m: number
  /** O₂ of the water entering the unit, mg/L. */
  o2In_mgL: number
  /** N₂ (+Ar) of the water entering the unit, mg/L. */
  n2In_mgL: number
}

/** Settings of the discrete-bubble model; each defaults to BUBBLE_DEFAULTS or DEFAULTS. */
export interface BubbleOptions {
  /** Initial bubble diameter at the throat, m. */
  bubbleDiameter_m?: number
  /** Upward water velocity of the plume in the tail pool, m/s. */
  plumeVelocity_ms?: number
  filmModel?: FilmModel
  /** Fixed integration steps over the whole path (at least 2). */
  steps?: number
  /** Diffusivity of O₂ in water at 20 °C, m²/s. */
  oxygenDiffusivity20?: number
}

/** Result of the discrete-bubble model for one unit. */
export interface BubbleTransferResult {
  /** Unit water at the end of the diffuser, before the rise. */
  outlet: DissolvedGasState
  /** Unit water after the bubbles have risen to the surface (before mixing with anything else). */
  surface: DissolvedGasState
  /** O₂ taken up by the unit's water, kg/s (negative when it degasses). */
  o2Uptake_kgs: number
  /** O₂ carried by the air, kg/s. */
  o2Supply_kgs: number
  /** N₂ (+Ar) taken up, kg/s. */
  n2Uptake_kgs: number
  /** O₂ saturation at the surface, C_s(T, p_atm, S), mg/L. */
  o2SurfaceSaturation_mgL: number
  /** N₂ saturation at the surface, mg/L. */
  n2SurfaceSaturation_mgL: number
  /** Share of the inlet's O₂ deficit to surface saturation closed, (C_out − C_in)/(C_s − C_in); negative when the water moved away from C_s. */
  fractionApproached: number
  /** Lowest and highest O₂ the bubbles could have brought the water to along the path (local equilibrium), mg/L. */
  o2Equilibrium_mgL: { min: number, max: number }
  /** Bubble diameter at the throat and at the end (surface, or 0 when dissolved), m. */
  bubbleDiameterIn_m: number
  bubbleDiameterOut_m: number
  bubbleDissolved: boolean
  /** Bubbles formed per second. */
  bubbleFlux_per_s: number
  diffuserTime_s: number
  riseTime_s: number
  contactTime_s: number
  filmModel: FilmModel
}

/** Constants of one run. */
interface Run {
  hO: number
  hN: number
  RT: number
  /** Bubbles per cubic metre of unit water, 1/m³. */
  r: number
  filmO: FilmParameters
  filmN: FilmParameters
  ntMin: number
}

/** Moles in one bubble and the unit water's concentrations, mol and mol/m³. */
interface State {
  nO: number
  nN: number
  cO: number
  cN: number
}

/** Step coefficients: K_L·A of each gas (m³/s), dry pressure over moles (Pa/mol), slip velocity (m/s). */
interface Coefficients {
  aO: number
  aN: number
  beta: number
  u: number
}

/** Where the water's O₂ could be driven (local equilibrium, mol/m³) and whether the bubble has gone. */
interface Track {
  eqMin: number
  eqMax: number
  dissolved: boolean
}

function clampedFinite(x: number | undefined, fallback: number, min: number, max: number): number {
  return x !== undefined && Number.isFinite(x) ? Math.min(max, Math.max(min, x)) : fallback
}

/** Bubble diameter from its dry moles at a dry-gas pressure, m (ideal gas, saturated with vapour). */
function diameterOf(run: Run, nt: number, dry: number): number {
  return Math.cbrt((6 * nt * run.RT) / (Math.PI * dry))
}

function coefficients(run: Run, s: State, dry: number, out: Coefficients): void {
  const nt = s.nO + s.nN
  const d = diameterOf(run, nt, dry)
  const u = riseVelocity(d)
  const area = Math.PI * d * d
  out.aO = filmCoefficientOf(run.filmO, d, u) * area
  out.aN = filmCoefficientOf(run.filmN, d, u) * area
  out.beta = dry / nt
  out.u = u
}

/**
 * Exchange of one gas over h with frozen coefficients, solved exactly: with D = H·β·n − C the
 * disequilibrium, dn/dt = −k·A·D and dC/dt = r·k·A·D give D(h) = D₀·e^(−λh), λ = k·A·(Hβ + r),
 * so neither side passes the equilibrium and no step size is unstable. Returns the bubble's change in moles.
 */
function exchangeGas(H: number, beta: number, a: number, r: number, h: number, n: number, c: number): number {
  const hb = H * beta
  const x = a * (hb + r) * h
  // x is NaN only for 0·∞ (no film and no time limit): nothing is exchanged then.
  const f = x > 0 ? -Math.expm1(-x) : 0
  return (-(hb * n - c) * f) / (hb + r)
}

/** The bubble half way through a step, carried by the coefficients at its start (the start again if it would dissolve). */
function predictMidpoint(run: Run, s: State, co: Coefficients, h: number, mid: State): void {
  mid.nO = s.nO + exchangeGas(run.hO, co.beta, co.aO, run.r, h / 2, s.nO, s.cO)
  mid.nN = s.nN + exchangeGas(run.hN, co.beta, co.aN, run.r, h / 2, s.nN, s.cN)
  mid.cO = s.cO - run.r * (mid.nO - s.nO)
  mid.cN = s.cN - run.r * (mid.nN - s.nN)
  if (!(mid.nO + mid.nN > run.ntMin)) Object.assign(mid, s)
}

/**
 * The full step with the midpoint's coefficients (exponential midpoint method: second order in the slowly
 * varying pressure, size and film coefficient, exact in the fast exchange). Records the local equilibrium.
 */
function advance(run: Run, s: State, co: Coefficients, h: number, track: Track): void {
  const hbO = run.hO * co.beta
  const eqStart = hbO * s.nO
  const dnO = exchangeGas(run.hO, co.beta, co.aO, run.r, h, s.nO, s.cO)
  const dnN = exchangeGas(run.hN, co.beta, co.aN, run.r, h, s.nN, s.cN)
  s.nO += dnO
  s.nN += dnN
  s.cO -= run.r * dnO
  s.cN -= run.r * dnN
  const eqEnd = hbO * s.nO
  track.eqMin = Math.min(track.eqMin, eqStart, eqEnd)
  track.eqMax = Math.max(track.eqMax, eqStart, eqEnd)
  if (!(s.nO + s.nN > run.ntMin)) {
    // What is left dissolves into the water, so the mass balance stays exact.
    s.cO += run.r * Math.max(0, s.nO)
    s.cN += run.r * Math.max(0, s.nN)
    s.nO = 0
    s.nN = 0
    track.dissolved = true
  }
}

/**
 * One unit's O₂ and N₂ exchange with its bubbles (discrete-bubble model, McGinnis & Little 2002; Wüest,
 * Brooks & Imboden 1992): per bubble dn_i/dt = −K_L·A_b·(H_i·x_i·(P − p_wv) − C_i), per cubic metre of
 * unit water dC_i/dt = −(N/Q_u)·dn_i/dt, from the throat (p_atm + ρg(d_t − s)) through the diffuser to
 * the outlet (p_atm + ρg·d_o), then up to the surface at u_b(d) + plume velocity. No water or no air: no change.
 */
export function bubbleTransfer(input: BubbleUnitInput, options: BubbleOptions = {}): BubbleTransferResult {
  const model: FilmModel = options.filmModel ?? 'mcginnis-little'
  const db = clampedFinite(options.bubbleDiameter_m, BUBBLE_DEFAULTS.bubbleDiameter.value, 0, 1)
  const plume = clampedFinite(options.plumeVelocity_ms, BUBBLE_DEFAULTS.plumeVelocity.value, 0, 100)
  const steps = Math.round(clampedFinite(options.steps, BUBBLE_DEFAULTS.integrationSteps.value, 2, MAX_STEPS))
  const dO20 = clampedFinite(options.oxygenDiffusivity20, DEFAULTS.oxygenDiffusivity20.value, 0, 1)

  const tC = input.tC
  const pAtm = input.p_atm
  const h = henryConstants(tC, pAtm, input.salinity_gkg)
  const pv = h.vapour_Pa
  const cs = dissolvedSaturation(h, pAtm)
  const o2In = input.o2In_mgL
  const n2In = input.n2In_mgL
  const inlet = dissolvedGasState(o2In, n2In, tC, pAtm, input.salinity_gkg, h)
  const rho = waterDensity(tC)
  const Tw = tC + T_ZERO_C
  const Ta = Math.max(input.airTemperatureC + T_ZERO_C, 150)
  const qu = input.unitFlow_m3s
  const qa = input.airFlow_m3s
  const airMoles = qa > 0 ? (pAtm * qa) / (R_GAS * Ta) : 0
  const o2Supply = airMoles * O2_MOLE_FRACTION * M_O2

  const unchanged = (diffuserTime: number): BubbleTransferResult => ({
    outlet: inlet, surface: inlet, o2Uptake_kgs: 0, o2Supply_kgs: o2Supply, n2Uptake_kgs: 0,
    o2SurfaceSaturation_mgL: cs.o2, n2SurfaceSaturation_mgL: cs.n2, fractionApproached: 0,
    o2Equilibrium_mgL: { min: o2In, max: o2In }, bubbleDiameterIn_m: 0, bubbleDiameterOut_m: 0, bubbleDissolved: false,
    bubbleFlux_per_s: 0, diffuserTime_s: diffuserTime, riseTime_s: 0, contactTime_s: 0, filmModel: model,
  })

  const aMean = (Math.max(0, input.throatArea_m2) + Math.max(0, input.outletArea_m2)) / 2
  const length = Math.max(0, input.diffuserLength_m)
  const diffuserTime = qu >= MIN_FLOW && aMean > 0 ? (length * aMean) / qu : 0
  if (!(qu >= MIN_FLOW) || !(qa >= MIN_FLOW) || !(db > 0)) return unchanged(diffuserTime)

  const pThroat = pAtm + rho * G * (Math.max(0, input.throatDepth_m) - Math.max(0, input.suction_m))
  const outletDepth = Math.max(0, input.outletDepth_m)
  const pOutlet = pAtm + rho * G * outletDepth
  const dryAt = (p: number): number => Math.max(p - pv, MIN_DRY_PRESSURE)

  const n0 = (dryAt(pThroat) * Math.PI * db ** 3) / (6 * R_GAS * Tw)
  const N = airMoles / n0
  const dO = oxygenDiffusivity(tC, dO20)
  const nu = waterKinematicViscosity(tC)
  const run: Run = {
    hO: h.o2, hN: h.n2, RT: R_GAS * Tw, r: Math.min(N / qu, MAX_BUBBLES_PER_M3),
    filmO: filmParameters(model, dO, dO20, nu),
    filmN: filmParameters(model, dO * BUBBLE_DEFAULTS.nitrogenDiffusivityRatio.value, dO20, nu),
    ntMin: n0 * DISSOLVED_SHARE,
  }
  const toMol = (mgL: number, M: number): number => Math.max(0, mgL) / (M * 1e3)
  const s: State = { nO: n0 * O2_MOLE_FRACTION, nN: n0 * N2_AR_MOLE_FRACTION, cO: toMol(o2In, M_O2), cN: toMol(n2In, M_N2) }
  const cO0 = s.cO
  const cN0 = s.cN
  const mid: State = { nO: 0, nN: 0, cO: 0, cN: 0 }
  const co: Coefficients = { aO: 0, aN: 0, beta: 0, u: 0 }
  const track: Track = { eqMin: Infinity, eqMax: -Infinity, dissolved: false }

  // Stage 1: the diffuser, pressure linear in time from the throat to the outlet.
  const nDiffuser = Math.max(1, Math.round(steps / 2))
  const nRise = Math.max(1, steps - nDiffuser)
  if (diffuserTime > 0) {
    const dt = diffuserTime / nDiffuser
    for (let k = 0; k < nDiffuser && !track.dissolved; k++) {
      const dry = dryAt(pThroat + ((pOutlet - pThroat) * (k + 0.5)) / nDiffuser)
      coefficients(run, s, dry, co)
      predictMidpoint(run, s, co, dt, mid)
      coefficients(run, mid, dry, co)
      advance(run, s, co, dt, track)
    }
  }
  const atOutlet = { cO: s.cO, cN: s.cN }

  // Stage 2: the rise through the tail pool, in equal depth steps; each step's time from the midpoint size.
  let riseTime = 0
  if (outletDepth > 0 && !track.dissolved) {
    const dz = outletDepth / nRise
    for (let k = 0; k < nRise && !track.dissolved; k++) {
      const dry = dryAt(pAtm + rho * G * (outletDepth - (k + 0.5) * dz))
      coefficients(run, s, dry, co)
      predictMidpoint(run, s, co, dz / (co.u + plume), mid)
      coefficients(run, mid, dry, co)
      const dt = dz / (co.u + plume)
      // A bubble too small to rise, with no plume to carry it, stays where it is.
      if (!Number.isFinite(dt)) break
      advance(run, s, co, dt, track)
      riseTime += dt
    }
  }

  const mgL = (mol: number, M: number): number => mol * M * 1e3
  const outlet = dissolvedGasState(mgL(atOutlet.cO, M_O2), mgL(atOutlet.cN, M_N2), tC, pAtm, input.salinity_gkg, h)
  const surface = dissolvedGasState(mgL(s.cO, M_O2), mgL(s.cN, M_N2), tC, pAtm, input.salinity_gkg, h)
  const deficit = cs.o2 - o2In
  const gained = surface.o2_mgL - o2In
  const ntEnd = s.nO + s.nN
  return {
    outlet, surface,
    o2Uptake_kgs: (s.cO - cO0) * M_O2 * qu,
    o2Supply_kgs: o2Supply,
    n2Uptake_kgs: (s.cN - cN0) * M_N2 * qu,
    o2SurfaceSaturation_mgL: cs.o2, n2SurfaceSaturation_mgL: cs.n2,
    fractionApproached: Math.abs(deficit) > 1e-9 ? gained / deficit : 0,
    o2Equilibrium_mgL: {
      min: Number.isFinite(track.eqMin) ? mgL(track.eqMin, M_O2) : o2In,
      max: Number.isFinite(track.eqMax) ? mgL(track.eqMax, M_O2) : o2In,
    },
    bubbleDiameterIn_m: db,
    bubbleDiameterOut_m: track.dissolved || !(ntEnd > 0) ? 0 : diameterOf(run, ntEnd, dryAt(pAtm)),
    bubbleDissolved: track.dissolved,
    bubbleFlux_per_s: N,
    diffuserTime_s: diffuserTime, riseTime_s: riseTime, contactTime_s: diffuserTime + riseTime,
    filmModel: model,
  }
}

/** O₂ and N₂ saturation at the surface from the Henry's constants, C_s,i = H_i·x_i·(p_atm − p_wv), mg/L (equal to the saturation functions by construction). */
function dissolvedSaturation(h: HenryConstants, p_atm: number): { o2: number, n2: number } {
  const dry = Math.max(p_atm - h.vapour_Pa, 0)
  return { o2: h.o2 * O2_MOLE_FRACTION * dry * M_O2 * 1e3, n2: h.n2 * N2_AR_MOLE_FRACTION * dry * M_N2 * 1e3 }
}
