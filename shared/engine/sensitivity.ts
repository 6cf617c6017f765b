// Sensitivity: each key input moved by ±20 % → change in annual energy, the year's mean net oxygen
// change and the NPV (tornado chart). The inputs the Monte Carlo draws (monteCarlo.ts) are among them.
import type { AssessInput } from '../schemas/assess'
import { assess } from './assess'
import { withDesign } from './sweep'

/** Names of the inputs the sensitivity moves. */
export type SensitivityKey =
  | 'riverFlow' | 'grossHead' | 'throatDiameter' | 'throatDepth' | 'jetPumpEfficiency'
  | 'turbineEfficiency' | 'airPipeDiameter' | 'sotePerMetre' | 'bubbleDiameter' | 'generatorEfficiency'
  | 'availability' | 'capex' | 'exportPrice'

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

interface Lever {
  key: SensitivityKey
  label: string
  unit: string
  get: (i: AssessInput) => number
  set: (i: AssessInput, v: number) => AssessInput
  min?: number
  max?: number
}

const clamp = (v: number, l: Pick<Lever, 'min' | 'max'>): number => Math.min(l.max ?? Infinity, Math.max(l.min ?? -Infinity, v))

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
  // the bubble model's range is 1–6 mm (the schema's bounds)
  { key: 'bubbleDiameter', label: 'Bubble diameter', unit: 'm', min: 0.001, max: 0.006, get: (i) => i.settings.bubbleDiameter_m, set: (i, v) => ({ ...i, settings: { ...i.settings, bubbleDiameter_m: v } }) },
  { key: 'generatorEfficiency', label: 'Generator efficiency', unit: '-', max: 1, get: (i) => i.option.turbine.generatorEfficiency, set: (i, v) => ({ ...i, option: { ...i.option, turbine: { ...i.option.turbine, generatorEfficiency: v } } }) },
  { key: 'availability', label: 'Availability', unit: '-', max: 1, get: (i) => i.settings.availability, set: (i, v) => ({ ...i, settings: { ...i.settings, availability: v } }) },
  {
    key: 'capex', label: 'Capital cost (every cost line)', unit: '×', get: () => 1,
    set: (i, v) => ({ ...i, option: { ...i.option, costs: { fixedCost: i.option.costs.fixedCost * v, ratedPowerPrice: i.option.costs.ratedPowerPrice * v, civilsPerDesignFlow: i.option.costs.civilsPerDesignFlow * v } } }),
  },
  { key: 'exportPrice', label: 'Export price', unit: 'currency/MWh', get: (i) => i.settings.exportPrice, set: (i, v) => ({ ...i, settings: { ...i.settings, exportPrice: v } }) },
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
  const items = LEVERS.filter((l) => l.get(input) > 0).map((l): SensitivityItem => {
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
