// Columns of the portfolio's site table. The table takes a list of these, so later work can add
// headline figures (energy, oxygen, cost, review state) without touching the page.
import type { HydrologySource, SiteListItem, SiteSort } from '~~/shared/schemas/site'

/** One column of the site table. */
export interface SiteColumn {
  /** Stable key, also the cell's data-testid suffix. */
  key: string
  /** Header text. */
  label: string
  /** Unit shown in the header, e.g. "m". */
  unit?: string
  /** Server sort key when the column can be sorted. */
  sort?: SiteSort
  /** Right-align numbers. */
  numeric?: boolean
  /** The cell's text for a row. */
  value: (site: SiteListItem) => string
}

const SOURCE_TEXT: Record<HydrologySource, string> = { record: 'Daily record', points: 'Entered FDC', none: 'None yet' }

/** Number with at most `digits` decimals, or a dash. */
const fixed = (v: number | null | undefined, digits: number) => (v === null || v === undefined || !Number.isFinite(v) ? '–' : String(Number(v.toFixed(digits))))

/** The columns shown by default (the name column always leads and links to the site). */
export const DEFAULT_SITE_COLUMNS: SiteColumn[] = [
  { key: 'river', label: 'River', sort: 'riverName', value: (s) => s.riverName },
  { key: 'head', label: 'Gross head', unit: 'm', sort: 'grossHeadM', numeric: true, value: (s) => fixed(s.grossHeadM, 2) },
  { key: 'altitude', label: 'Altitude', unit: 'm', numeric: true, value: (s) => fixed(s.altitudeM, 0) },
  { key: 'hydrology', label: 'Hydrology', value: (s) => SOURCE_TEXT[s.hydrologySource] },
  { key: 'meanFlow', label: 'Mean flow', unit: 'm³/s', numeric: true, value: (s) => fixed(s.recordMeanFlow, 2) },
  { key: 'updated', label: 'Changed', sort: 'updatedAt', value: (s) => new Date(s.updatedAt).toLocaleDateString('en-GB') },
]
