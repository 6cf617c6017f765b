// The site form's flow rules: a preset fills its values, an edit away from them makes it custom,
// and the body the form sends passes the server's schema (or names the bad field).
import { describe, expect, it } from 'vitest'
import { SitePatchSchema } from '../../../shared/schemas/site'
import { FLOW_RULE_PRESET_VALUES } from '../../../shared/utils/flowRulePresets'
import { choosePreset, presetAfterEdit } from '../../../utils/flowRulesDraft'
import { blankSiteDraft, flowRulesFromDraft } from '../../../utils/siteDraft'

describe('flow rules in the site form', () => {
  it('a blank site has no rule beyond the hands-off flow, and its body parses to the rules that change nothing', () => {
    const d = blankSiteDraft()
    expect(SitePatchSchema.parse({ version: 1, flowRules: flowRulesFromDraft(d) }).flowRules).toEqual({ preset: 'none', maxTake: { kind: 'none' }, keptShare_pct: 0, passFlow_m3s: 0 })
  })

  it('choosing "high sensitivity" fills the hands-off flow and every rule with its values', () => {
    const d = blankSiteDraft()
    choosePreset(d, 'high-sensitivity')
    const v = FLOW_RULE_PRESET_VALUES['high-sensitivity']
    expect(d.reservedKind).toBe('percentile')
    expect(d.reservedExceedance).toBe(80)
    expect(flowRulesFromDraft(d)).toEqual({ preset: 'high-sensitivity', maxTake: v.maxTake, keptShare_pct: 50, passFlow_m3s: 0 })
    expect(presetAfterEdit(d)).toBe('high-sensitivity')
  })

  it('editing any value away from the preset makes it custom; the hands-off flow alone keeps "none"', () => {
    const d = blankSiteDraft()
    choosePreset(d, 'low-sensitivity')
    d.passFlow_m3s = 0.15
    expect(presetAfterEdit(d)).toBe('custom')
    choosePreset(d, 'low-sensitivity')
    d.reservedExceedance = 90
    expect(presetAfterEdit(d)).toBe('custom')
    choosePreset(d, 'none')
    d.reservedExceedance = 90
    expect(presetAfterEdit(d)).toBe('none')
    d.keptShare_pct = 10
    expect(presetAfterEdit(d)).toBe('custom')
  })

  it('a blank maximum take is reported on its own field', () => {
    const d = blankSiteDraft()
    d.maxTakeKind = 'fixed'
    const r = SitePatchSchema.safeParse({ version: 1, flowRules: flowRulesFromDraft(d) })
    expect(r.success).toBe(false)
    expect(r.error!.issues[0]!.path.join('.')).toBe('flowRules.maxTake.flow_m3s')
  })
})
