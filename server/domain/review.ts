import { weirHeadsLine } from '../../shared/utils/weirHeads'
import { storedVerdict, type StoredMoney } from '../../shared/engine/money'
import { baselineLineOf } from '../../shared/engine/baseline'
import type { AssessResult, FlagId } from '../../shared/engine/results'
import type { ReviewBriefDto, ReviewDecision, ReviewState } from '../../shared/schemas/review'
import { REVIEW_STATE_LABELS } from '../../shared/schemas/review'
import type { ReservedFlow } from '../../shared/schemas/site'
import { flowRulesLine, handsOffDaysLine } from '../../shared/utils/depletedReachWords'
import { howSureOf } from '../../shared/utils/howSure'
import { monthName } from '../../shared/utils/months'

// The review state machine and the other pure parts of the review: who is mentioned in a comment,
// and the reviewer's brief from a stored assessment result. No I/O here (unit-tested in
// tests/unit/review/); the routes in server/api/sites/[id]/review/** call these.
//
//   draft ──submit──▶ submitted ──decide──▶ accepted | accepted-with-conditions | returned
//                        ▲                                                          │
//                        └──────────────────────── submit ◀─────────────────────────┘

/** What someone asks the review to do. */
export type ReviewAction = { kind: 'submit' } | { kind: 'decide'; decision: ReviewDecision }

/** The outcome of asking: the next state, or why the current state does not allow it. */
export type ReviewTransition = { ok: true; from: ReviewState; to: ReviewState } | { ok: false; from: ReviewState; message: string }

/** States a site may be submitted (or re-submitted) from. */
export const SUBMITTABLE_STATES: readonly ReviewState[] = ['draft', 'returned']
/** States a decision may be recorded in. */
export const DECIDABLE_STATES: readonly ReviewState[] = ['submitted']

/** The next state after `action` in `current`, or a message naming the current state (the route answers 409). */
export function reviewTransition(current: ReviewState, action: ReviewAction): ReviewTransition {
  const label = `${current} (${REVIEW_STATE_LABELS[current].toLowerCase()})`
  if (action.kind === 'submit') {
    if (SUBMITTABLE_STATES.includes(current)) return { ok: true, from: current, to: 'submitted' }
    const why = current === 'submitted' ? 'it is already waiting for a decision' : 'it has been decided; a decided review is final'
    return { ok: false, from: current, message: `review: cannot submit, the review is ${label}: ${why}` }
  }
  if (DECIDABLE_STATES.includes(current)) return { ok: true, from: current, to: action.decision }
  const why = current === 'draft' || current === 'returned' ? 'nothing is waiting for a decision; it must be submitted first' : 'it has already been decided'
  return { ok: false, from: current, message: `review: cannot record a decision, the review is ${label}: ${why}` }
}

/** The actions `current` allows, for the UI's buttons. */
export function reviewActionsIn(current: ReviewState): { submit: boolean; decide: boolean } {
  return { submit: SUBMITTABLE_STATES.includes(current), decide: DECIDABLE_STATES.includes(current) }
}

/** A person who can be mentioned. */
export interface Mentionable {
  id: number
  name: string
  email: string
}

const escapeRegExp = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')

/**
 * The people an `@mention` in `body` names: `@` followed by their e-mail or their full name (any
 * case), not running on into a further letter, digit or e-mail character. Where two handles start
 * at the same `@` the longer wins ("@Idris Penrose" is not also "@Idris"). Each person once, in
 * order of first mention.
 */
export function findMentions(body: string, people: readonly Mentionable[]): Mentionable[] {
  const hits: { person: Mentionable; at: number; end: number }[] = []
  for (const person of people) {
    for (const handle of [person.email, person.name]) {
      const h = handle.trim()
      if (!h) continue
      const re = new RegExp(`(?<=^|[^\\w.@])@${escapeRegExp(h)}(?![\\w@-]|\\.\\w)`, 'giu')
      for (const m of body.matchAll(re)) hits.push({ person, at: m.index, end: m.index + m[0].length })
    }
  }
  hits.sort((a, b) => a.at - b.at || b.end - a.end)
  const found: Mentionable[] = []
  let coveredTo = -1
  for (const hit of hits) {
    if (hit.at < coveredTo) continue
    coveredTo = hit.end
    if (!found.includes(hit.person)) found.push(hit.person)
  }
  return found
}


/** Plain words for what a comment points at, for the mention e-mail; null when nothing. */
export function commentPointsAt(c: { assessmentId?: number | null; month?: number | null; flagId?: FlagId | null }): string | null {
  const parts: string[] = []
  if (c.assessmentId) parts.push(`assessment ${c.assessmentId}`)
  if (c.month) parts.push(monthName(c.month))
  if (c.flagId) parts.push(`the ${c.flagId} flag`)
  return parts.length ? parts.join(', ') : null
}

/** Plain words for a reserved-flow setting and where its value came from. */
export function reservedFlowBasis(setting: ReservedFlow, flow_m3s: number, hydrologyBasis: 'fdc' | 'record'): string {
  const source = hydrologyBasis === 'record' ? 'the gauged daily record' : 'the flow-duration curve'
  if (setting.kind === 'fixed') return `fixed by the site at ${flow_m3s.toFixed(2)} m³/s`
  return `Q${setting.exceedance} of ${source} (${flow_m3s.toFixed(2)} m³/s, the flow equalled or exceeded ${setting.exceedance} % of the time)`
}

/** Fields of the brief that come from the stored result alone (the route adds the site and assessment). */
export type ReviewBriefBody = Pick<ReviewBriefDto, 'reservedFlow' | 'oxygenByMonth' | 'netGainSummerLowFlow' | 'gasSupersaturation' | 'baseline' | 'flowRules' | 'howSure' | 'flags' | 'weirHeads'> & {
  money: Omit<ReviewBriefDto['money'], 'currency'>
}

// A gap this small between flows in the table is rounding, not water taken from the reserve.
const FLOW_TOLERANCE = 1e-9

/**
 * What the reviewer judges, read from an assessment's stored result, the reserved-flow setting it ran
 * with and its acceptable oxygen loss (null when the stored input does not say).
 */
export function reviewBrief(result: AssessResult, setting: ReservedFlow, acceptableOxygenLoss_mgL: number | null): ReviewBriefBody {
  const reserved = result.hydrology.reservedFlow_m3s
  // At every flow of the table, what stays in the river (the reserve plus any spill) must be at least
  // the hands-off flow and the pass flow on top of it (or the whole river when it is lower than that),
  // and the units may never take more than the maximum take (a result stored before the flow rules has neither).
  const pass = result.depletedReach?.passFlow_m3s ?? 0
  const maxTake = result.depletedReach?.maxTake_m3s ?? null
  const keptAtEveryFlow = result.perFlow.every((row) => {
    const taken = row.unitsRunning * row.unitFlow_m3s
    const leftInRiver = row.riverFlow_m3s - taken
    return leftInRiver + FLOW_TOLERANCE >= Math.min(reserved + pass, row.riverFlow_m3s) && (maxTake === null || taken <= maxTake + FLOW_TOLERANCE)
  })
  const gas = result.summary.flags.find((f) => f.id === 'gas-supersaturation')
  const slf = result.summary.summerLowFlow
  return {
    reservedFlow: { flow_m3s: reserved, setting, basis: reservedFlowBasis(setting, reserved, result.hydrology.basis), keptAtEveryFlow },
    oxygenByMonth: result.months.map((m) => ({
      month: m.month,
      name: m.name,
      flow_m3s: m.flow_m3s,
      temperature_C: m.temperature_C,
      without_mgL: m.downstreamWithout_mgL,
      with_mgL: m.downstreamWith_mgL,
      target_mgL: m.target_mgL,
      netGain_mgL: m.netGain_mgL,
      meetsTargetWithout: m.downstreamWithout_mgL >= m.target_mgL,
      meetsTargetWith: m.downstreamWith_mgL >= m.target_mgL,
      upstreamMeasured: m.upstreamMeasured ?? true,
    })),
    netGainSummerLowFlow: { value_mgL: result.summary.netOxygenGainSummerLowFlow_mgL, month: slf.month, flow_m3s: slf.flow_m3s, temperature_C: slf.temperature_C, basis: slf.basis },
    gasSupersaturation: {
      raised: gas?.raised ?? false,
      reason: gas?.reason ?? 'The stored result has no gas-supersaturation check.',
      maxUnitTotalDissolvedGas: result.summary.maxUnitTotalDissolvedGas,
    },
    baseline: baselineLineOf(result),
    weirHeads: weirHeadsLine(result.perFlow),
    flowRules: result.depletedReach
      ? { rules: flowRulesLine(result.depletedReach), handsOffOnly_d: result.depletedReach.annualHandsOffOnly_d, handsOffDays: handsOffDaysLine(result.depletedReach) }
      : null,
    howSure: howSureOf(result, acceptableOxygenLoss_mgL),
    // A result stored by an older engine has no level or share of time: its safety flag says which it was.
    flags: result.summary.flags.map((f) => ({
      id: f.id, raised: f.raised, level: f.level ?? (f.safety ? 'safety' : 'note'), safety: f.safety, shareOfTime: f.shareOfTime ?? null, reason: f.reason,
    })),
    money: briefMoney(result.money),
  }
}

/** The money figures the brief shows, from the stored result (named fields only), with the verdict worked out again for an older run. */
function briefMoney(m: StoredMoney): ReviewBriefBody['money'] {
  return {
    capex: m.capex, annualOpex: m.annualOpex, annualRevenue: m.annualRevenue, npv: m.npv, lcoe: m.lcoe,
    ...(m.exportPrice === undefined ? {} : { exportPrice: m.exportPrice }),
    ...storedVerdict(m),
  }
}
