// How a stored assessment is shown: its headline figures, flag titles and method names.
import { MONTH_SHORT } from '~~/shared/utils/months'
import type { AssessResult, AssessSummary, FlagId } from '~~/shared/engine/results'
import { formatNumber } from './format'

/** One headline figure. */
export interface Headline {
  key: string
  label: string
  /** The figure as text, without its unit. */
  value: string
  unit: string
  /** Plain words on how it was reached. */
  note?: string
  /** True when the figure is a worry (net oxygen loss, margin under the limit, no energy). */
  warn?: boolean
}

/** The six headline figures of a summary, each with its unit. */
export function headlineFigures(s: AssessSummary, minMargin_m?: number): Headline[] {
  const margin = s.minCavitationMargin_m
  return [
    { key: 'energy', label: 'Annual energy', value: formatNumber(s.annualEnergy_MWh, 1), unit: 'MWh/yr', warn: !(s.annualEnergy_MWh > 0) },
    { key: 'cf', label: 'Capacity factor', value: formatNumber(s.capacityFactor * 100, 1), unit: '%', note: `${formatNumber(s.annualFullLoad_h, 0)} full-load h/yr` },
    { key: 'rated', label: 'Rated power', value: formatNumber(s.ratedPower_kW, 1), unit: 'kW', note: s.ratingSizedToDesign ? 'sized to the design point' : 'as entered' },
    {
      key: 'margin', label: 'Least cavitation margin', value: margin === null ? 'units never run' : formatNumber(margin, 2), unit: margin === null ? '' : 'm',
      warn: margin !== null && minMargin_m !== undefined && margin < minMargin_m, note: minMargin_m !== undefined ? `keep at least ${formatNumber(minMargin_m, 1)} m` : undefined,
    },
    {
      key: 'oxygen', label: 'Net oxygen gain, summer low flow', value: `${s.netOxygenGainSummerLowFlow_mgL > 0 ? '+' : ''}${formatNumber(s.netOxygenGainSummerLowFlow_mgL, 2)}`, unit: 'mg/L',
      warn: s.netOxygenGainSummerLowFlow_mgL < 0, note: s.netOxygenGainSummerLowFlow_mgL < 0 ? 'a loss: the river is worse off with the scheme' : `${MONTH_SHORT[s.summerLowFlow.month - 1] ?? ''} at ${formatNumber(s.summerLowFlow.flow_m3s, 2)} m³/s`,
    },
    { key: 'lcoe', label: 'LCOE', value: s.lcoe === null ? 'no energy' : formatNumber(s.lcoe, 0), unit: s.lcoe === null ? '' : 'currency/MWh' },
  ]
}


/** Plain titles of the flags. */
export const FLAG_TITLES: Record<FlagId, string> = {
  'cavitation': 'Cavitation at the throat',
  'gas-supersaturation': 'Gas supersaturation',
  'scheme-below-target': 'Scheme keeps the river below target',
  'net-oxygen-loss': 'Oxygen cost to the river',
  'oxygen-below-target': 'River below the oxygen target',
  'never-runs': 'Units never run',
}

/** Plain names of the oxygen methods. */
export const METHOD_NAMES = { 'bubble-model': 'Bubble model', 'field-transfer': 'Field transfer (cross-check)' } as const

/** The result's flags, raised first, safety before the rest. */
export function orderedFlags(result: Pick<AssessResult, 'summary'>) {
  return [...result.summary.flags].sort((a, b) => Number(b.raised) - Number(a.raised) || Number(b.safety) - Number(a.safety))
}
