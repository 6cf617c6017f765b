// The water path: one venturi (or nozzle, or plate) per unit, discharging through a diffuser into the tail pool.
import { G } from './constants'
import { DEFAULTS, DIFFUSER_EFFICIENCY, FLOW_COEFFICIENT, type ConstrictionType } from './defaults'

/** Geometry and loss data of one unit. */
export interface UnitGeometry {
  /** Throat diameter, m. */
  throatDiameter_m: number
  /** Diffuser outlet diameter, m. */
  outletDiameter_m: number
  /** Inlet loss k_in on the throat velocity head. */
  inletLoss: number
  /** Diffuser efficiency η_d, fraction of ideal recovery. */
  diffuserEfficiency: number
  /** Flow coefficient C (velocity coefficient of a venturi, contraction coefficient of a plate). */
  flowCoefficient: number
}

/** Default geometry coefficients for a constriction type (η_d and C from defaults.ts). */
export function constrictionDefaults(type: ConstrictionType): Pick<UnitGeometry, 'inletLoss' | 'diffuserEfficiency' | 'flowCoefficient'> {
  return {
    inletLoss: DEFAULTS.inletLoss.value,
    diffuserEfficiency: DIFFUSER_EFFICIENCY[type].value,
    flowCoefficient: FLOW_COEFFICIENT[type].value,
  }
}

/** Circle area πd²/4, m². */
export function circleArea(d_m: number): number {
  return d_m > 0 ? (Math.PI * d_m * d_m) / 4 : 0
}

/** Throat-to-outlet area ratio r = A_t/A_o, clamped to [0, 1]. */
export function throatAreaRatio(g: Pick<UnitGeometry, 'throatDiameter_m' | 'outletDiameter_m'>): number {
  if (!(g.outletDiameter_m > 0)) return 1
  return Math.min(1, (g.throatDiameter_m / g.outletDiameter_m) ** 2)
}

/** Loss factor on the throat velocity head, K = k_in + (1 − η_d)(1 − r²) + r² (energy equation pool to pool; Blevins §7.4 effectiveness). */
export function lossFactor(inletLoss: number, diffuserEfficiency: number, r: number): number {
  return inletLoss + (1 - diffuserEfficiency) * (1 - r * r) + r * r
}

/** Loss factor K of a unit's geometry (see lossFactor). */
export function unitLossFactor(g: UnitGeometry): number {
  return lossFactor(g.inletLoss, g.diffuserEfficiency, throatAreaRatio(g))
}

/** Effective throat flow area C·A_t, m². */
export function effectiveThroatArea(g: UnitGeometry): number {
  return g.flowCoefficient * circleArea(g.throatDiameter_m)
}

/** Unit capacity Q_cap(H) = C·A_t·√(2gH/K), m³/s (energy equation). Zero for H ≤ 0. */
export function unitCapacity(head_m: number, g: UnitGeometry): number {
  const K = unitLossFactor(g)
  if (!(head_m > 0) || !(K > 0)) return 0
  return effectiveThroatArea(g) * Math.sqrt((2 * G * head_m) / K)
}

/** Throat (jet) velocity V_t = Q_u/(C·A_t), m/s. */
export function throatVelocity(unitFlow_m3s: number, g: UnitGeometry): number {
  const a = effectiveThroatArea(g)
  return a > 0 && unitFlow_m3s > 0 ? unitFlow_m3s / a : 0
}

/** Working head of a flow-limited unit H_w = K·(Q_u/(C·A_t))²/2g, m (energy equation). */
export function headForUnitFlow(unitFlow_m3s: number, g: UnitGeometry): number {
  const V = throatVelocity(unitFlow_m3s, g)
  return (unitLossFactor(g) * V * V) / (2 * G)
}

/** Suction head at the throat with the air valve shut, s = (1 + k_in)·V_t²/2g − H_w − d_t, m (Bernoulli from head pool to throat). */
export function suctionHead(workingHead_m: number, throatDepth_m: number, V_t: number, inletLoss: number): number {
  return ((1 + inletLoss) * V_t * V_t) / (2 * G) - workingHead_m - throatDepth_m
}

/** Largest suction the water column can hold before it boils, (p_atm − p_v)/ρg, m. */
export function vapourSuctionLimit(p_atm: number, p_v: number, rho: number): number {
  return Math.max(0, (p_atm - p_v) / (rho * G))
}

/** Cavitation margin with the air valve shut, m = (p_atm − p_v)/ρg − s, m. */
export function cavitationMargin(p_atm: number, p_v: number, rho: number, suction_m: number): number {
  return (p_atm - p_v) / (rho * G) - suction_m
}

/** Throat cavitation index σ = (p_t,abs − p_v)/(½ρV_t²) with p_t,abs = p_atm − ρgs (classical definition, Knapp, Daily & Hammitt 1970); null when V_t = 0, or so near 0 that σ overflows. */
export function cavitationIndex(p_atm: number, p_v: number, rho: number, suction_m: number, V_t: number): number | null {
  const dyn = 0.5 * rho * V_t * V_t
  if (!(dyn > 0)) return null
  const sigma = (p_atm - rho * G * suction_m - p_v) / dyn
  return Number.isFinite(sigma) ? sigma : null
}

/** Fraction of the throat differential recovered downstream, η_d(1 − r²)/(1 + k_in − r²), for an upstream pipe of the outlet's area (ISO 5167-4 view of a venturi in a pipe). */
export function recoveredFraction(inletLoss: number, diffuserEfficiency: number, r: number): number {
  const diff = 1 + inletLoss - r * r
  return diff > 0 ? (diffuserEfficiency * (1 - r * r)) / diff : 0
}

/** Permanent pressure loss of a constriction as a fraction of its differential, 1 − recoveredFraction (ISO 5167-4 §5.4 definition). */
export function permanentLossFraction(inletLoss: number, diffuserEfficiency: number, r: number): number {
  return 1 - recoveredFraction(inletLoss, diffuserEfficiency, r)
}

/** Orifice plate permanent loss Δϖ/Δp = (√(1−β⁴(1−C²)) − Cβ²)/(√(1−β⁴(1−C²)) + Cβ²) (ISO 5167-2:2003 §5.4.2). */
export function orificePermanentLossFraction(beta: number, C: number): number {
  const root = Math.sqrt(1 - beta ** 4 * (1 - C * C))
  return (root - C * beta * beta) / (root + C * beta * beta)
}

/** Range of a classical venturi's permanent loss as a fraction of its differential, 5–20 % (ISO 5167-4:2003 §5.4; from memory). */
export const ISO_5167_4_VENTURI_LOSS_RANGE = { min: 0.05, max: 0.2 } as const

/** Whether a permanent-loss fraction lies in the ISO 5167-4 range for a classical venturi. */
export function venturiLossWithinIso(lossFraction: number): boolean {
  return lossFraction >= ISO_5167_4_VENTURI_LOSS_RANGE.min && lossFraction <= ISO_5167_4_VENTURI_LOSS_RANGE.max
}

/** One row of a head-vs-flow table. */
export interface HeadPoint {
  flow_m3s: number
  head_m: number
}

/** True when each row's flow is at least the one before (NaN never is, so such a table is sorted as before). */
function sortedByFlow(table: ReadonlyArray<HeadPoint>): boolean {
  for (let i = 1; i < table.length; i++) if (!((table[i - 1] as HeadPoint).flow_m3s <= (table[i] as HeadPoint).flow_m3s)) return false
  return true
}

/** Gross head at a river flow by linear interpolation in a head-vs-flow table, held flat beyond its ends. */
export function headAtFlow(table: ReadonlyArray<HeadPoint>, flow_m3s: number, fallback_m: number): number {
  if (table.length === 0) return Math.max(0, fallback_m)
  // A table already in order (the engine sorts its table once) is used as it is: a stable sort would leave it unchanged.
  const pts = sortedByFlow(table) ? table : [...table].sort((a, b) => a.flow_m3s - b.flow_m3s)
  const first = pts[0] as HeadPoint
  const last = pts[pts.length - 1] as HeadPoint
  if (flow_m3s <= first.flow_m3s) return Math.max(0, first.head_m)
  if (flow_m3s >= last.flow_m3s) return Math.max(0, last.head_m)
  for (let i = 1; i < pts.length; i++) {
    const a = pts[i - 1] as HeadPoint
    const b = pts[i] as HeadPoint
    if (flow_m3s <= b.flow_m3s) {
      const span = b.flow_m3s - a.flow_m3s
      const f = span > 0 ? (flow_m3s - a.flow_m3s) / span : 0
      return Math.max(0, a.head_m + f * (b.head_m - a.head_m))
    }
  }
  return Math.max(0, last.head_m)
}

/** Hydraulic state of one running unit. */
export interface UnitHydraulics {
  workingHead_m: number
  throatVelocity_ms: number
  /** Suction head with the air valve shut, m (negative: no suction). */
  suction_m: number
  cavitationMargin_m: number
  /** Null when no water flows. */
  cavitationIndex: number | null
}

/** Working head, throat velocity, suction and cavitation of one unit at a unit flow. */
export function unitHydraulics(
  unitFlow_m3s: number, grossHead_m: number, throatDepth_m: number, g: UnitGeometry,
  env: { p_atm: number, p_v: number, rho: number },
): UnitHydraulics {
  const Vt = throatVelocity(unitFlow_m3s, g)
  const Hw = unitFlow_m3s > 0 ? Math.min(grossHead_m, headForUnitFlow(unitFlow_m3s, g)) : 0
  const s = unitFlow_m3s > 0 ? suctionHead(Hw, throatDepth_m, Vt, g.inletLoss) : -throatDepth_m
  return {
    workingHead_m: Hw,
    throatVelocity_ms: Vt,
    suction_m: s,
    cavitationMargin_m: cavitationMargin(env.p_atm, env.p_v, env.rho, s),
    cavitationIndex: cavitationIndex(env.p_atm, env.p_v, env.rho, s, Vt),
  }
}
