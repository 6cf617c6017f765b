// Series, colours, ticks and shared options of an assessment's charts (Chart.js's types only, so they unit-test in node).
import type { ChartOptions } from 'chart.js'
import type { MonthRow, PerFlowRow } from '#shared/engine/results'
import type { SensitivityResult } from '#shared/engine/sensitivity'

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
/** What a tornado's bars measure. */
export type TornadoMeasure = 'energy' | 'oxygen' | 'npv'

const FIGURE: Record<TornadoMeasure, (e: SensitivityResult['base']) => number> = {
  energy: (e) => e.annualEnergy_MWh,
  oxygen: (e) => e.netOxygenGain_mgL,
  npv: (e) => e.npv,
}
const SWING: Record<TornadoMeasure, (i: SensitivityResult['items'][number]) => number> = {
  energy: (i) => i.energySwing_MWh,
  oxygen: (i) => i.oxygenSwing_mgL,
  npv: (i) => i.npvSwing,
}

/** The bars of a tornado: each input's change to the measure from the base run at its low and high end, largest swing first; an input that moves nothing is left out (a run from before NPV was measured shows none for NPV). */
export function tornadoBars(s: SensitivityResult, measure: TornadoMeasure) {
  const figure = FIGURE[measure]
  const base = figure(s.base)
  return [...s.items]
    .filter((i) => Number.isFinite(SWING[measure](i)) && SWING[measure](i) > 0)
    .sort((a, b) => SWING[measure](b) - SWING[measure](a))
    .map((i) => ({ label: i.label, low: figure(i.low) - base, high: figure(i.high) - base }))
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

/**
 * Options of a flow-duration chart: exceedance 0–100 % across, flow on a log axis up, the legend below
 * and a tooltip in m³/s (the site's FDC with its bands, and the depleted reach).
 */
export function exceedanceFlowOptions(formatFlow: (v: number) => string): ChartOptions<'scatter'> {
  return {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    scales: {
      x: { type: 'linear', min: 0, max: 100, title: { display: true, text: 'Exceedance (% of time)', color: CHART_COLOURS.text }, ticks: { stepSize: 10, color: CHART_COLOURS.text }, grid: { color: CHART_COLOURS.grid } },
      y: { type: 'logarithmic', title: { display: true, text: 'Flow (m³/s, log scale)', color: CHART_COLOURS.text }, ticks: { callback: logTick, color: CHART_COLOURS.text, autoSkip: false }, grid: { color: CHART_COLOURS.grid } },
    },
    plugins: {
      legend: { position: 'bottom', labels: { color: CHART_COLOURS.text, font: chartFont } },
      tooltip: { callbacks: { label: (i) => `${i.dataset.label}: ${formatFlow(i.parsed.y ?? 0)} m³/s at ${i.parsed.x} %` } },
    },
  }
}
