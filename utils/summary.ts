// The landowner summary in plain words, and the summary links' states.
import { formatNumber } from './format'
import type { OxygenRow } from './review'
import type { SummaryLinkState } from '#shared/schemas/summaryLink'

// ——— link states ———

/** Plain label of each link state. */
export const LINK_STATE_LABELS: Record<SummaryLinkState, string> = {
  active: 'Open',
  expired: 'Expired',
  revoked: 'Revoked',
}

/** Whole days from `now` until `expiresAt`, at least 0. */
export function daysLeft(expiresAt: string, now: Date = new Date()): number {
  return Math.max(0, Math.ceil((Date.parse(expiresAt) - now.getTime()) / 86_400_000))
}

// ——— plain words for the landowner ———

const mgL = (x: number) => `${formatNumber(x, 1)} mg/L`

// Changes are judged on the figures as shown (one decimal), so no sentence says "up from 12.7 to 12.7".
const shownChange = (r: OxygenRow) => Math.round(r.with * 10) - Math.round(r.without * 10)

/** One month's oxygen in a sentence a landowner can read. */
export function monthInWords(r: OxygenRow): string {
  const change = shownChange(r)
  const effect =
    change === 0
      ? 'about the same as without it'
      : change > 0
        ? `up from ${mgL(r.without)} without it`
        : `down from ${mgL(r.without)} without it`
  const verdict = r.with >= r.target ? 'enough for the target' : 'below the target'
  return `${r.name}: ${mgL(r.with)} with the scheme, ${effect}; the target is ${mgL(r.target)}, so this is ${verdict}.`
}

/** The year's effect on the river in one or two sentences. */
export function riverInWords(rows: readonly OxygenRow[]): string {
  if (!rows.length) return 'No month-by-month figures are available yet.'
  const better = rows.filter((r) => shownChange(r) > 0).length
  const worse = rows.filter((r) => shownChange(r) < 0).length
  const belowWith = rows.filter((r) => r.with < r.target).map((r) => r.name)
  const n = rows.length
  const first =
    better === n ? 'With the scheme the river would carry more oxygen in every month.'
      : better === 0 && worse === 0 ? 'With the scheme the river would carry about the same oxygen as now in every month.'
        : better === 0 ? `With the scheme the river would carry less oxygen in ${worse} of ${n} months, and about the same in the rest.`
          : `With the scheme the river would carry more oxygen in ${better} of ${n} months${worse ? ` and less in ${worse}` : ''}.`
  const parts = [
    first,
    belowWith.length ? `It would still be below the target in ${listInWords(belowWith)}.` : 'It would meet the target in every month.',
  ]
  return parts.join(' ')
}

/** "a, b and c". */
export function listInWords(items: readonly string[]): string {
  if (items.length <= 1) return items[0] ?? ''
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`
}

/** Homes-equivalent, rounded to a figure that does not pretend to precision. */
export function roundHomes(homes: number): number {
  if (homes < 10) return Math.round(homes)
  if (homes < 100) return Math.round(homes / 5) * 5
  return Math.round(homes / 10) * 10
}
