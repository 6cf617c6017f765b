// Stored assessments: typed fetch wrappers over the assessment routes, and the pure helpers that
// turn a result into headline figures, flag titles and chart series (no Chart.js here, so they unit-test).
import type { AssessResult, AssessSummary, FlagId, MonthRow, PerFlowRow } from '~~/shared/engine/assess'
import type { SensitivityResult } from '~~/shared/engine/sensitivity'
import type { AssessInput } from '~~/shared/schemas/assess'
import type { AssessmentCreate, AssessmentDetailDto, AssessmentListDto, AssessmentTable } from '~~/shared/schemas/option'

// ——— fetch wrappers ———

/** One stored assessment with its exact input and whole result. */
export function useAssessmentDetail(id: Ref<number>) {
  return useFetch<AssessmentDetailDto>(() => `/api/assessments/${id.value}`, { key: computed(() => `assessment-${id.value}`) })
}

/** An option's stored assessments, newest first. */
export function useOptionAssessments(optionId: Ref<number>) {
  return useFetch<AssessmentListDto>(() => `/api/options/${optionId.value}/assessments`, { key: computed(() => `assessments-of-${optionId.value}`) })
}

/** Runs the engine on the server for the option as stored and stores the run; `rerunOf` keeps the older one. */
export function runAssessment(optionId: number, body: Partial<AssessmentCreate> = {}): Promise<AssessmentDetailDto> {
  return $fetch<AssessmentDetailDto>(`/api/options/${optionId}/assessments`, { method: 'POST', body })
}

/** ±fraction on each key input of a stored input (stateless engine route). */
export function fetchSensitivity(input: AssessInput, fraction = 0.2): Promise<SensitivityResult> {
  return $fetch<SensitivityResult>('/api/engine/sensitivity', { method: 'POST', body: { input, fraction } })
}

/** Download address of one table of a stored assessment as CSV. */
export function exportUrl(id: number, table: AssessmentTable): string {
  return `/api/assessments/${id}/export/${table}.csv`
}

// ——— figures ———

/** A number to `digits` decimals with thin grouping, or a dash when missing. */
export function formatNumber(x: number | null | undefined, digits = 2): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '–'
  return x.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits })
}

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
    { key: 'cf', label: 'Capacity factor', value: formatNumber(s.capacityFactor * 100, 1), unit: '%', note: `${formatNumber(s.fullLoadHours, 0)} full-load h/yr` },
    { key: 'rated', label: 'Rated power', value: formatNumber(s.ratedPower_kW, 1), unit: 'kW', note: s.ratingSizedToDesign ? 'sized to the design point' : 'as entered' },
    {
      key: 'margin', label: 'Least cavitation margin', value: margin === null ? 'units never run' : formatNumber(margin, 2), unit: margin === null ? '' : 'm',
      warn: margin !== null && minMargin_m !== undefined && margin < minMargin_m, note: minMargin_m !== undefined ? `keep at least ${formatNumber(minMargin_m, 1)} m` : undefined,
    },
    {
      key: 'oxygen', label: 'Net oxygen gain, summer low flow', value: `${s.netOxygenGainSummerLowFlow_mgL > 0 ? '+' : ''}${formatNumber(s.netOxygenGainSummerLowFlow_mgL, 2)}`, unit: 'mg/L',
      warn: s.netOxygenGainSummerLowFlow_mgL < 0, note: s.netOxygenGainSummerLowFlow_mgL < 0 ? 'a loss: the river is worse off with the scheme' : `${MONTHS[s.summerLowFlow.month - 1] ?? ''} at ${formatNumber(s.summerLowFlow.flow_m3s, 2)} m³/s`,
    },
    { key: 'lcoe', label: 'LCOE', value: s.lcoe === null ? 'no energy' : formatNumber(s.lcoe, 0), unit: s.lcoe === null ? '' : 'currency/MWh' },
  ]
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec']

/** Plain titles of the flags. */
export const FLAG_TITLES: Record<FlagId, string> = {
  'cavitation': 'Cavitation at the throat',
  'gas-supersaturation': 'Gas supersaturation',
  'oxygen-below-target': 'Oxygen below the target',
  'net-oxygen-loss': 'Net oxygen loss',
  'head-limited-never-runs': 'Units never run',
}

/** Plain names of the oxygen methods. */
export const METHOD_NAMES = { 'field-transfer': 'Field transfer', 'bubble-contact': 'Bubble contact' } as const

// ——— chart series ———

/** One x/y point of a chart series. */
export interface Pt {
  x: number
  y: number
}

/** FDC bands from the per-flow table: reserved flow, reserved + flow through the units, river flow (m³/s against exceedance %). */
export function fdcBands(rows: readonly PerFlowRow[]): { reserved: Pt[]; units: Pt[]; river: Pt[] } {
  const pos = (y: number) => Math.max(y, 1e-3) // a log axis cannot show 0
  return {
    reserved: rows.map((r) => ({ x: r.exceedance, y: pos(r.reservedFlow_m3s) })),
    units: rows.map((r) => ({ x: r.exceedance, y: pos(r.reservedFlow_m3s + r.unitsRunning * r.unitFlow_m3s) })),
    river: rows.map((r) => ({ x: r.exceedance, y: pos(r.riverFlow_m3s) })),
  }
}

/** Suction head and cavitation margin against river flow, by rising flow (m against m³/s), running points only for the margin. */
export function suctionSeries(rows: readonly PerFlowRow[]): { suction: Pt[]; margin: Pt[] } {
  const sorted = [...rows].filter((r) => r.riverFlow_m3s > 0).sort((a, b) => a.riverFlow_m3s - b.riverFlow_m3s)
  return {
    suction: sorted.map((r) => ({ x: r.riverFlow_m3s, y: r.suctionHead_m })),
    margin: sorted.filter((r) => r.unitsRunning > 0).map((r) => ({ x: r.riverFlow_m3s, y: r.cavitationMargin_m })),
  }
}

/** Month labels and the month table's columns for the bar and line charts. */
export function monthSeries(months: readonly MonthRow[]) {
  return {
    labels: months.map((m) => m.name),
    energy: months.map((m) => m.energy_MWh),
    with: months.map((m) => m.downstreamWith_mgL),
    without: months.map((m) => m.downstreamWithout_mgL),
    target: months.map((m) => m.target_mgL),
  }
}

/** Tornado bars: each input's low and high ends as changes from the base, largest swing first. */
export function tornadoBars(s: SensitivityResult, measure: 'energy' | 'oxygen') {
  const base = measure === 'energy' ? s.base.annualEnergy_MWh : s.base.netOxygenGain_mgL
  const of = (e: { annualEnergy_MWh: number; netOxygenGain_mgL: number }) => (measure === 'energy' ? e.annualEnergy_MWh : e.netOxygenGain_mgL) - base
  return [...s.items]
    .sort((a, b) => (measure === 'energy' ? b.energySwing_MWh - a.energySwing_MWh : b.oxygenSwing_mgL - a.oxygenSwing_mgL))
    .map((i) => ({ label: i.label, low: of(i.low), high: of(i.high) }))
}

/** The result's flags, raised first, safety before the rest. */
export function orderedFlags(result: Pick<AssessResult, 'summary'>) {
  return [...result.summary.flags].sort((a, b) => Number(b.raised) - Number(a.raised) || Number(b.safety) - Number(a.safety))
}

// ——— chart look ———

/** Chart colours from the house palette (tailwind.config.ts). */
export const CHART_COLOURS = {
  gill: '#236b71', lichen: '#77871c', ember: '#bb4a26', peat: '#4b473c', sky: '#74c3c6',
  text: '#4b473c', grid: '#ecebe4',
} as const

/** The house font for chart labels. */
export const chartFont = { family: 'Nunito, ui-sans-serif, system-ui, sans-serif', size: 12 }

/** Tick labels of a log axis: 1, 2 and 5 of each decade, blank between. */
export function logTick(value: number | string): string {
  const v = Number(value)
  if (!(v > 0)) return ''
  const lead = Math.round((v / 10 ** Math.floor(Math.log10(v))) * 1000) / 1000
  if (lead !== 1 && lead !== 2 && lead !== 5) return ''
  return v >= 100 ? v.toFixed(0) : String(Number(v.toPrecision(2)))
}
