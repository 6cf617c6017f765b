// A commissioning record in plain words, for the reviewer's brief and the landowner summary.
import { verdictWords, type Verdict } from '../engine/commissioning'
import { monthName } from './months'

/** "12 May 2027" from the date a measurement was written with (its own local date, no time-zone shift). */
export function measuredDay(measuredAt: string): string {
  const [y, m, d] = measuredAt.slice(0, 10).split('-').map(Number)
  return `${d} ${monthName(m ?? 0, '')} ${y}`
}

/** "Measured on 12 May 2027: performs as assessed", or what fell short, flow and oxygen in turn. */
export function commissioningSentence(measuredAt: string, flow: Verdict, oxygen: Verdict): string {
  const day = `Measured on ${measuredDay(measuredAt)}`
  if (flow.kind === 'as-assessed' && oxygen.kind === 'as-assessed') return `${day}: performs as assessed`
  const part = (what: string, v: Verdict) =>
    v.kind === 'not-comparable' ? `${what} could not be compared` : v.kind === 'as-assessed' ? `${what} performs as assessed` : `${what} is ${verdictWords(v)}`
  return `${day}: ${part('the flow through the unit', flow)}; ${part('the oxygen it adds', oxygen)}`
}
