import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { EngineInputError } from '../../../shared/engine/errors'
import { WEIR_DISCHARGE_COEFFICIENT } from '../../../shared/engine/weirAeration'
import {
  crestHead, drowningFlow, hydraulicState, manningDepth, manningFlow, resolveWeirHydraulics, tableDepth, tailDepth, throatDepthAt,
  type WeirHydraulicsInput,
} from '../../../shared/engine/weirHydraulics'

const within = (actual: number, expected: number, rel: number): void => {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * rel)
}

const manningInput = (over: Partial<WeirHydraulicsInput> = {}): WeirHydraulicsInput => ({
  crestHeight_m: 1.2, dischargeCoefficient: null, tail: { kind: 'manning', channelWidth_m: 20, bedSlope: 0.002, roughnessN: 0.035 }, ...over,
})

describe('Manning normal depth in a rectangular channel', () => {
  it('B = 10 m, S = 1/300, n = 0.015: a normal depth of 3 m carries 175.58 m³/s, and 175.58 m³/s flows 3 m deep', () => {
    // GATE civil engineering question as worked on edurev.in ("A 10 m wide rectangular channel has a bed slope of
    // 3.33 × 10⁻³ and Manning's coefficient 0.015 …"): A = 30 m², P = 16 m, R = 1.875 m, Q = 175.58 m³/s
    within(manningFlow(3, 10, 1 / 300, 0.015), 175.58, 1e-4)
    within(manningDepth(175.58, 10, 1 / 300, 0.015), 3, 1e-4)
  })

  it('the rivr package\'s documented example: B = 100, S = 0.001, n = 0.045 (US units, 1.486), Q = 250 → y = 1.711301', () => {
    // R package rivr, normal_depth(0.001, 0.045, 250, 3, 1.486, 100, 0) prints 1.711301 (its help page). The same
    // equation in our SI form takes n/1.486 as the coefficient (lengths in feet, flows in ft³/s throughout).
    within(manningDepth(250, 100, 0.001, 0.045 / 1.486), 1.711301, 1e-6)
  })

  it('satisfies the equation it solves to 1e-9 relative, rises with flow, never NaN', () => {
    fc.assert(fc.property(
      fc.double({ min: 1e-4, max: 5000, noNaN: true }), fc.double({ min: 0.5, max: 500, noNaN: true }),
      fc.double({ min: 1e-5, max: 0.1, noNaN: true }), fc.double({ min: 0.01, max: 0.2, noNaN: true }),
      fc.double({ min: 1.0001, max: 10, noNaN: true }),
      (Q, B, S, n, k) => {
        const y = manningDepth(Q, B, S, n)
        expect(Number.isFinite(y)).toBe(true)
        expect(Math.abs(manningFlow(y, B, S, n) - Q)).toBeLessThanOrEqual(1e-9 * Q)
        expect(manningDepth(Q * k, B, S, n)).toBeGreaterThan(y)
      },
    ))
    expect(manningDepth(0, 10, 0.001, 0.03)).toBe(0)
  })
})

describe('the weir equation for the head pool', () => {
  it('sharp crest, L = 10 m, h = 0.5 m: C_d·L·√(2g)·h^1.5 = 6.4719 m³/s, within 1 % of Francis\'s 1.84·L·h^1.5 = 6.5054', () => {
    // hand-worked: 0.62·(2/3)·10·√(2·9.80665)·0.5^1.5 = 0.41333·10·4.42869·0.353553 = 6.4719 m³/s
    // Francis formula in SI units, suppressed weir, Q = 1.84·L·h^1.5 (textbook form, e.g. curioustab's hydraulics question bank)
    const h = resolveWeirHydraulics(manningInput(), 10, 'sharp-crested-vertical-face')
    expect(h.dischargeCoefficient).toBe(WEIR_DISCHARGE_COEFFICIENT['sharp-crested'])
    within(crestHead(h, 6.4719), 0.5, 1e-4)
    within(crestHead(h, 1.84 * 10 * 0.5 ** 1.5), 0.5, 0.01)
  })

  it('broad crest, L = 10 m, h = 0.5 m: Q = 0.35·B·√(2g)·H^1.5 = 5.4802 m³/s', () => {
    // the broad-crested (flat-topped) weir formula Q = 0.35·B·(2g)^0.5·H^1.5 as given in aquatext's weir-flow calculations
    const h = resolveWeirHydraulics(manningInput(), 10, 'flat-broad-crested-regular-step')
    within(crestHead(h, 5.4802), 0.5, 1e-4)
  })

  it('takes a given coefficient over the crest form\'s, and says so', () => {
    const h = resolveWeirHydraulics(manningInput({ dischargeCoefficient: 0.4 }), 10, 'sharp-crested-vertical-face')
    expect(h.dischargeCoefficient).toMatchObject({ value: 0.4, source: 'given with the site' })
  })
})

describe('heads, drowning and the throat at each flow', () => {
  const h = resolveWeirHydraulics(manningInput(), 20, 'sharp-crested-vertical-face')

  it('worked by hand at 10 m³/s: pool 1.2 + 0.42098 m, tail by Manning, free', () => {
    // head over crest (10/(0.41333·20·4.42869))^(2/3) = 0.27310^(2/3) = 0.42098 m      (weir equation)
    // tail: 20·y·(20y/(20 + 2y))^(2/3)·√0.002/0.035 = 10 at y = 0.58257 m (bisection by hand) (Manning)
    // gross head 1.2 + 0.42098 − 0.58257 = 1.03841 m
    const st = hydraulicState(h, 10)
    within(st.poolLevel_m - 1.2, 0.42098, 1e-4)
    within(st.tailDepth_m, 0.58257, 1e-4)
    within(st.grossHead_m, 1.03841, 1e-4)
    expect(st.drowned).toBe(false)
  })

  it('drowns when the tail rises past the crest: above Manning\'s flow at the crest height', () => {
    const q = drowningFlow(h) as number
    within(q, manningFlow(1.2, 20, 0.002, 0.035), 1e-12)
    expect(hydraulicState(h, q * 0.99).drowned).toBe(false)
    expect(hydraulicState(h, q * 1.01).drowned).toBe(true)
  })

  it('the throat sits deeper as the tail rises and shallower as it falls, never above the surface', () => {
    expect(throatDepthAt(1, 0.9, 0.6)).toBeCloseTo(1.3, 12)
    expect(throatDepthAt(1, 0.3, 0.6)).toBeCloseTo(0.7, 12)
    expect(throatDepthAt(0.2, 0, 0.6)).toBe(0)
  })

  it('gross head is never negative and never NaN; the tail rises with flow', () => {
    fc.assert(fc.property(
      fc.double({ min: 0, max: 20, noNaN: true }), fc.double({ min: 0.5, max: 300, noNaN: true }),
      fc.double({ min: 0, max: 1e5, noNaN: true }), fc.double({ min: 1.001, max: 5, noNaN: true }),
      (crest, width, Q, k) => {
        const hh = resolveWeirHydraulics(manningInput({ crestHeight_m: crest, tail: { kind: 'manning', channelWidth_m: width, bedSlope: 0.001, roughnessN: 0.04 } }), width, 'round-broad-crested-curved-face')
        const st = hydraulicState(hh, Q)
        expect(st.grossHead_m).toBeGreaterThanOrEqual(0)
        for (const x of Object.values(st)) expect(Number.isNaN(x)).toBe(false)
        if (Q > 1e-6) expect(tailDepth(hh, Q * k)).toBeGreaterThan(tailDepth(hh, Q))
      },
    ))
  })
})

describe('a stage–discharge table for the tail', () => {
  const rows = [{ flow_m3s: 2, depth_m: 0.4 }, { flow_m3s: 10, depth_m: 1.0 }, { flow_m3s: 50, depth_m: 2.2 }]

  it('interpolates linearly, holds below the first row, and carries the last slope on above the last', () => {
    expect(tableDepth(rows, 6)).toBeCloseTo(0.7, 12)
    expect(tableDepth(rows, 0.5)).toBe(0.4)
    expect(tableDepth(rows, 90)).toBeCloseTo(2.2 + (1.2 / 40) * 40, 12)
  })

  it('is sorted when resolved, and drowns where it reaches the crest', () => {
    const h = resolveWeirHydraulics({ crestHeight_m: 1.6, dischargeCoefficient: 0.45, tail: { kind: 'table', rows: [...rows].reverse() } }, 15, 'sluice-gate-submerged')
    expect(tailDepth(h, 6)).toBeCloseTo(0.7, 12)
    expect(drowningFlow(h)).toBeCloseTo(10 + (0.6 / 1.2) * 40, 9)
  })

  it('refuses what cannot be used, naming the field', () => {
    const bad = (f: () => unknown, field: string) => {
      try { f(); expect.unreachable() }
      catch (e) { expect(e).toBeInstanceOf(EngineInputError); expect((e as EngineInputError).field).toBe(field) }
    }
    bad(() => resolveWeirHydraulics(manningInput(), undefined, 'sharp-crested-vertical-face'), 'site.crestLength_m')
    bad(() => resolveWeirHydraulics(manningInput(), 10, 'sluice-gate-submerged'), 'site.hydraulics.dischargeCoefficient')
    bad(() => resolveWeirHydraulics({ ...manningInput(), tail: { kind: 'table', rows: [rows[0]!] } }, 10, 'sharp-crested-vertical-face'), 'site.hydraulics.tail.rows')
    bad(() => resolveWeirHydraulics({ ...manningInput(), tail: { kind: 'manning', channelWidth_m: 10, bedSlope: 0, roughnessN: 0.03 } }, 10, 'sharp-crested-vertical-face'), 'site.hydraulics.tail.bedSlope')
  })
})
