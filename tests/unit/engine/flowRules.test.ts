// Flow rules (ENGINE.md §8 step 1, §13): the take each rule allows, worked by hand; the depleted reach;
// properties over random sites; and rules at their defaults giving today's figures exactly.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { assess } from '../../../shared/engine/assess'
import { depletedReach } from '../../../shared/engine/depletedReach'
import { monteCarlo } from '../../../shared/engine/monteCarlo'
import { sensitivity } from '../../../shared/engine/sensitivity'
import { sweep } from '../../../shared/engine/sweep'
import { handsOffOnly, leftInRiver, resolveFlowRules, riverForTake, takeAllowed } from '../../../shared/engine/flowRules'
import { fdcFromPoints } from '../../../shared/engine/hydrology'
import { runBasis } from '../../../shared/engine/runBasis'
import { buildScheme, flowState } from '../../../shared/engine/scheme'
import { yearStates } from '../../../shared/engine/year'
import { NO_FLOW_RULES, type FlowRulesSetting } from '../../../shared/schemas/flowRules'
import { AssessInputSchema, type AssessInput } from '../../../shared/schemas/assess'
import { num, operatingInputArb } from './arbitraries'
import { draft, parse } from './fixtures'

// A curve whose mean flow is known: two points on a flat line give a mean of 4 m³/s.
const flat = fdcFromPoints([{ exceedance: 0, flow: 4 }, { exceedance: 50, flow: 4 }, { exceedance: 100, flow: 4 }])
const rules = (r: Partial<FlowRulesSetting>, hof = 1) => resolveFlowRules({ ...NO_FLOW_RULES, preset: 'custom', ...r }, hof, flat)

describe('flow rules: the take at one river flow, worked by hand', () => {
  it('hands-off flow only: everything above Q_hof may be taken, nothing below it', () => {
    // common practice, no source: a hands-off flow is never abstracted
    const r = handsOffOnly(1)
    expect(takeAllowed(r, 0.6)).toBe(0)
    expect(takeAllowed(r, 1)).toBe(0)
    expect(takeAllowed(r, 5)).toBe(4)
    expect(leftInRiver(r, 5)).toBe(1)
    expect(leftInRiver(r, 0.6)).toBe(0.6)
  })

  it('a pass flow always passes, on top of the hands-off flow', () => {
    // common practice, no source: a fish or eel pass is fed before the scheme takes anything
    const r = rules({ passFlow_m3s: 0.25 })
    expect(takeAllowed(r, 1.2)).toBe(0)
    expect(takeAllowed(r, 5)).toBeCloseTo(5 - 1.25, 12)
    expect(leftInRiver(r, 5)).toBeCloseTo(1.25, 12)
  })

  it('a fixed maximum take caps the take', () => {
    // common practice, no source: a licence names the most that may be taken
    const r = rules({ maxTake: { kind: 'fixed', flow_m3s: 2 } })
    expect(takeAllowed(r, 2.5)).toBeCloseTo(1.5, 12)
    expect(takeAllowed(r, 3)).toBeCloseTo(2, 12)
    expect(takeAllowed(r, 10)).toBeCloseTo(2, 12)
    expect(leftInRiver(r, 10)).toBeCloseTo(8, 12)
  })

  it('a maximum take as a multiple of the mean flow: 1.3 × 4 m³/s = 5.2 m³/s', () => {
    // gov.uk 2024 hydropower abstraction guidance, Appendix 1, in shape (value from memory): Q_max about 1.3 × mean flow
    const r = rules({ maxTake: { kind: 'mean-multiple', multiple: 1.3 } })
    expect(r.maxTake_m3s).toBeCloseTo(5.2, 12)
    expect(takeAllowed(r, 20)).toBeCloseTo(5.2, 12)
    expect(takeAllowed(r, 4)).toBeCloseTo(3, 12)
  })

  it('a percentage split: 50 % of the flow above Q_hof + Q_pass stays in the river', () => {
    // common practice, no source: a split of the flow above the hands-off flow
    const r = rules({ keptShare_pct: 50, passFlow_m3s: 0.5 })
    // Q = 5.5: above Q_hof + Q_pass = 1.5 is 4; half is taken
    expect(takeAllowed(r, 5.5)).toBeCloseTo(2, 12)
    expect(leftInRiver(r, 5.5)).toBeCloseTo(3.5, 12)
    expect(riverForTake(r, 2)).toBeCloseTo(5.5, 12)
  })

  it('all rules together: the split first, then the cap', () => {
    // common practice, no source
    const r = rules({ keptShare_pct: 50, maxTake: { kind: 'fixed', flow_m3s: 3 }, passFlow_m3s: 0.5 })
    expect(takeAllowed(r, 5.5)).toBeCloseTo(2, 12)
    expect(takeAllowed(r, 11.5)).toBeCloseTo(3, 12)
    expect(riverForTake(r, 10)).toBeCloseTo(1.5 + 6, 12)
  })

  it('everything kept: nothing is taken', () => {
    const r = rules({ keptShare_pct: 100 })
    expect(takeAllowed(r, 50)).toBe(0)
  })

  it('refuses a kept share outside 0–100 % naming the field', () => {
    expect(() => resolveFlowRules({ ...NO_FLOW_RULES, keptShare_pct: 120 }, 1, flat)).toThrow(/must be at most 100/)
  })
})

describe('flow rules: the defaults change nothing', () => {
  it('an input without flow rules and one with the rules at their defaults give identical figures', () => {
    const plain = parse(draft())
    const withDefaults = AssessInputSchema.parse({ ...draft(), flowRules: { preset: 'none', maxTake: { kind: 'none' }, keptShare_pct: 0, passFlow_m3s: 0 } })
    const a = assess(plain)
    const b = assess(withDefaults)
    expect(b).toEqual(a)
    // and they equal a scheme built with the hands-off flow alone, flow by flow
    const basis = runBasis(plain)
    const s0 = buildScheme(plain, basis.reserved, basis.annual)
    const s1 = buildScheme(plain, basis.reserved, basis.annual, basis.rules)
    for (const q of [0, 0.3, 0.9, 1.5, 4, 14, 40]) {
      expect(flowState(s1, q, basis.annual)).toEqual(flowState(s0, q, basis.annual))
    }
  })
})

const rulesArb: fc.Arbitrary<FlowRulesSetting> = fc.record({
  maxTake: fc.oneof(
    fc.constant({ kind: 'none' as const }),
    num(0, 10).map((flow_m3s) => ({ kind: 'fixed' as const, flow_m3s })),
    num(0, 3).map((multiple) => ({ kind: 'mean-multiple' as const, multiple })),
  ),
  keptShare_pct: fc.oneof(fc.constant(0), num(0, 100)),
  passFlow_m3s: fc.oneof(fc.constant(0), num(0, 2)),
}).map((r) => ({ preset: 'custom' as const, ...r }))

const withRules = (input: AssessInput, r: FlowRulesSetting): AssessInput => ({ ...input, flowRules: r })

describe('flow rules: properties over random sites and rules', () => {
  it('the flow left is never below min(river, hands-off + pass), the take never above Q_max, and the depleted curve never above the natural one', () => {
    fc.assert(fc.property(operatingInputArb, rulesArb, fc.array(num(0, 80), { minLength: 1, maxLength: 12 }), (base, r, flows) => {
      const input = withRules(base, r)
      const b = runBasis(input)
      const s = buildScheme(input, b.reserved, b.annual, b.rules)
      const floor = b.rules.handsOff_m3s + b.rules.pass_m3s
      for (const q of flows) {
        const f = flowState(s, q, b.annual)
        const over = f.reserved_m3s + f.spill_m3s
        const taken = f.unitsRunning * f.unitFlow_m3s
        expect(Number.isNaN(over) || Number.isNaN(taken)).toBe(false)
        // the rules, ENGINE.md §13
        expect(over).toBeGreaterThanOrEqual(Math.min(q, floor) * (1 - 1e-12) - 1e-12)
        expect(taken).toBeLessThanOrEqual(b.rules.maxTake_m3s * (1 + 1e-12) + 1e-12)
        expect(taken).toBeLessThanOrEqual(takeAllowed(b.rules, q) * (1 + 1e-12) + 1e-12)
      }
      const reach = depletedReach(r, b.rules, yearStates(s, b.monthCond, b.curves))
      for (const row of reach.curve) {
        expect(Number.isFinite(row.natural_m3s) && Number.isFinite(row.withScheme_m3s)).toBe(true)
        expect(row.withScheme_m3s).toBeLessThanOrEqual(row.natural_m3s)
        expect(row.withScheme_m3s).toBeGreaterThanOrEqual(0)
      }
      expect(reach.annualHandsOffOnly_d).toBeGreaterThanOrEqual(0)
      expect(reach.annualHandsOffOnly_d).toBeLessThanOrEqual(365 + 1e-9)
    }), { numRuns: 60 })
  }, 120_000)
})

describe('depleted reach in an assessment', () => {
  it('gives both curves at the fixed exceedances, falling with exceedance, and counts days at the hands-off flow only', () => {
    const r = assess(parse(draft())).depletedReach!
    expect(r.curve.map((c) => c.exceedance)).toEqual([1, 5, 10, 20, 30, 40, 50, 60, 70, 80, 90, 95, 99])
    for (let i = 1; i < r.curve.length; i++) {
      expect(r.curve[i]!.natural_m3s).toBeLessThanOrEqual(r.curve[i - 1]!.natural_m3s)
      expect(r.curve[i]!.withScheme_m3s).toBeLessThanOrEqual(r.curve[i - 1]!.withScheme_m3s)
    }
    expect(r.preset).toBe('none')
    expect(r.maxTake_m3s).toBeNull()
    // two units of 0.6 m throats take a few m³/s: at middling flows they hold the river at Q95
    expect(r.annualHandsOffOnly_d).toBeGreaterThan(0)
  })

  it('keeping half the flow above the hands-off flow lifts the depleted curve and ends the days at the hands-off flow only', () => {
    const none = assess(parse(draft())).depletedReach!
    const half = assess(parse({ ...draft(), flowRules: { preset: 'custom', keptShare_pct: 50 } })).depletedReach!
    expect(half.annualHandsOffOnly_d).toBe(0)
    half.curve.forEach((row, i) => expect(row.withScheme_m3s).toBeGreaterThanOrEqual(none.curve[i]!.withScheme_m3s - 1e-9))
  })

  it('the conventional baseline takes no more than the flow rules allow', () => {
    const capped = parse({ ...draft(), flowRules: { preset: 'custom', maxTake: { kind: 'fixed', flow_m3s: 0.5 } } })
    const free = assess(parse(draft())).baseline!
    const b = assess(capped).baseline!
    expect(b.designFlow_m3s).toBeLessThanOrEqual(0.5 + 1e-12)
    expect(b.annualEnergy_MWh).toBeLessThan(free.annualEnergy_MWh)
  })

  it('names the flow rules when they keep the units from ever starting', () => {
    const r = assess(parse({ ...draft(), flowRules: { preset: 'custom', maxTake: { kind: 'fixed', flow_m3s: 0.01 } } }))
    const never = r.summary.flags.find((f) => f.id === 'never-runs')!
    expect(never.raised).toBe(true)
    expect(never.reason).toMatch(/flow rules/)
    expect(never.reason).toMatch(/maximum take \(0\.010 m³\/s\)/)
  })
})

describe('flow rules reach every run of the scheme', () => {
  // A maximum take of 0.8 m³/s: well below the two units' capacity, so every run must make less energy.
  const free = parse(draft())
  const capped = parse({ ...draft(), flowRules: { preset: 'custom', maxTake: { kind: 'fixed', flow_m3s: 0.8 } } })

  it('the Monte Carlo, the sweep and the sensitivity run under the same rules', () => {
    const mcFree = monteCarlo(free, 8, 7)!
    const mcCapped = monteCarlo(capped, 8, 7)!
    expect(mcCapped.energy_MWh.p50!).toBeLessThan(mcFree.energy_MWh.p50!)
    const grid = { throatDiameters_m: [0.6], units: [2], throatDepths_m: [1.5] }
    expect(sweep(capped, grid).points[0]!.annualEnergy_MWh).toBeCloseTo(assess(capped).summary.annualEnergy_MWh, 9)
    expect(sweep(capped, grid).points[0]!.annualEnergy_MWh).toBeLessThan(sweep(free, grid).points[0]!.annualEnergy_MWh)
    expect(sensitivity(capped).base.annualEnergy_MWh).toBeCloseTo(assess(capped).summary.annualEnergy_MWh, 9)
  }, 60_000)
})
