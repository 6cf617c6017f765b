// The flow rules and the depleted reach in plain words: the reviewer's brief line, the landowner's
// sentence, from the stored result's own figures.
import { describe, expect, it } from 'vitest'
import { assess } from '../../../shared/engine/assess'
import { reviewBrief } from '../../../server/domain/review'
import { buildPublicSummary, type SummarySources } from '../../../server/domain/summaryLinks'
import { flowRulesLine, handsOffDaysLine, whatStaysSentence } from '../../../shared/utils/depletedReachWords'
import { draft, parse } from '../engine/fixtures'

const low = parse({ ...draft(), flowRules: { preset: 'low-sensitivity', maxTake: { kind: 'mean-multiple', multiple: 1.3 }, keptShare_pct: 0, passFlow_m3s: 0.2 } })
const result = assess(low)
const reach = result.depletedReach!

describe('flow rules in words', () => {
  it('names the preset and every rule with its figure', () => {
    const line = flowRulesLine(reach)
    expect(line).toMatch(/^Low sensitivity: hands-off flow [\d.]+ m³\/s, maximum take [\d.]+ m³\/s, 0 % of the flow above the hands-off flow kept in the river, fish\/eel pass flow 0\.20 m³\/s\.$/)
    expect(line).toContain(`maximum take ${(1.3 * result.hydrology.mean).toFixed(2)} m³/s`)
  })

  it('counts the days at the hands-off flow only, or says it never happens', () => {
    expect(handsOffDaysLine({ ...reach, annualHandsOffOnly_d: 12.4 })).toBe('Below the weir the river runs at the hands-off and pass flows only for about 12 days a year.')
    expect(handsOffDaysLine({ ...reach, annualHandsOffOnly_d: 0 })).toBe('The river below the weir never runs at the hands-off and pass flows only.')
    expect(handsOffDaysLine({ ...reach, annualHandsOffOnly_d: 0.2, passFlow_m3s: 0 })).toBe('Below the weir the river runs at the hands-off flow only for about under 1 day a year.')
  })

  it('the reviewer\'s brief carries one line on the rules and the hands-off days', () => {
    const brief = reviewBrief(result, low.reservedFlow, low.settings.acceptableOxygenLoss_mgL)
    expect(brief.flowRules).toEqual({ rules: flowRulesLine(reach), handsOffOnly_d: reach.annualHandsOffOnly_d, handsOffDays: handsOffDaysLine(reach) })
    const { depletedReach: _, ...older } = result
    expect(reviewBrief(older, low.reservedFlow, null).flowRules).toBeNull()
  })

  it('the landowner summary says what always stays in the river', () => {
    const sources: SummarySources = {
      site: { name: 'Test weir', river_name: 'Test Water', lat: 54.5, lng: -2.6, reach: null, gross_head_m: 2, target_oxygen_mgl: 6 },
      organisationName: 'Test Org', currency: { code: 'GBP', symbol: '£' }, creatorName: 'Ada Engineer', expiresAt: '2030-01-01T00:00:00.000Z',
      review: { state: 'draft', reason: null, conditions: null, decidedAt: null },
      assessment: { kind: 'latest', createdAt: '2026-02-01T10:00:00.000Z', engineVersion: result.engineVersion, optionName: 'Two units', design: low.option, result, acceptableOxygenLoss_mgL: 0.1 },
    }
    const s = buildPublicSummary(sources)
    expect(s.river!.whatStays).toBe(whatStaysSentence(reach))
    expect(s.river!.whatStays).toMatch(/^At least [\d.]+ m³\/s always stays in the river over the weir; on a typical day about \d+ % of the river's flow still goes over the weir\./)
  })
})
