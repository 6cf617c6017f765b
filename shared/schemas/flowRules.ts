// Flow rules as a regulator sets them (ENGINE.md §13), beside the hands-off flow (`reservedFlow`):
// the maximum take, the share of the flow above the hands-off flow that stays in the river, and the
// fish- or eel-pass flow that always passes. One schema for the site's stored rules and the engine's
// input; every default gives rules with no effect, so a site or input from before them is unchanged.
import { z } from 'zod'

const num = z.number({ error: 'must be a number' })
/** Largest flow accepted, m³/s (as MAX_FLOW_M3S in assess.ts, written out here so this file imports nothing). */
const MAX_RULE_FLOW_M3S = 1_000_000
const flow = num.min(0, 'must be 0 or more').max(MAX_RULE_FLOW_M3S, `must be ${MAX_RULE_FLOW_M3S.toLocaleString('en-GB')} m³/s or less`)

/** Presets, named by what they do; 'none' applies no rule beyond the hands-off flow, 'custom' is any edited set. */
export const FLOW_RULE_PRESETS = ['none', 'low-sensitivity', 'high-sensitivity', 'custom'] as const
export type FlowRulePreset = (typeof FLOW_RULE_PRESETS)[number]

/** Maximum take Q_max: none, a fixed flow, or a multiple of the mean flow of the annual curve. */
export const MaxTakeSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('none') }),
    z.object({ kind: z.literal('fixed'), flow_m3s: flow }),
    z.object({ kind: z.literal('mean-multiple'), multiple: num.min(0, 'must be between 0 and 10').max(10, 'must be between 0 and 10') }),
  ],
  { error: "must be 'none', 'fixed' or 'mean-multiple'" },
)

/** The flow rules of a site (the hands-off flow is the site's `reservedFlow`). */
export const FlowRulesSchema = z.object({
  preset: z.enum(FLOW_RULE_PRESETS, { error: "must be 'none', 'low-sensitivity', 'high-sensitivity' or 'custom'" }).default('none'),
  maxTake: MaxTakeSchema.default({ kind: 'none' }),
  /** Share of the flow above the hands-off and pass flows that stays in the river, %. */
  keptShare_pct: num.min(0, 'must be between 0 and 100').max(100, 'must be between 0 and 100').default(0),
  /** Fish- or eel-pass flow that always passes, m³/s (on top of the hands-off flow). */
  passFlow_m3s: flow.default(0),
})

/** Parsed flow rules, defaults filled in. */
export type FlowRulesSetting = z.infer<typeof FlowRulesSchema>
export type MaxTake = z.infer<typeof MaxTakeSchema>

/** Rules with no effect beyond the hands-off flow: what every site stored before flow rules has. */
export const NO_FLOW_RULES: FlowRulesSetting = { preset: 'none', maxTake: { kind: 'none' }, keptShare_pct: 0, passFlow_m3s: 0 }
