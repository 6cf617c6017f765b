// Pure helpers of the review panel (utils/review.ts): which assessments the submit form
// offers and in what order, and the oxygen rows the brief's table and chart draw.
import { describe, expect, it } from 'vitest'
import type { AssessmentDto, AssessmentListDto } from '../../../shared/schemas/assessment'
import { ReviewDecisionSchema, ReviewSubmitSchema, type ReviewBriefDto } from '../../../shared/schemas/review'
import { assessmentChoices, defaultChoice, monthsBelowTarget, oxygenRowsFromBrief, oxygenRowsFromSummary, reviewStateLabel } from '../../../utils/review'

function assessment(over: Partial<AssessmentDto>): AssessmentDto {
  return {
    id: 1, siteId: 7, optionId: 10, engineVersion: '1.0.0', stale: false, createdAt: '2026-03-01T10:00:00.000Z', createdBy: null,
    supersedes: null, supersededBy: null, annualEnergy_MWh: 412.34, capacityFactor: 0.41, ratedPower_kW: 115, minCavitationMargin_m: 1.2,
    netOxygenGainSummerLowFlow_mgL: 0.423, lcoe: 88, capex: 250_000, npv: -40_000,
    energyP50_MWh: null, energyP90_MWh: null, netLossProbability: null, recordP90_MWh: null, baselineEnergy_MWh: null, flagsRaised: [], ...over,
  }
}
const list = (optionId: number, assessments: AssessmentDto[]): AssessmentListDto => ({ optionId, page: 1, pageSize: 50, total: assessments.length, assessments })

describe('assessment choices of the submit form', () => {
  const options = [{ id: 10, name: 'Two small units' }, { id: 11, name: 'One large unit' }]
  const lists = [
    list(10, [assessment({ id: 3, createdAt: '2026-03-05T09:00:00.000Z', supersedes: 1 }), assessment({ id: 1, supersededBy: 3 })]),
    list(11, [assessment({ id: 2, optionId: 11, createdAt: '2026-03-03T09:00:00.000Z', stale: true, netOxygenGainSummerLowFlow_mgL: -0.05 })]),
  ]

  it('lists every assessment of every option, newest first', () => {
    expect(assessmentChoices(options, lists).map((c) => c.id)).toEqual([3, 2, 1])
  })

  it('labels each with its option, day and figures with their units', () => {
    const [newest, stale, older] = assessmentChoices(options, lists)
    expect(newest!.label).toBe('Two small units · 5 Mar 2026 · 412.3 MWh/yr · +0.42 mg/L at summer low flow')
    expect(stale!.label).toBe('One large unit · 3 Mar 2026 · 412.3 MWh/yr · -0.05 mg/L at summer low flow (older engine)')
    expect(older!.label).toMatch(/\(re-run since\)$/)
    expect(older!.superseded).toBe(true)
  })

  it('starts on the newest run that is neither stale nor re-run, else the newest', () => {
    expect(defaultChoice(assessmentChoices(options, lists))).toBe(3)
    const onlyOld = assessmentChoices(options, [list(11, [assessment({ id: 2, optionId: 11, stale: true })])])
    expect(defaultChoice(onlyOld)).toBe(2)
    expect(defaultChoice([])).toBeNull()
  })

  it('names an option it was not told about by its id rather than failing', () => {
    expect(assessmentChoices([], [list(12, [assessment({ id: 9, optionId: 12 })])])[0]!.optionName).toBe('Option 12')
  })

  it('gives the submit schema a body it accepts, with the chosen id', () => {
    const id = defaultChoice(assessmentChoices(options, lists))
    expect(ReviewSubmitSchema.parse({ assessmentId: id, note: '' })).toEqual({ assessmentId: 3, note: '' })
  })
})

describe('the decision form against the shared schema', () => {
  it('refuses accepting with conditions without conditions, naming the field', () => {
    const r = ReviewDecisionSchema.safeParse({ decision: 'accepted-with-conditions', reason: 'Fine', conditions: '' })
    expect(r.success).toBe(false)
    expect(r.error!.issues[0]!.path).toEqual(['conditions'])
  })
  it('accepts a plain acceptance once the form has emptied the conditions box', () => {
    expect(ReviewDecisionSchema.parse({ decision: 'accepted', reason: 'Meets the reserved flow', conditions: '' }).conditions).toBeUndefined()
  })
  it('refuses a decision without one chosen (the form starts blank)', () => {
    expect(ReviewDecisionSchema.safeParse({ decision: '', reason: 'x', conditions: '' }).error!.issues[0]!.path).toEqual(['decision'])
  })
})

describe('oxygen rows', () => {
  const brief = {
    oxygenByMonth: [
      { month: 7, name: 'Jul', flow_m3s: 1.4, temperature_C: 17.5, without_mgL: 6.8, with_mgL: 7.4, target_mgL: 7, netGain_mgL: 0.6, meetsTargetWithout: false, meetsTargetWith: true },
      { month: 8, name: 'Aug', flow_m3s: 1.1, temperature_C: 18, without_mgL: 6.5, with_mgL: 6.9, target_mgL: 7, netGain_mgL: 0.4, meetsTargetWithout: false, meetsTargetWith: false },
    ],
  } satisfies Pick<ReviewBriefDto, 'oxygenByMonth'>

  it('maps the brief with whole month names, keeping flow and temperature for the reviewer', () => {
    expect(oxygenRowsFromBrief(brief)[0]).toEqual({ month: 7, name: 'July', without: 6.8, with: 7.4, target: 7, flow: 1.4, temperature: 17.5 })
  })
  it('maps the landowner summary without them', () => {
    const rows = oxygenRowsFromSummary({ target_mgL: 7, summary: '', months: [{ month: 1, name: 'Jan', without_mgL: 11, with_mgL: 11.2, target_mgL: 7 }] })
    expect(rows).toEqual([{ month: 1, name: 'January', without: 11, with: 11.2, target: 7 }])
    expect(oxygenRowsFromSummary({ target_mgL: 7, summary: '', months: [{ month: 13, name: 'Odd', without_mgL: 1, with_mgL: 1, target_mgL: 7 }] })[0]!.name).toBe('Odd')
  })
  it('names the months under the target, without and with the scheme', () => {
    expect(monthsBelowTarget(oxygenRowsFromBrief(brief))).toEqual({ without: ['July', 'August'], with: ['August'] })
  })
})

describe('state labels', () => {
  it('words each known state for people and passes an unknown one through', () => {
    expect(reviewStateLabel('accepted-with-conditions')).toBe('Accepted with conditions')
    expect(reviewStateLabel('withdrawn')).toBe('withdrawn')
  })
})
