// Columns of the portfolio's site table, typed on PortfolioRow (GET /api/orgs/[orgId]/portfolio).
// The table takes a list of these, so a new headline figure needs no change to the page or table.
import { formatMoney, formatUpTo, moneyUnit } from './format'
import { chancePercent } from './howSure'
import type { Currency } from '#shared/schemas/organisation'
import type { PortfolioLatest, PortfolioRow, PortfolioSort } from '#shared/schemas/portfolio'
import { REVIEW_STATE_LABELS } from '#shared/schemas/review'

/** One column of the site table. */
export interface PortfolioColumn {
  /** Stable key, also the cell's data-testid suffix. */
  key: string
  /** Header text. */
  label: string
  /** Unit shown in the header, e.g. "MWh/yr". */
  unit?: string
  /** Server sort key when the column can be sorted. */
  sort?: PortfolioSort
  /** Right-align numbers. */
  numeric?: boolean
  /**
   * A figure of the latest assessment: for a site never assessed, the table joins the (adjacent)
   * figure columns into one "not assessed" cell, and `value` is only called when `latest` is set.
   */
  figure?: boolean
  /** The cell's text for a row. */
  value: (row: PortfolioRow) => string
  /** Optional fuller wording (cell title), e.g. the flags' names. */
  title?: (row: PortfolioRow) => string | undefined
}

/** Number with at most `digits` decimals, grouped, or a dash. */
export const fixed = (v: number | null | undefined, digits: number) => formatUpTo(v, digits)

/** A signed number ("+0.42", "−0.10", "0"). */
export const signed = (v: number, digits: number) => (v > 0 ? `+${fixed(v, digits)}` : v < 0 ? `−${fixed(-v, digits)}` : '0')

/** A figure of the latest assessment (the table calls it only for assessed sites). */
const of = <T>(r: PortfolioRow, pick: (l: PortfolioLatest) => T) => pick(r.latest!)

/** The columns shown by default, money in `currency` (the name column always leads and links to the site). */
export const portfolioColumns = (currency: Currency): PortfolioColumn[] => [
  { key: 'river', label: 'River', sort: 'riverName', value: (r) => r.riverName },
  { key: 'energy', label: 'Annual energy', unit: 'MWh/yr', sort: 'annualEnergy_MWh', numeric: true, figure: true, value: (r) => fixed(of(r, (l) => l.annualEnergy_MWh), 1) },
  // The pair a reviewer asks for: what a conventional turbine at the same weir would make (a dash for a run stored before it).
  {
    key: 'baselineEnergy', label: 'Conventional turbine', unit: 'MWh/yr', sort: 'baselineEnergy_MWh', numeric: true, figure: true,
    value: (r) => fixed(of(r, (l) => l.baselineEnergy_MWh), 1),
    title: () => 'Annual energy of a conventional low-head turbine at the same weir, under the same flows',
  },
  // The engine stores the capacity factor as a fraction of 1; the table shows per cent.
  { key: 'capacity', label: 'Capacity factor', unit: '%', sort: 'capacityFactor', numeric: true, figure: true, value: (r) => fixed(of(r, (l) => l.capacityFactor) * 100, 1) },
  { key: 'oxygen', label: 'Net O₂ gain at summer low flow', unit: 'mg/L', sort: 'netOxygenGainSummerLowFlow_mgL', numeric: true, figure: true, value: (r) => signed(of(r, (l) => l.netOxygenGainSummerLowFlow_mgL), 2) },
  {
    key: 'lcoe', label: 'LCOE', unit: moneyUnit(currency, 'MWh'), sort: 'lcoe', numeric: true, figure: true,
    value: (r) => { const v = of(r, (l) => l.lcoe); return v === null ? 'no energy' : fixed(v, 0) },
  },
  // Older rows stored without these show a dash.
  { key: 'npv', label: 'NPV', unit: moneyUnit(currency), sort: 'npv', numeric: true, figure: true, value: (r) => formatMoney(of(r, (l) => l.npv), currency) },
  { key: 'capex', label: 'Capital cost', unit: moneyUnit(currency), sort: 'capex', numeric: true, figure: true, value: (r) => formatMoney(of(r, (l) => l.capex), currency) },
  // From the Monte Carlo stored with the run: a dash where it did not run (no draws, or an engine before 0.3.0).
  { key: 'energyP90', label: 'P90 energy', unit: 'MWh/yr', sort: 'energyP90_MWh', numeric: true, figure: true, value: (r) => fixed(of(r, (l) => l.energyP90_MWh), 1) },
  {
    key: 'netLossChance', label: 'Chance of a net O₂ loss', unit: '%', numeric: true, figure: true,
    value: (r) => chancePercent(of(r, (l) => l.netLossProbability)),
    title: () => 'Share of the Monte Carlo draws whose worst month loses more oxygen than the acceptable loss',
  },
  {
    key: 'flags', label: 'Flags raised', unit: 'count', sort: 'flagsRaised', numeric: true, figure: true,
    value: (r) => String(of(r, (l) => l.flagsRaised.length)),
    title: (r) => (r.latest?.flagsRaised.length ? r.latest.flagsRaised.join(', ') : undefined),
  },
  { key: 'review', label: 'Review', sort: 'reviewState', value: (r) => REVIEW_STATE_LABELS[r.reviewState] },
]
