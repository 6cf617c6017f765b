import { describe, expect, it } from 'vitest'
import { assess } from '../../../shared/engine/assess'
import { reservedFlowBasis, reviewBrief } from '../../../server/domain/review'
import { draft, parse } from '../engine/fixtures'

// The brief only re-reads a stored result: every figure must be the result's own.
const input = parse(draft())
const result = assess(input)
const brief = reviewBrief(result, input.reservedFlow, input.settings.acceptableOxygenLoss_mgL)

describe('reviewBrief', () => {
  it('carries the reserved flow with its basis, and checks it is kept at every flow of the table', () => {
    expect(brief.reservedFlow.flow_m3s).toBe(result.hydrology.reservedFlow_m3s)
    expect(brief.reservedFlow.setting).toEqual({ kind: 'percentile', exceedance: 95 })
    expect(brief.reservedFlow.basis).toMatch(/^Q95 of the flow-duration curve/)
    expect(brief.reservedFlow.keptAtEveryFlow).toBe(true)
  })

  it('notices a table that takes water from the reserve', () => {
    const robbed = structuredClone(result)
    const row = robbed.perFlow.find((r) => r.unitsRunning > 0)!
    row.unitFlow_m3s = row.riverFlow_m3s / row.unitsRunning // every drop through the units
    expect(reviewBrief(robbed, input.reservedFlow, input.settings.acceptableOxygenLoss_mgL).reservedFlow.keptAtEveryFlow).toBe(false)
  })

  it('judges the flow rules at every flow: the pass flow kept on top of the hands-off flow, and never more taken than the maximum', () => {
    // common practice, no source: what a regulator's flow rules require of every flow
    const ruled = parse({ ...draft(), flowRules: { preset: 'custom', maxTake: { kind: 'fixed', flow_m3s: 4.5 }, keptShare_pct: 0, passFlow_m3s: 0.2 } })
    const r = assess(ruled)
    expect(reviewBrief(r, ruled.reservedFlow, null).reservedFlow.keptAtEveryFlow).toBe(true)
    // units that take the pass flow too, down to the hands-off flow alone
    const intoPass = structuredClone(r)
    const hof = r.hydrology.reservedFlow_m3s
    const row = intoPass.perFlow.find((x) => x.unitsRunning > 0 && x.riverFlow_m3s - hof - 0.1 <= 4.5)!
    row.unitFlow_m3s = (row.riverFlow_m3s - hof - 0.1) / row.unitsRunning // half the pass flow taken, still under the maximum
    expect(reviewBrief(intoPass, ruled.reservedFlow, null).reservedFlow.keptAtEveryFlow).toBe(false)
    // units that take more than the maximum at a high flow
    const overCap = structuredClone(r)
    const high = overCap.perFlow.find((x) => x.unitsRunning > 0 && x.riverFlow_m3s > 10)!
    high.unitFlow_m3s = 5 / high.unitsRunning
    expect(reviewBrief(overCap, ruled.reservedFlow, null).reservedFlow.keptAtEveryFlow).toBe(false)
  })

  it('gives oxygen by month without and with the scheme against the target', () => {
    expect(brief.oxygenByMonth).toHaveLength(12)
    brief.oxygenByMonth.forEach((m, i) => {
      const r = result.months[i]!
      expect(m).toMatchObject({ month: i + 1, without_mgL: r.downstreamWithout_mgL, with_mgL: r.downstreamWith_mgL, target_mgL: r.target_mgL, netGain_mgL: r.netGain_mgL })
      expect(m.meetsTargetWith).toBe(r.downstreamWith_mgL >= r.target_mgL)
      expect(m.meetsTargetWithout).toBe(r.downstreamWithout_mgL >= r.target_mgL)
    })
  })

  it('gives the net gain at summer low flow and the gas flag with its reason', () => {
    expect(brief.netGainSummerLowFlow.value_mgL).toBe(result.summary.netOxygenGainSummerLowFlow_mgL)
    expect(brief.netGainSummerLowFlow.month).toBe(result.summary.summerLowFlow.month)
    const gas = result.summary.flags.find((f) => f.id === 'gas-supersaturation')!
    expect(brief.gasSupersaturation).toEqual({ raised: gas.raised, reason: gas.reason, maxUnitTotalDissolvedGas: result.summary.maxUnitTotalDissolvedGas })
    expect(brief.flags.map((f) => f.id)).toEqual(result.summary.flags.map((f) => f.id))
  })
})

describe('the brief\'s how-sure block', () => {
  it('carries the stored Monte Carlo\'s P90/P50 energy and chance of a net oxygen loss, with the run\'s acceptable loss', () => {
    const mc = { seed: 1, draws: 200, energy_MWh: { p90: 8.2, p50: 9.6, p10: 11 }, netLossProbability: 0.215 } as NonNullable<typeof result.uncertainty>
    const h = reviewBrief({ ...result, uncertainty: mc }, input.reservedFlow, input.settings.acceptableOxygenLoss_mgL).howSure
    expect(h).toEqual({
      stored: true,
      monteCarlo: { draws: mc.draws, energyP90_MWh: mc.energy_MWh.p90, energyP50_MWh: mc.energy_MWh.p50, netLossProbability: mc.netLossProbability, acceptableOxygenLoss_mgL: input.settings.acceptableOxygenLoss_mgL },
      record: null, // an entered curve holds no years
    })
  })

  it('says when no draws ran', () => {
    expect(brief.howSure).toEqual({ stored: true, monteCarlo: null, record: null })
  })

  it('says a result stored before these figures cannot show them (re-run it)', () => {
    const older = structuredClone(result) as Partial<typeof result>
    delete older.uncertainty
    delete older.years
    expect(reviewBrief(older as typeof result, input.reservedFlow, null).howSure).toEqual({ stored: false, monteCarlo: null, record: null })
  })
})

describe('reservedFlowBasis', () => {
  it('says where the value came from', () => {
    expect(reservedFlowBasis({ kind: 'fixed', flow: 1.1 }, 1.1, 'fdc')).toBe('fixed by the site at 1.10 m³/s')
    expect(reservedFlowBasis({ kind: 'percentile', exceedance: 90 }, 1.6, 'record')).toMatch(/^Q90 of the gauged daily record \(1\.60 m³\/s/)
  })
})
