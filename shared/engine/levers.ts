// The inputs the sensitivity (tornado) and the Monte Carlo move: how each is read from an assessment
// input and set in a copy of it, with its label, unit and bounds, written once for both.
import type { AssessInput } from '../schemas/assess'
import { withDesign } from './sweep'

/** Names of the inputs a lever moves. */
export type LeverKey =
  | 'riverFlow' | 'grossHead' | 'throatDiameter' | 'throatDepth' | 'jetPumpEfficiency'
  | 'turbineEfficiency' | 'airPipeDiameter' | 'sotePerMetre' | 'bubbleDiameter' | 'generatorEfficiency'
  | 'availability' | 'capex' | 'exportPrice'

/** One input: how it is read from an assessment input and set in a copy, its label, unit and bounds. */
export interface Lever {
  key: LeverKey
  label: string
  unit: string
  get: (i: AssessInput) => number
  set: (i: AssessInput, v: number) => AssessInput
  min?: number
  max?: number
}

function scaleHydrology(i: AssessInput, f: number): AssessInput {
  const h = i.hydrology.kind === 'fdc'
    ? { ...i.hydrology, points: i.hydrology.points.map((p) => ({ ...p, flow: p.flow * f })) }
    : { ...i.hydrology, days: i.hydrology.days.map((d) => ({ ...d, flow: d.flow === null ? null : d.flow * f })) }
  const months = i.site.months.map((m) => (m.flow_m3s === undefined ? m : { ...m, flow_m3s: m.flow_m3s * f }))
  return { ...i, hydrology: h, site: { ...i.site, months } }
}

const LIST: Lever[] = [
  { key: 'riverFlow', label: 'River flow (whole curve)', unit: '×', get: () => 1, set: (i, v) => scaleHydrology(i, v) },
  {
    key: 'grossHead', label: 'Gross head', unit: 'm', get: (i) => i.site.grossHead_m,
    set: (i, v) => {
      const f = i.site.grossHead_m > 0 ? v / i.site.grossHead_m : 1
      // With the weir's hydraulics the head comes from the crest: it is raised (or lowered) by the same change,
      // so the head at every flow moves by that much until the tail drowns the crest.
      const h = i.site.hydraulics
      const hydraulics = h ? { ...h, crestHeight_m: Math.max(0, h.crestHeight_m + (v - i.site.grossHead_m)) } : h
      return { ...i, site: { ...i.site, grossHead_m: v, headTable: i.site.headTable.map((p) => ({ ...p, head_m: p.head_m * f })), hydraulics } }
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
    set: (i, v) => ({ ...i, option: { ...i.option, costs: { ...i.option.costs, fixedCost: i.option.costs.fixedCost * v, ratedPowerPrice: i.option.costs.ratedPowerPrice * v, civilsPerDesignFlow: i.option.costs.civilsPerDesignFlow * v } } }),
  },
  { key: 'exportPrice', label: 'Export price', unit: 'currency/MWh', get: (i) => i.settings.exportPrice, set: (i, v) => ({ ...i, settings: { ...i.settings, exportPrice: v } }) },
]

/** Every lever by its key. */
export const LEVERS = Object.fromEntries(LIST.map((l) => [l.key, l])) as Readonly<Record<LeverKey, Lever>>
