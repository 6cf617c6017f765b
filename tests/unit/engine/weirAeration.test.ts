import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { EngineInputError } from '../../../shared/engine/errors'
import { downstreamFromDeficitRatio, WEIR_SHAPE_B, weirDeficitRatio } from '../../../shared/engine/oxygen'
import {
  averyNovakDeficitRatio, averyNovakDeficitRatio15, averyNovakJet, correctDeficitRatio, crestDischargePerMetre,
  crestFormOf, downstreamOxygenRange, drownedDeficitRatio, flowOverCrest, headOverCrest, isDrowned,
  MAX_DEFICIT_RATIO, measuredDeficitRatioAt, temperatureFactor, WEIR_AERATION_DEFAULTS, WEIR_DISCHARGE_COEFFICIENT,
  weirAerationModels, type WeirAerationModel,
} from '../../../shared/engine/weirAeration'

const within = (actual: number, expected: number, rel: number): void => {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * rel)
}

describe('Butts & Evans (1983) as the yardstick', () => {
  it('a = 1.8, b = 0.8, 15 °C: a 2.2 m fall closes 61 % of the deficit, a 1.2 m fall 49 %', () => {
    const m = (fall_m: number) => weirAerationModels({ fall_m, q_m2s: 0.2, tC: 15, a: 1.8, b: 0.8, drowned: false, chosen: 'butts-evans' })
    // Butts & Evans (1983): r = 1 + 0.38·1.8·0.8·2.2·(1 − 0.242)·1.69 = 2.5421 → 1 − 1/r = 0.6066
    expect(Math.abs(100 * (1 - 1 / m(2.2).chosen.r) - 61)).toBeLessThanOrEqual(1)
    // Butts & Evans (1983): r = 1 + 0.38·1.8·0.8·1.2·(1 − 0.132)·1.69 = 1.9632 → 1 − 1/r = 0.4906
    expect(Math.abs(100 * (1 - 1 / m(1.2).chosen.r) - 49)).toBeLessThanOrEqual(1)
    // the default model is the existing weir formula, unchanged
    expect(m(2.2).chosen.r).toBe(weirDeficitRatio(1.8, 0.8, 2.2, 15))
  })
})

describe('Avery & Novak (1978)', () => {
  it('worked by hand: q = 0.5 m²/s, H = 2.0 m, T = 20 °C', () => {
    // ν at 15 °C = μ/ρ = 1.13757e-3/999.10 = 1.13860e-6 m²/s (IAPWS R12-08 with Kell 1975)
    // Fr_j = (gH³/(2q²))^¼ = (9.80665·8/(2·0.25))^¼ = 156.9064^¼ = 3.53924          (Avery & Novak 1978)
    // Re = q/(2ν) = 0.5/(2·1.13860e-6) = 219 568                                     (Avery & Novak 1978)
    const jet = averyNovakJet(2, 0.5)
    within(jet.froude, 3.53924, 1e-5)
    within(jet.reynolds, 219568, 1e-4)
    // Fr_j^1.78 = 9.48550; Re^0.53 = 677.691; product 6428.23
    // r₁₅ = 1 + 0.627e-4·6428.23 = 1.40305                                           (Avery & Novak 1978, tap-water k, from memory)
    within(averyNovakDeficitRatio15(2, 0.5), 1.40305, 1e-3)
    // f(T) = 1 + 0.02103(T − 20) + 8.261e-5(T − 20)²: f(15) = 0.896915, f(20) = 1    (Gulliver, Thene & Rindels 1990, from memory)
    // ln r₂₀ = ln r₁₅·f(20)/f(15) = 0.338649·1.114933 = 0.377570 → r₂₀ = 1.45874
    within(averyNovakDeficitRatio(2, 0.5, 20), 1.45874, 1e-3)
  })

  it('less flow over the crest aerates better: r₁₅ − 1 ∝ q^−0.36 at a fixed fall', () => {
    // Avery & Novak (1978): Fr_j^1.78 ∝ q^−0.89 and Re^0.53 ∝ q^0.53, so r₁₅ − 1 ∝ q^−0.36
    const excess = (q: number) => averyNovakDeficitRatio15(1.5, q) - 1
    within(excess(0.05) / excess(0.5), 10 ** 0.36, 1e-9)
    let last = Infinity
    for (const q of [0.01, 0.05, 0.2, 0.5, 1, 3, 10]) {
      const r = averyNovakDeficitRatio(1.5, q, 12)
      expect(r).toBeLessThan(last)
      last = r
    }
  })

  it('more fall aerates more: r₁₅ − 1 ∝ H^1.335 at a fixed q', () => {
    // Avery & Novak (1978): Fr_j^1.78 ∝ (H³)^0.445
    within((averyNovakDeficitRatio15(3, 0.3) - 1) / (averyNovakDeficitRatio15(1.5, 0.3) - 1), 2 ** 1.335, 1e-9)
  })

  it('no water or no fall gives r = 1; a trickle gives a finite capped ratio; a flood gives r → 1', () => {
    expect(averyNovakDeficitRatio(2, 0, 15)).toBe(1)
    expect(averyNovakDeficitRatio(0, 0.5, 15)).toBe(1)
    expect(averyNovakJet(2, 0)).toMatchObject({ froude: 0, reynolds: 0 })
    expect(averyNovakDeficitRatio(2, Number.MIN_VALUE, 15)).toBe(MAX_DEFICIT_RATIO)
    expect(averyNovakDeficitRatio(2, 1e300, 15)).toBe(1)
    expect(averyNovakDeficitRatio(2, Infinity, 15)).toBe(1)
  })

  it('holds the tap-water k and says where it comes from', () => {
    // Avery & Novak (1978), k for tap water 0.627×10⁻⁴ (from memory)
    expect(WEIR_AERATION_DEFAULTS.averyNovakK.value).toBe(0.627e-4)
    expect(WEIR_AERATION_DEFAULTS.averyNovakK.source).toMatch(/from memory/)
  })
})

describe('temperature correction (Gulliver, Thene & Rindels 1990)', () => {
  it('f(20) = 1, f(15) = 0.896915, and 1/f(15) ≈ 1.115', () => {
    // Gulliver, Thene & Rindels (1990), f = 1 + 0.02103(T − 20) + 8.261e-5(T − 20)² (from memory)
    expect(temperatureFactor(20)).toBe(1)
    expect(temperatureFactor(15)).toBeCloseTo(0.89691525, 10)
    // Gulliver, Wilhelms & Parkhill (1998) put Avery & Novak at 20 °C with the exponent 1.115 (from memory)
    expect(1 / temperatureFactor(15)).toBeCloseTo(1.115, 3)
  })
  it('warmer water closes more of the deficit; no change at the same temperature; r = 1 stays 1', () => {
    expect(correctDeficitRatio(1.8, 12, 12)).toBeCloseTo(1.8, 12)
    expect(correctDeficitRatio(1.8, 12, 25)).toBeGreaterThan(1.8)
    expect(correctDeficitRatio(1.8, 12, 4)).toBeLessThan(1.8)
    expect(correctDeficitRatio(1, 5, 30)).toBe(1)
    // and back again
    expect(correctDeficitRatio(correctDeficitRatio(1.8, 12, 25), 25, 12)).toBeCloseTo(1.8, 12)
  })
  it('a measured ratio is carried to the river temperature the same way', () => {
    // ln r₂₀ = ln 1.8·f(20)/f(12) = 0.587787/0.837047 → r₂₀ = 2.01822     (Gulliver, Thene & Rindels 1990)
    within(measuredDeficitRatioAt({ r: 1.8, tC: 12 }, 20), 2.01822, 1e-5)
  })
  it('refuses a measured ratio below 1, naming the field', () => {
    expect(() => measuredDeficitRatioAt({ r: 0.8, tC: 12 }, 20)).toThrow(EngineInputError)
    try {
      measuredDeficitRatioAt({ r: 0.8, tC: 12 }, 20)
    }
    catch (e) {
      expect((e as EngineInputError).field).toBe('measured.r')
    }
  })
})

describe('a drowned weir aerates as a submerged sluice', () => {
  it('tail above crest is drowned', () => {
    // ENGINE.md §13 definition: the weir drowns when the tail rises past the crest
    expect(isDrowned(10.2, 10)).toBe(true)
    expect(isDrowned(10, 10)).toBe(false)
    expect(isDrowned(9.5, 10)).toBe(false)
  })
  it('every model gives Butts & Evans with b = 0.05, unless the measurement was taken drowned', () => {
    // Butts & Evans (1983): sluice gate with submerged discharge, b = 0.05
    const sluice = weirDeficitRatio(1.8, WEIR_SHAPE_B['sluice-gate-submerged'].value, 0.4, 14)
    expect(drownedDeficitRatio(1.8, 0.4, 14)).toBe(sluice)
    const base = { fall_m: 0.4, q_m2s: 0.8, tC: 14, a: 1.8, b: 0.8, drowned: true }
    for (const chosen of ['butts-evans', 'avery-novak', 'measured'] as const) {
      const m = weirAerationModels({ ...base, chosen, measured: { r: 1.6, tC: 14 } })
      expect(m.chosen.r).toBe(sluice)
      expect(m.chosen.note).toMatch(/submerged sluice/)
    }
    const measuredDrowned = weirAerationModels({ ...base, chosen: 'measured', measured: { r: 1.3, tC: 14, drowned: true } })
    expect(measuredDrowned.chosen.r).toBeCloseTo(1.3, 12)
  })
})

describe('the spread between models', () => {
  it('min and max bracket every model, and are attained', () => {
    const m = weirAerationModels({ fall_m: 2, q_m2s: 0.5, tC: 20, a: 1.8, b: 0.8, drowned: false, chosen: 'avery-novak', measured: { r: 1.8, tC: 12 } })
    expect(m.all.map(x => x.model)).toEqual(['butts-evans', 'avery-novak', 'measured'])
    for (const x of m.all) {
      expect(x.r).toBeGreaterThanOrEqual(m.rMin)
      expect(x.r).toBeLessThanOrEqual(m.rMax)
    }
    expect(m.all.some(x => x.r === m.rMin)).toBe(true)
    expect(m.all.some(x => x.r === m.rMax)).toBe(true)
    expect(m.chosen.model).toBe('avery-novak')
    // Avery & Novak 1.45874 (worked above) and Butts & Evans 2.63897 at 20 °C are the two ends
    within(m.rMin, 1.45874, 1e-3)
    within(m.rMax, weirDeficitRatio(1.8, 0.8, 2, 20), 1e-12)
  })
  it('downstream oxygen range from rMin and rMax (definition of r)', () => {
    const m = weirAerationModels({ fall_m: 2, q_m2s: 0.5, tC: 20, a: 1.8, b: 0.8, drowned: false, chosen: 'butts-evans' })
    const below = downstreamOxygenRange(9.09, 6, m)
    // C_d = C_s − (C_s − C_u)/r, rising with r below saturation
    expect(below.min_mgL).toBeCloseTo(downstreamFromDeficitRatio(9.09, 6, m.rMin), 12)
    expect(below.max_mgL).toBeCloseTo(downstreamFromDeficitRatio(9.09, 6, m.rMax), 12)
    expect(below.chosen_mgL).toBeCloseTo(below.max_mgL, 12)
    // a supersaturated river: more aeration brings it further down toward C_s
    const above = downstreamOxygenRange(9.09, 12, m)
    expect(above.min_mgL).toBeCloseTo(downstreamFromDeficitRatio(9.09, 12, m.rMax), 12)
    expect(above.max_mgL).toBeCloseTo(downstreamFromDeficitRatio(9.09, 12, m.rMin), 12)
  })
  it('choosing the measured model with no measurement is refused, naming the field', () => {
    expect(() => weirAerationModels({ fall_m: 2, q_m2s: 0.5, tC: 20, a: 1.8, b: 0.8, drowned: false, chosen: 'measured', measured: null }))
      .toThrow(expect.objectContaining({ field: 'measured' }))
  })
  it('property: r ≥ 1, finite, bracketed, and downstream oxygen between C_u and C_s, for any input', () => {
    const flow = fc.oneof(
      fc.constantFrom(0, Number.MIN_VALUE, 1e-12, 1e6, 1e300, Number.MAX_VALUE),
      fc.double({ min: 0, max: 50, noNaN: true }),
    )
    fc.assert(fc.property(
      fc.oneof(fc.constant(0), fc.double({ min: 0, max: 30, noNaN: true })),
      flow,
      fc.double({ min: 0, max: 40, noNaN: true }),
      fc.double({ min: 0.65, max: 1.8, noNaN: true }),
      fc.constantFrom(...Object.values(WEIR_SHAPE_B).map(x => x.value)),
      fc.boolean(),
      fc.option(fc.record({ r: fc.double({ min: 1, max: 50, noNaN: true }), tC: fc.double({ min: 0, max: 40, noNaN: true }), drowned: fc.boolean() }), { nil: null }),
      fc.constantFrom<WeirAerationModel>('butts-evans', 'avery-novak', 'measured'),
      fc.double({ min: 0, max: 20, noNaN: true }),
      (fall_m, q_m2s, tC, a, b, drowned, measured, chosen, Cu) => {
        const pick = chosen === 'measured' && !measured ? 'butts-evans' : chosen
        const m = weirAerationModels({ fall_m, q_m2s, tC, a, b, drowned, measured, chosen: pick })
        for (const x of [...m.all, m.chosen]) {
          expect(Number.isFinite(x.r)).toBe(true)
          expect(x.r).toBeGreaterThanOrEqual(1)
          expect(x.r).toBeGreaterThanOrEqual(m.rMin)
          expect(x.r).toBeLessThanOrEqual(m.rMax)
        }
        const Cs = 9
        const range = downstreamOxygenRange(Cs, Cu, m)
        for (const c of [range.min_mgL, range.chosen_mgL, range.max_mgL]) {
          expect(Number.isFinite(c)).toBe(true)
          expect(c).toBeGreaterThanOrEqual(Math.min(Cs, Cu) - 1e-9)
          expect(c).toBeLessThanOrEqual(Math.max(Cs, Cu) + 1e-9)
        }
        expect(range.min_mgL).toBeLessThanOrEqual(range.chosen_mgL + 1e-12)
        expect(range.chosen_mgL).toBeLessThanOrEqual(range.max_mgL + 1e-12)
      },
    ), { numRuns: 500, seed: 20260517 })
  })
})

describe('the crest: discharge per metre and the weir equation', () => {
  it('q = Q_over/L, and a crest of no length is refused naming the field', () => {
    expect(crestDischargePerMetre(12, 8)).toBe(1.5)
    expect(crestDischargePerMetre(-1e-17, 8)).toBe(0)
    expect(() => crestDischargePerMetre(12, 0)).toThrow(expect.objectContaining({ field: 'crestLength_m' }))
    expect(() => crestDischargePerMetre(12, -3)).toThrow(expect.objectContaining({ field: 'crestLength_m' }))
  })
  it('sharp-crested, worked by hand: L = 10 m, h = 0.3 m', () => {
    // Q = 0.62·(2/3)·√(2g)·L·h^1.5 = 0.413333·4.428691·10·0.164317 = 3.00786 m³/s   (sharp-crested weir form; C ≈ 0.62, common practice)
    const cd = WEIR_DISCHARGE_COEFFICIENT['sharp-crested'].value
    within(flowOverCrest(0.3, 10, cd), 3.00786, 1e-5)
    within(headOverCrest(3.00786, 10, cd), 0.3, 1e-5)
    expect(headOverCrest(0, 10, cd)).toBe(0)
    expect(() => headOverCrest(3, 10, 0)).toThrow(expect.objectContaining({ field: 'dischargeCoefficient' }))
  })
  it('broad-crested sits below its ideal critical-depth value (2/3)^1.5/√2 = 0.385', () => {
    // critical flow on a broad crest: q = √g·(2h/3)^1.5 = (2/3)^1.5/√2 · √(2g)·h^1.5   (open-channel hydraulics, common practice)
    expect(WEIR_DISCHARGE_COEFFICIENT['broad-crested'].value).toBeLessThan((2 / 3) ** 1.5 / Math.SQRT2)
    expect(WEIR_DISCHARGE_COEFFICIENT['broad-crested'].value).toBeGreaterThan(0.3)
  })
  it('every Butts & Evans shape but the sluice gate has a crest form', () => {
    expect(crestFormOf('sharp-crested-vertical-face')).toBe('sharp-crested')
    expect(crestFormOf('flat-broad-crested-regular-step')).toBe('broad-crested')
    expect(crestFormOf('round-broad-crested-curved-face')).toBe('round-crested')
    expect(crestFormOf('sluice-gate-submerged')).toBeNull()
  })
})
