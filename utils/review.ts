// How the review is shown: state labels and tones, the decisions, the assessments a submission may
// name, and the oxygen by month from the brief or the summary.
import { monthName } from '#shared/utils/months'
import { formatDay, formatNumber } from './format'
import type { AssessmentListDto } from '#shared/schemas/assessment'
import type { ReviewBriefDto, ReviewDecision, ReviewState } from '#shared/schemas/review'
import { REVIEW_STATE_LABELS } from '#shared/schemas/review'
import type { PublicSummaryDto } from '#shared/schemas/summaryLink'

// ——— states ———

/** Badge classes of each state, from the house palette (decided states read at a glance). */
export const REVIEW_STATE_TONES: Record<ReviewState, string> = {
  draft: 'bg-peat-100 text-peat-700 ring-peat-300',
  submitted: 'bg-gill-50 text-gill-800 ring-gill-300',
  accepted: 'bg-lichen-100 text-lichen-600 ring-lichen-400',
  'accepted-with-conditions': 'bg-lichen-100 text-peat-800 ring-lichen-500',
  returned: 'bg-ember-50 text-ember-700 ring-ember-300',
}

/** The label of a state, also for a state this UI does not know yet. */
export function reviewStateLabel(state: string): string {
  return (REVIEW_STATE_LABELS as Record<string, string>)[state] ?? state
}

/** What the decision choices say in the form. */
export const DECISION_CHOICES: readonly { value: ReviewDecision; label: string; hint: string }[] = [
  { value: 'accepted', label: 'Accept', hint: 'The scheme may go ahead as assessed.' },
  { value: 'accepted-with-conditions', label: 'Accept with conditions', hint: 'It may go ahead if the conditions you write are met.' },
  { value: 'returned', label: 'Return for changes', hint: 'The engineer must change the scheme and submit again.' },
]

// ——— the assessment to submit ———

/** One assessment as the submit form offers it. */
export interface AssessmentChoice {
  id: number
  optionId: number
  optionName: string
  createdAt: string
  /** "Option A · 12 Mar 2026 · 412.3 MWh/yr · +0.42 mg/L at summer low flow". */
  label: string
  /** Computed by an older engine version: re-run it before review. */
  stale: boolean
  /** A newer run of the same option exists. */
  superseded: boolean
}


const signed = (x: number, digits: number) => `${x > 0 ? '+' : ''}${formatNumber(x, digits)}`

/** Every assessment of the options, newest first, labelled with its option, day and headline figures. */
export function assessmentChoices(options: readonly { id: number; name: string }[], lists: readonly AssessmentListDto[]): AssessmentChoice[] {
  const names = new Map(options.map((o) => [o.id, o.name]))
  return lists
    .flatMap((l) => l.assessments)
    .sort((a, b) => b.createdAt.localeCompare(a.createdAt) || b.id - a.id)
    .map((a) => {
      const optionName = names.get(a.optionId) ?? `Option ${a.optionId}`
      const energy = `${formatNumber(a.annualEnergy_MWh, 1)} MWh/yr`
      const oxygen = `${signed(a.netOxygenGainSummerLowFlow_mgL, 2)} mg/L at summer low flow`
      const marks = [a.stale ? 'older engine' : '', a.supersededBy !== null ? 're-run since' : ''].filter(Boolean)
      return {
        id: a.id,
        optionId: a.optionId,
        optionName,
        createdAt: a.createdAt,
        label: [optionName, formatDay(a.createdAt), energy, oxygen].join(' · ') + (marks.length ? ` (${marks.join(', ')})` : ''),
        stale: a.stale,
        superseded: a.supersededBy !== null,
      }
    })
}

/** The choice a form should start on: the newest current run, else the newest of all; null when none. */
export function defaultChoice(choices: readonly AssessmentChoice[]): number | null {
  return (choices.find((c) => !c.stale && !c.superseded) ?? choices[0])?.id ?? null
}

// ——— oxygen by month ———

/** One month of downstream oxygen, mg/L, as the table and chart draw it. */
export interface OxygenRow {
  month: number
  name: string
  without: number
  with: number
  target: number
  /** River flow of the month, m³/s (the reviewer's table shows it). */
  flow?: number
  /** Water temperature of the month, °C. */
  temperature?: number
}


/** The whole name of a month (1 = January); the server's own name when the number is out of range. */

/** The reviewer's brief as oxygen rows. */
export function oxygenRowsFromBrief(brief: Pick<ReviewBriefDto, 'oxygenByMonth'>): OxygenRow[] {
  return brief.oxygenByMonth.map((m) => ({ month: m.month, name: monthName(m.month, m.name), without: m.without_mgL, with: m.with_mgL, target: m.target_mgL, flow: m.flow_m3s, temperature: m.temperature_C }))
}

/** The landowner summary's river months as oxygen rows. */
export function oxygenRowsFromSummary(river: NonNullable<PublicSummaryDto['river']>): OxygenRow[] {
  return river.months.map((m) => ({ month: m.month, name: monthName(m.month, m.name), without: m.without_mgL, with: m.with_mgL, target: m.target_mgL }))
}

/** Months whose oxygen is under the target, without and with the scheme. */
export function monthsBelowTarget(rows: readonly OxygenRow[]): { without: string[]; with: string[] } {
  return {
    without: rows.filter((r) => r.without < r.target).map((r) => r.name),
    with: rows.filter((r) => r.with < r.target).map((r) => r.name),
  }
}

/** What the brief shows first: the raised flags, the month the river fares worst, and the months whose upstream oxygen stands in. */
export interface BriefLead {
  raised: ReviewBriefDto['flags']
  /** The month with the lowest net oxygen change (null with no months). */
  worstMonth: ReviewBriefDto['oxygenByMonth'][number] | null
  upstream: { measured: number; standIn: string[] }
}

/** The lead of the reviewer brief, from the brief's own figures (a month stored before the measured flag counts as measured). */
export function briefLead(brief: Pick<ReviewBriefDto, 'flags' | 'oxygenByMonth'>): BriefLead {
  const months = brief.oxygenByMonth
  const worstMonth = months.reduce<BriefLead['worstMonth']>((w, m) => (w === null || m.netGain_mgL < w.netGain_mgL ? m : w), null)
  const standIn = months.filter((m) => m.upstreamMeasured === false).map((m) => m.name)
  return { raised: brief.flags.filter((f) => f.raised), worstMonth, upstream: { measured: months.length - standIn.length, standIn } }
}
