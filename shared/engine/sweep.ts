// Design sweep: throat diameter × number of units × submergence, and the best option that keeps every safety flag clear.
import type { AssessInput, SweepGrid } from '../schemas/assess'
import { assess } from './assess'
import type { FlagId } from './results'
import { EngineInputError } from './errors'

/** One point of a sweep. */
export interface SweepPoint {
  throatDiameter_m: number
  outletDiameter_m: number
  units: number
  throatDepth_m: number
  annualEnergy_MWh: number
  capacityFactor: number
  ratedPower_kW: number
  minCavitationMargin_m: number | null
  netOxygenGainSummerLowFlow_mgL: number
  maxUnitTotalDissolvedGas: number
  lcoe: number | null
  /** Flags raised at this point. */
  raisedFlags: FlagId[]
  /** No safety flag raised. */
  safe: boolean
}

/** Result of a sweep. */
export interface SweepResult {
  points: SweepPoint[]
  /** Most annual energy among the points with every safety flag clear (ties: more net oxygen); null if none. */
  best: SweepPoint | null
  reason: string
}

/** Replace the throat diameter (outlet scaled to keep the area ratio), units and submergence of an input. */
export function withDesign(input: AssessInput, throatDiameter_m: number, units: number, throatDepth_m: number): AssessInput {
  const scale = throatDiameter_m / input.option.throatDiameter_m
  if (!Number.isFinite(input.option.outletDiameter_m * scale)) {
    throw new EngineInputError('option.throatDiameter_m', 'is too small to scale the outlet from for the sweep')
  }
  return {
    ...input,
    option: {
      ...input.option,
      throatDiameter_m,
      outletDiameter_m: input.option.outletDiameter_m * scale,
      diffuserLength_m: input.option.diffuserLength_m === undefined ? undefined : input.option.diffuserLength_m * scale,
      units,
      throatDepth_m,
    },
  }
}

/** Run assess over every grid point and pick the best option that keeps every safety flag clear. */
export function sweep(input: AssessInput, grid: SweepGrid): SweepResult {
  const points: SweepPoint[] = []
  for (const dt of grid.throatDiameters_m) {
    for (const n of grid.units) {
      for (const depth of grid.throatDepths_m) {
        const run = withDesign(input, dt, n, depth)
        const r = assess(run).summary
        const raised = r.flags.filter((f) => f.raised)
        points.push({
          throatDiameter_m: dt, outletDiameter_m: run.option.outletDiameter_m, units: n, throatDepth_m: depth,
          annualEnergy_MWh: r.annualEnergy_MWh, capacityFactor: r.capacityFactor, ratedPower_kW: r.ratedPower_kW,
          minCavitationMargin_m: r.minCavitationMargin_m, netOxygenGainSummerLowFlow_mgL: r.netOxygenGainSummerLowFlow_mgL,
          maxUnitTotalDissolvedGas: r.maxUnitTotalDissolvedGas, lcoe: r.lcoe,
          raisedFlags: raised.map((f) => f.id), safe: raised.every((f) => !f.safety),
        })
      }
    }
  }
  const candidates = points.filter((p) => p.safe && p.annualEnergy_MWh > 0)
  const best = candidates.reduce<SweepPoint | null>((b, p) => {
    if (b === null) return p
    if (p.annualEnergy_MWh > b.annualEnergy_MWh) return p
    if (p.annualEnergy_MWh === b.annualEnergy_MWh && p.netOxygenGainSummerLowFlow_mgL > b.netOxygenGainSummerLowFlow_mgL) return p
    return b
  }, null)
  const reason = best
    ? `Of ${points.length} options, ${candidates.length} make energy with every safety flag clear; the best makes ${best.annualEnergy_MWh.toFixed(1)} MWh a year.`
    : `None of the ${points.length} options makes energy with every safety flag (cavitation, gas supersaturation, net oxygen loss) clear.`
  return { points, best, reason }
}
