// Sites without the weir's hydraulics (`site.hydraulics` null, the default) must give the very figures the engine
// gave before the hydraulics came. beforeWeirHydraulics.json holds the results of the engine as it stood before
// (commit "Heads from the weir's hydraulics: …", whose engine had no hydraulics wired in) for the two inputs
// below: a curve site with a head table and Avery & Novak, and a two-year record run river first with a Monte Carlo.
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { assessWithUncertainty } from '../../../shared/engine/assess'
import { AssessInputSchema, type AssessInputDraft } from '../../../shared/schemas/assess'

const TEMPS = [4, 5, 7, 9, 12, 15, 17, 17, 14, 11, 7, 5]
const UPSTREAM_O2 = [12, 11.8, 11.2, 10.6, 9.8, 8.8, 8.0, 7.9, 8.6, 9.6, 10.8, 11.6]
function draft(): AssessInputDraft {
  return {
    site: { altitude_m: 120, grossHead_m: 2, months: TEMPS.map((t, i) => ({ temperature_C: t, upstreamOxygen_mgL: UPSTREAM_O2[i] ?? 9 })) },
    hydrology: { kind: 'fdc', points: [{ exceedance: 1, flow: 40 }, { exceedance: 10, flow: 14 }, { exceedance: 50, flow: 4 }, { exceedance: 95, flow: 0.9 }, { exceedance: 99, flow: 0.5 }] },
    option: { units: 2, throatDiameter_m: 0.6, outletDiameter_m: 1.2, throatDepth_m: 1.5, air: { pipeDiameter_m: 0.5, pipeLength_m: 10 } },
  }
}
function days(year: number, flowOfMonth: (month: number) => number | null): Array<{ date: string, flow: number | null }> {
  const out: Array<{ date: string, flow: number | null }> = []
  for (let i = 0; i < 365; i++) {
    const d = new Date(Date.UTC(year, 0, 1) + i * 86400000)
    out.push({ date: d.toISOString().slice(0, 10), flow: flowOfMonth(d.getUTCMonth() + 1) })
  }
  return out
}
function inputs() {
  const a: AssessInputDraft = draft()
  a.site = { ...a.site, headTable: [{ flow_m3s: 2, head_m: 2.1 }, { flow_m3s: 30, head_m: 1.4 }], crestLength_m: 14, weirAeration: { model: 'avery-novak' } }
  const b: AssessInputDraft = draft()
  b.hydrology = { kind: 'record', days: [...days(2001, (m) => (m > 5 && m < 10 ? 1.2 : 6 + m)), ...days(2002, (m) => (m === 7 ? null : 3 + m / 2))] }
  b.option = { ...b.option, operation: { mode: 'river-first' } }
  b.settings = { monteCarloDraws: 20, monteCarloSeed: 7 }
  return [AssessInputSchema.parse(a), AssessInputSchema.parse(b)]
}

const before = JSON.parse(readFileSync(new URL('./beforeWeirHydraulics.json', import.meta.url), 'utf8')) as unknown[]

describe('a site without the weir hydraulics', () => {
  it('gives the figures the engine gave before them, to the last bit (only the per-flow table\'s new columns added)', () => {
    inputs().forEach((input, k) => {
      expect(input.site.hydraulics).toBeNull()
      const now = JSON.parse(JSON.stringify(assessWithUncertainty(input))) as { perFlow: Record<string, unknown>[] }
      for (const row of now.perFlow) {
        // the new columns: the option's own throat depth, no tail, the weir drowned or not as before
        expect(row.throatDepth_m).toBe(input.option.throatDepth_m)
        expect(row.tailDepth_m).toBeNull()
        delete row.throatDepth_m
        delete row.tailDepth_m
        delete row.weirDrowned
      }
      // The flow rules, which came after the file was written, add the depleted reach and reword the
      // baseline's basis and design-flow basis (their own test holds their defaults to the hands-off flow alone): set both aside.
      const was = structuredClone(before[k]) as { baseline?: { basis?: string, designFlowBasis?: string } }
      const is = now as unknown as { baseline?: { basis?: string, designFlowBasis?: string }, depletedReach?: unknown }
      expect(is.depletedReach).toBeDefined()
      delete is.depletedReach
      if (was.baseline && is.baseline) {
        expect(is.baseline.basis).toContain('what the flow rules allow above the hands-off flow')
        expect(is.baseline.designFlowBasis).toContain('what the flow rules allow')
        delete was.baseline.basis
        delete is.baseline.basis
        delete was.baseline.designFlowBasis
        delete is.baseline.designFlowBasis
      }
      // the engine's version moved on when the two landed together
      ;(was as { engineVersion?: string }).engineVersion = (now as unknown as { engineVersion: string }).engineVersion
      // identity with the earlier engine, no outside source
      expect(now).toStrictEqual(was)
    })
  }, 60_000)
})
