// How the portfolio map colours its sites: the figure chosen, its scale and legend.
import { withCurrency } from './format'
import type { Currency } from '#shared/schemas/organisation'
import type { PortfolioRow } from '#shared/schemas/portfolio'
import { REVIEW_STATE_LABELS, REVIEW_STATES, type ReviewState } from '#shared/schemas/review'

// ——— the map's colouring ———

/** Figures the map may be coloured by. */
export type MapFigure = 'annualEnergy_MWh' | 'netOxygenGainSummerLowFlow_mgL' | 'lcoe' | 'reviewState'

/** The choices of the colour select, with the unit each figure is stated in ("currency" stands for the organisation's). */
export const MAP_FIGURES: readonly { value: MapFigure; label: string; unit: string }[] = [
  { value: 'annualEnergy_MWh', label: 'Annual energy', unit: 'MWh/yr' },
  { value: 'netOxygenGainSummerLowFlow_mgL', label: 'Net oxygen gain at summer low flow', unit: 'mg/L' },
  { value: 'lcoe', label: 'Levelised cost', unit: 'currency/MWh' },
  { value: 'reviewState', label: 'Review state', unit: '' },
]

/** Sequential steps, light to dark, from the house palette (lichen-200 … gill-800). */
export const MAP_SCALE = ['#e6eeaa', '#bccd45', '#74c3c6', '#2c878d', '#1c464a'] as const

/** Sites with no figure to show (not assessed, or no energy to cost): peat-400. */
export const MAP_NONE = '#9c9681'

/** A net oxygen loss (below 0 mg/L): ember-500. */
export const MAP_LOSS = '#d9613a'

/** Each review state's marker colour (peat, gill, lichen, ember). */
export const MAP_REVIEW_COLOURS: Record<ReviewState, string> = {
  draft: '#d8d5c8',
  submitted: '#74c3c6',
  accepted: '#77871c',
  'accepted-with-conditions': '#bccd45',
  returned: '#d9613a',
}

/** What the legend states. */
export interface MapLegend {
  /** Numeric figure: its range and unit; null for review state or when no site has the figure. */
  range: { min: number; max: number; unit: string } | null
  /** Swatches with words: review states, or the extra colours of a numeric figure. */
  swatches: { colour: string; label: string }[]
}

/** Marker colours, popup lines and legend for a figure. */
export interface MapColouring {
  fills: Record<number, string>
  notes: Record<number, string>
  legend: MapLegend
}

const NUMBER = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 2 })

/** A figure with its unit (money in `currency`), a sign on oxygen. */
export function figureText(figure: Exclude<MapFigure, 'reviewState'>, v: number, currency: Currency): string {
  const unit = withCurrency(MAP_FIGURES.find((f) => f.value === figure)!.unit, currency)
  const sign = figure === 'netOxygenGainSummerLowFlow_mgL' && v > 0 ? '+' : ''
  return `${sign}${NUMBER.format(v)} ${unit}`
}

/** The step of MAP_SCALE for `v` within [min, max]. */
function step(v: number, min: number, max: number): string {
  if (max <= min) return MAP_SCALE[MAP_SCALE.length - 1]!
  const i = Math.min(MAP_SCALE.length - 1, Math.floor(((v - min) / (max - min)) * MAP_SCALE.length))
  return MAP_SCALE[i]!
}

/** Colours the rows by `figure`; every marker also gets the value in words for its popup (money in `currency`). */
export function mapColouring(rows: readonly PortfolioRow[], figure: MapFigure, currency: Currency): MapColouring {
  const fills: Record<number, string> = {}
  const notes: Record<number, string> = {}
  if (figure === 'reviewState') {
    for (const r of rows) {
      fills[r.siteId] = MAP_REVIEW_COLOURS[r.reviewState]
      notes[r.siteId] = `Review: ${REVIEW_STATE_LABELS[r.reviewState]}`
    }
    return { fills, notes, legend: { range: null, swatches: REVIEW_STATES.map((s) => ({ colour: MAP_REVIEW_COLOURS[s], label: REVIEW_STATE_LABELS[s] })) } }
  }
  const meta = MAP_FIGURES.find((f) => f.value === figure)!
  const valueOf = (r: PortfolioRow) => (r.latest ? r.latest[figure] : null)
  const values = rows.map(valueOf).filter((v): v is number => v !== null && Number.isFinite(v))
  // Oxygen: losses are ember and the scale runs over the gains only.
  const scaled = figure === 'netOxygenGainSummerLowFlow_mgL' ? values.filter((v) => v >= 0) : values
  const min = Math.min(...scaled)
  const max = Math.max(...scaled)
  for (const r of rows) {
    const v = valueOf(r)
    if (!r.latest) {
      fills[r.siteId] = MAP_NONE
      notes[r.siteId] = `${meta.label}: not assessed`
    } else if (v === null) {
      fills[r.siteId] = MAP_NONE
      notes[r.siteId] = `${meta.label}: no energy`
    } else {
      fills[r.siteId] = figure === 'netOxygenGainSummerLowFlow_mgL' && v < 0 ? MAP_LOSS : step(v, min, max)
      notes[r.siteId] = `${meta.label}: ${figureText(figure, v, currency)}`
    }
  }
  const swatches = [{ colour: MAP_NONE, label: figure === 'lcoe' ? 'Not assessed, or no energy' : 'Not assessed' }]
  if (figure === 'netOxygenGainSummerLowFlow_mgL' && values.some((v) => v < 0)) swatches.unshift({ colour: MAP_LOSS, label: 'Oxygen lost (below 0 mg/L)' })
  return { fills, notes, legend: { range: scaled.length ? { min, max, unit: withCurrency(meta.unit, currency) } : null, swatches } }
}
