// Presets of the flow rules, named by what they do. Illustrative only: in the shape of England's
// hydropower abstraction guidance (gov.uk 2024, "Appendix 1: Hydroelectric power water abstraction
// levels", REFERENCES.md §15), values from memory; the regulator's figures for the reach replace them.
import type { FlowRulePreset, MaxTake } from '../schemas/flowRules'
import type { ReservedFlow } from '../schemas/site'

/** One named preset: the hands-off flow and the rules it fills in, with where each value comes from. */
export interface FlowRulePresetValues {
  label: string
  /** What the preset is for, in plain words. */
  purpose: string
  reservedFlow: ReservedFlow
  maxTake: MaxTake
  keptShare_pct: number
  passFlow_m3s: number
  source: string
}

/** Where every preset value comes from. */
export const FLOW_RULE_PRESET_SOURCE =
  'illustrative, in the shape of England\'s hydropower abstraction guidance (gov.uk 2024, Appendix 1); values from memory — the regulator\'s figures replace them'

/** The named presets. The pass flow is 0 in both: the user enters the pass's own flow. */
export const FLOW_RULE_PRESET_VALUES: Record<'low-sensitivity' | 'high-sensitivity', FlowRulePresetValues> = {
  'low-sensitivity': {
    label: 'Low sensitivity',
    purpose: 'a reach that tolerates a large take: hands-off Q95, maximum take 1.3 × mean flow, nothing kept above the hands-off flow',
    reservedFlow: { kind: 'percentile', exceedance: 95 },
    maxTake: { kind: 'mean-multiple', multiple: 1.3 },
    keptShare_pct: 0,
    passFlow_m3s: 0,
    source: FLOW_RULE_PRESET_SOURCE,
  },
  'high-sensitivity': {
    label: 'High sensitivity',
    purpose: 'a reach that needs more of its flow: hands-off Q80, maximum take 1.0 × mean flow, half the flow above the hands-off flow kept',
    reservedFlow: { kind: 'percentile', exceedance: 80 },
    maxTake: { kind: 'mean-multiple', multiple: 1.0 },
    keptShare_pct: 50,
    passFlow_m3s: 0,
    source: FLOW_RULE_PRESET_SOURCE,
  },
}

/** Every preset's label, for selects and summaries. */
export const FLOW_RULE_PRESET_LABEL: Record<FlowRulePreset, string> = {
  'none': 'Hands-off flow only',
  'low-sensitivity': FLOW_RULE_PRESET_VALUES['low-sensitivity'].label,
  'high-sensitivity': FLOW_RULE_PRESET_VALUES['high-sensitivity'].label,
  'custom': 'Custom (your values)',
}

/** Rules as a form holds them: possibly blank (null) or half-typed, checked by the schema later. */
export interface RulesLike {
  maxTake: { kind: string } & Record<string, unknown>
  keptShare_pct: number | null
  passFlow_m3s: number | null
}

/** Whether a hands-off flow and rules still hold a preset's values ('none': no rule beyond the hands-off flow; 'custom' always holds). */
export function holdsPreset(preset: FlowRulePreset, reservedFlow: unknown, rules: RulesLike): boolean {
  if (preset === 'custom') return true
  if (preset === 'none') return rules.maxTake.kind === 'none' && rules.keptShare_pct === 0 && rules.passFlow_m3s === 0
  const p = FLOW_RULE_PRESET_VALUES[preset]
  return JSON.stringify(reservedFlow) === JSON.stringify(p.reservedFlow)
    && JSON.stringify(rules.maxTake) === JSON.stringify(p.maxTake)
    && rules.keptShare_pct === p.keptShare_pct
    && rules.passFlow_m3s === p.passFlow_m3s
}
