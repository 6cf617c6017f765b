// Sensitivity: each key input moved by ±20 % → change in annual energy, the year's mean net oxygen
// change and the NPV (tornado chart). The inputs the Monte Carlo draws (monteCarlo.ts) are among them.
import type { AssessInput } from '../schemas/assess'
import { assess } from './assess'
import { LEVERS, type Lever, type LeverKey } from './levers'

/** Names of the inputs the sensitivity moves. */
export type SensitivityKey = LeverKey

/** Figures at one end of a bar. */
export interface SensitivityEnd {
  value: number
  annualEnergy_MWh: number
  netOxygenGain_mgL: number
  /** Net present value at the export price, currency. */
  npv: number
}

/** One bar of the tornado chart. */
export interface SensitivityItem {
  key: SensitivityKey
  label: string
  unit: string
  baseValue: number
  low: SensitivityEnd
  high: SensitivityEnd
  /** |high − low| of annual energy, MWh/yr. */
  energySwing_MWh: number
  /** |high − low| of the year's time-weighted mean net oxygen change, mg/L. */
  oxygenSwing_mgL: number
  /** |high − low| of the NPV, currency. */
  npvSwing: number
}

/** Result of a sensitivity run, bars sorted by energy swing, largest first. */
export interface SensitivityResult {
  fraction: number
  base: { annualEnergy_MWh: number, netOxygenGain_mgL: number, npv: number }
  items: SensitivityItem[]
}

const clamp = (v: number, l: Pick<Lever, 'min' | 'max'>): number => Math.min(l.max ?? Infinity, Math.max(l.min ?? -Infinity, v))

/** The inputs the tornado moves, in the order it lists them before sorting. */
const MOVED: readonly LeverKey[] = [
  'riverFlow', 'grossHead', 'throatDiameter', 'throatDepth', 'jetPumpEfficiency', 'turbineEfficiency', 'airPipeDiameter', 'sotePerMetre',
  'bubbleDiameter', 'generatorEfficiency', 'availability', 'capex', 'exportPrice',
]

/** Move each key input by ±fraction (default 20 %), holding the rest, and report annual energy, net oxygen gain and NPV at each end (one-at-a-time sensitivity). */
export function sensitivity(input: AssessInput, fraction = 0.2): SensitivityResult {
  const f = Math.min(Math.max(fraction, 0), 0.9)
  const figures = (i: AssessInput) => {
    const r = assess(i, { compareModes: false })
    return { annualEnergy_MWh: r.summary.annualEnergy_MWh, netOxygenGain_mgL: r.summary.meanNetOxygenGain_mgL, npv: r.money.npv }
  }
  const base = figures(input)
  const end = (lever: Lever, v: number): SensitivityEnd => ({ value: v, ...figures(lever.set(input, v)) })
  const items = MOVED.map((k) => LEVERS[k]).filter((l) => l.get(input) > 0).map((l): SensitivityItem => {
    const v = l.get(input)
    const low = end(l, clamp(v * (1 - f), l))
    const high = end(l, clamp(v * (1 + f), l))
    return {
      key: l.key, label: l.label, unit: l.unit, baseValue: v, low, high,
      energySwing_MWh: Math.abs(high.annualEnergy_MWh - low.annualEnergy_MWh),
      oxygenSwing_mgL: Math.abs(high.netOxygenGain_mgL - low.netOxygenGain_mgL),
      npvSwing: Math.abs(high.npv - low.npv),
    }
  })
  items.sort((a, b) => b.energySwing_MWh - a.energySwing_MWh)
  return { fraction: f, base, items }
}
