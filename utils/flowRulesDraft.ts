// The flow rules' part of the site form: choosing a preset fills its values into the draft, and any
// value edited away from them makes the preset 'custom' (the values stay editable either way).
import type { FlowRulePreset } from '#shared/schemas/flowRules'
import { FLOW_RULE_PRESET_VALUES, holdsPreset } from '#shared/utils/flowRulePresets'
import { flowRulesFromDraft, reservedFlowFromDraft, type SiteDraft } from './siteDraft'

type RulesDraft = Pick<SiteDraft, 'flowRulesPreset' | 'reservedKind' | 'reservedFlow' | 'reservedExceedance' | 'maxTakeKind' | 'maxTakeFlow' | 'maxTakeMultiple' | 'keptShare_pct' | 'passFlow_m3s'>

/** Choose a preset: a named one fills the hands-off flow and every rule; 'none' clears the rules beyond the hands-off flow; 'custom' changes no value. */
export function choosePreset(d: RulesDraft, p: FlowRulePreset): void {
  d.flowRulesPreset = p
  if (p === 'low-sensitivity' || p === 'high-sensitivity') {
    const v = FLOW_RULE_PRESET_VALUES[p]
    d.reservedKind = v.reservedFlow.kind
    if (v.reservedFlow.kind === 'percentile') d.reservedExceedance = v.reservedFlow.exceedance
    else d.reservedFlow = v.reservedFlow.flow
    d.maxTakeKind = v.maxTake.kind
    d.maxTakeMultiple = v.maxTake.kind === 'mean-multiple' ? v.maxTake.multiple : null
    d.maxTakeFlow = v.maxTake.kind === 'fixed' ? v.maxTake.flow_m3s : null
    d.keptShare_pct = v.keptShare_pct
    d.passFlow_m3s = v.passFlow_m3s
  } else if (p === 'none') {
    d.maxTakeKind = 'none'
    d.keptShare_pct = 0
    d.passFlow_m3s = 0
  }
}

/** After an edit: 'custom' when the values no longer hold the chosen preset's, else the preset unchanged. */
export function presetAfterEdit(d: RulesDraft): FlowRulePreset {
  return holdsPreset(d.flowRulesPreset, reservedFlowFromDraft(d), flowRulesFromDraft(d as SiteDraft)) ? d.flowRulesPreset : 'custom'
}

/** The values a watcher on the draft's rules should follow. */
export function rulesValues(d: RulesDraft): unknown[] {
  return [d.reservedKind, d.reservedFlow, d.reservedExceedance, d.maxTakeKind, d.maxTakeFlow, d.maxTakeMultiple, d.keptShare_pct, d.passFlow_m3s]
}
