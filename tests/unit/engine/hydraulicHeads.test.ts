// The scheme with heads from the weir's hydraulics: the per-flow figures follow the pool and tail at each flow.
import { describe, expect, it } from 'vitest'
import { assess } from '../../../shared/engine/assess'
import { flowAtExceedance, fdcFromPoints } from '../../../shared/engine/hydrology'
import { LEVERS } from '../../../shared/engine/levers'
import { hydraulicState, resolveWeirHydraulics, throatDepthAt } from '../../../shared/engine/weirHydraulics'
import type { AssessInput } from '../../../shared/schemas/assess'
import { draft, parse } from './fixtures'

function withHydraulics(): AssessInput {
  const d = draft()
  d.site = {
    ...d.site, crestLength_m: 14, weirShape: 'sharp-crested-vertical-face',
    // a head table that the hydraulics must override
    headTable: [{ flow_m3s: 0, head_m: 9 }, { flow_m3s: 100, head_m: 9 }],
    hydraulics: { crestHeight_m: 1.6, tail: { kind: 'manning', channelWidth_m: 12, bedSlope: 0.0015, roughnessN: 0.035 } },
  }
  return parse(d)
}

describe('an assessment with heads from the weir hydraulics', () => {
  const input = withHydraulics()
  const r = assess(input)
  const h = resolveWeirHydraulics(input.site.hydraulics!, 14, 'sharp-crested-vertical-face')
  const q50 = flowAtExceedance(fdcFromPoints(input.hydrology.kind === 'fdc' ? input.hydrology.points : []), 50)

  it('takes each flow\'s gross head, tail and drowning from the pool and tail, not the head table', () => {
    for (const row of r.perFlow) {
      const st = hydraulicState(h, row.riverFlow_m3s)
      // the same formulas (weirHydraulics.ts) composed directly, no outside source
      expect(row.grossHead_m).toBeCloseTo(st.grossHead_m, 12)
      expect(row.tailDepth_m).toBeCloseTo(st.tailDepth_m, 12)
      expect(row.weirDrowned).toBe(st.drowned)
      expect(row.grossHead_m).toBeLessThan(9)
    }
    const heads = r.perFlow.map((p) => p.grossHead_m)
    expect(Math.max(...heads) - Math.min(...heads)).toBeGreaterThan(0.3)
    // the flood at 1 % exceedance (40 m³/s) puts the tail above the 1.6 m crest; the low flows do not
    expect(r.perFlow[0]!.weirDrowned).toBe(true)
    expect(r.perFlow.at(-1)!.weirDrowned).toBe(false)
  })

  it('reads the option\'s throat depth at the median flow and moves the throat with the tail', () => {
    const medianTail = hydraulicState(h, q50).tailDepth_m
    for (const row of r.perFlow) {
      expect(row.throatDepth_m).toBeCloseTo(throatDepthAt(input.option.throatDepth_m, row.tailDepth_m!, medianTail), 12)
    }
    const at50 = r.perFlow.find((p) => p.exceedance === 50)!
    expect(at50.throatDepth_m).toBeCloseTo(input.option.throatDepth_m, 12)
    // a deeper throat in a flood: less suction (ENGINE.md §2: p_t/ρg = H_w + d_t − (1 + k_in)·V_t²/2g)
    expect(r.perFlow[0]!.throatDepth_m!).toBeGreaterThan(at50.throatDepth_m!)
  })

  it('the gross-head lever raises the crest by the change in head, so the head at every free flow rises by it', () => {
    const up = LEVERS.grossHead.set(input, input.site.grossHead_m + 0.3)
    expect(up.site.hydraulics!.crestHeight_m).toBeCloseTo(1.9, 12)
    const r2 = assess(up, { compareModes: false })
    r2.perFlow.forEach((row, i) => {
      const was = r.perFlow[i]!
      if (!hydraulicState(h, row.riverFlow_m3s).drowned) expect(row.grossHead_m - was.grossHead_m).toBeCloseTo(0.3, 9)
    })
  })
})
