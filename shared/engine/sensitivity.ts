// Sensitivity: each key input moved by ±20 % → change in annual energy and the year's mean net oxygen
// change (tornado chart).
import type { AssessInput } from '../schemas/assess'
import { assess } from './assess'
import { withDesign } from './sweep'

/** Names of the inputs the sensitivity moves. */
export type SensitivityKey =
  | 'riverFlow' | 'grossHead' | 'throatDiameter' | 'throatDepth' | 'jetPumpEfficiency'
  | 'turbineEfficiency' | 'airPipeDiameter' | 'sotePerMetre'

/** Figures at one end of a bar. */
export interface SensitivityEnd {
  value: number
  annualEnergy_MWh: number
  netOxygenGain_mgL: number
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
}

/** Result of a sensitivity run, bars sorted by energy swing, largest first. */
export interface SensitivityResult {
  fraction: number
  base: { annualEnergy_MWh: number, netOxygenGain_mgL: number }
  items: SensitivityItem[]
}

interface Lever {
  key: SensitivityKey
  label: string
  unit: string
  get: (i: AssessInput) => number
  set: (i: AssessInput, v: number) => AssessInput
  max?: number
}

const cap = (v: number, max: number | undefined): number => (max === undefined ? v : Math.min(v, max))

function scaleHydrology(i: AssessInput, f: number): AssessInput {
  const h = i.hydrology.kind === 'fdc'
    ? { ...i.hydrology, points: i.hydrology.points.map((p) => ({ ...p, flow: p.flow * f })) }
    : { ...i.hydrology, days: i.hydrology.days.map((d) => ({ ...d, flow: d.flow === null ? null : d.flow * f })) }
  const months = i.site.months.map((m) => (m.flow_m3s === undefined ? m : { ...m, flow_m3s: m.flow_m3s * f }))
  return { ...i, hydrology: h, site: { ...i.site, months } }
}

const LEVERS: Lever[] = [
  { key: 'riverFlow', label: 'River flow (whole curve)', unit: '×', get: () => 1, set: (i, v) => scaleHydrology(i, v) },
  {
    key: 'grossHead', label: 'Gross head', unit: 'm', get: (i) => i.site.grossHead_m,
    set: (i, v) => {
      const f = i.site.grossHead_m > 0 ? v / i.site.grossHead_m : 1
      return { ...i, site: { ...i.site, grossHead_m: v, headTable: i.site.headTable.map((p) => ({ ...p, head_m: p.head_m * f })) } }
    },
  },
  {
    key: 'throatDiameter', label: 'Throat diameter (outlet in proportion)', unit: 'm', get: (i) => i.option.throatDiameter_m,
    // The whole unit is scaled: outlet and an entered diffuser length in proportion, as the sweep does.
    set: (i, v) => withDesign(i, v, i.option.units, i.option.throatDepth_m),
  },
  { key: 'throatDepth', label: 'Throat submergence', unit: 'm', get: (i) => i.option.throatDepth_m, set: (i, v) => ({ ...i, option: { ...i.option, throatDepth_m: v } }) },
  { key: 'jetPumpEfficiency', label: 'Water-jet pump efficiency', unit: '-', max: 1, get: (i) => i.option.air.jetPumpEfficiency, set: (i, v) => ({ ...i, option: { ...i.option, air: { ...i.option.air, jetPumpEfficiency: v } } }) },
  { key: 'turbineEfficiency', label: 'Air turbine efficiency', unit: '-', max: 1, get: (i) => i.option.turbine.efficiency, set: (i, v) => ({ ...i, option: { ...i.option, turbine: { ...i.option.turbine, efficiency: v } } }) },
  { key: 'airPipeDiameter', label: 'Air pipe diameter', unit: 'm', get: (i) => i.option.air.pipeDiameter_m, set: (i, v) => ({ ...i, option: { ...i.option, air: { ...i.option.air, pipeDiameter_m: v } } }) },
  { key: 'sotePerMetre', label: 'Oxygen transfer per metre of submergence', unit: '1/m', get: (i) => i.settings.sotePerMetre, set: (i, v) => ({ ...i, settings: { ...i.settings, sotePerMetre: v } }) },
]

/** Move each key input by ±fraction (default 20 %), holding the rest, and report annual energy and net oxygen gain at each end (one-at-a-time sensitivity). */
export function sensitivity(input: AssessInput, fraction = 0.2): SensitivityResult {
  const f = Math.min(Math.max(fraction, 0), 0.9)
  const baseRun = assess(input, { compareModes: false }).summary
  const base = { annualEnergy_MWh: baseRun.annualEnergy_MWh, netOxygenGain_mgL: baseRun.meanNetOxygenGain_mgL }
  const end = (lever: Lever, v: number): SensitivityEnd => {
    const r = assess(lever.set(input, v), { compareModes: false }).summary
    return { value: v, annualEnergy_MWh: r.annualEnergy_MWh, netOxygenGain_mgL: r.meanNetOxygenGain_mgL }
  }
  const items = LEVERS.filter((l) => l.get(input) > 0).map((l): SensitivityItem => {
    const v = l.get(input)
    const low = end(l, v * (1 - f))
    const high = end(l, cap(v * (1 + f), l.max))
    return {
      key: l.key, label: l.label, unit: l.unit, baseValue: v, low, high,
      energySwing_MWh: Math.abs(high.annualEnergy_MWh - low.annualEnergy_MWh),
      oxygenSwing_mgL: Math.abs(high.netOxygenGain_mgL - low.netOxygenGain_mgL),
    }
  })
  items.sort((a, b) => b.energySwing_MWh - a.energySwing_MWh)
  return { fraction: f, base, items }
}
