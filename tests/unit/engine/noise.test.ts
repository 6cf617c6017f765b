import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { EngineInputError } from '../../../shared/engine/errors'
import { DEFAULT_NOISE_LIMIT, combinedSoundPower, geometricDivergence, noiseCheck, soundPressureAt } from '../../../shared/engine/noise'

describe('sound at the nearest dwelling', () => {
  it('takes 11 dB at 1 m and 20 dB more per tenfold distance', () => {
    expect(geometricDivergence(1)).toBeCloseTo(11, 12) // ISO 9613-2:1996, 7.1, eq. 7: A_div = 20 lg(d/d0) + 11, d0 = 1 m
    expect(geometricDivergence(10)).toBeCloseTo(31, 12) // ISO 9613-2:1996, 7.1: 20·1 + 11
    expect(geometricDivergence(100)).toBeCloseTo(51, 12) // ISO 9613-2:1996, 7.1: 20·2 + 11
  })

  it('gives 49 dB(A) at 100 m from a 100 dB(A) source, worked by hand', () => {
    // ISO 9613-2:1996, 7.1: L_p = L_W − A_div = 100 − (20·lg 100 + 11) = 100 − 51 = 49
    expect(soundPressureAt(100, 100)).toBeCloseTo(49, 12)
    // 95 − (20·lg 250 + 11) = 95 − (47.959 + 11) = 36.041
    expect(soundPressureAt(95, 250)).toBeCloseTo(36.041, 3)
  })

  it('adds 10·lg n for n identical turbines', () => {
    expect(combinedSoundPower(90, 1)).toBe(90) // common practice, no source: incoherent sources add by energy
    expect(combinedSoundPower(90, 2)).toBeCloseTo(93.0103, 4) // 90 + 10·lg 2
    expect(combinedSoundPower(90, 10)).toBeCloseTo(100, 12) // 90 + 10·lg 10
  })

  it('flags a level above the limit and not one at it', () => {
    // two 95 dB(A) turbines at 150 m: 95 + 3.0103 − (20·lg 150 + 11 = 54.5218) = 43.4885 > 40
    const loud = noiseCheck({ soundPower_dBA: 95, units: 2, distance_m: 150, limit_dBA: DEFAULT_NOISE_LIMIT.value })
    expect(loud.atDwelling_dBA).toBeCloseTo(43.4885, 3)
    expect(loud.aboveLimit).toBe(true)
    expect(loud.margin_dB).toBeCloseTo(3.4885, 3)
    // exactly at the limit: 100 dB(A) at 100 m gives 49, against a limit of 49
    expect(noiseCheck({ soundPower_dBA: 100, units: 1, distance_m: 100, limit_dBA: 49 }).aboveLimit).toBe(false)
  })

  it('refuses a distance under 1 m and names the field', () => {
    expect(() => soundPressureAt(90, 0.5)).toThrow(EngineInputError)
    try {
      soundPressureAt(90, 0)
    } catch (e) {
      expect((e as EngineInputError).field).toBe('distance_m')
    }
  })

  it('falls with distance and never gives NaN (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 40, max: 140, noNaN: true }), fc.integer({ min: 1, max: 50 }), fc.double({ min: 1, max: 50_000, noNaN: true }), fc.double({ min: 1.01, max: 2, noNaN: true }), (lw, n, d, k) => {
        const near = noiseCheck({ soundPower_dBA: lw, units: n, distance_m: d, limit_dBA: 40 })
        const far = noiseCheck({ soundPower_dBA: lw, units: n, distance_m: d * k, limit_dBA: 40 })
        expect(Number.isFinite(near.atDwelling_dBA)).toBe(true)
        expect(far.atDwelling_dBA).toBeLessThan(near.atDwelling_dBA)
        // doubling the distance takes off 20·lg 2 ≈ 6.02 dB (ISO 9613-2:1996, 7.1)
        expect(noiseCheck({ soundPower_dBA: lw, units: n, distance_m: d * 2, limit_dBA: 40 }).atDwelling_dBA).toBeCloseTo(near.atDwelling_dBA - 20 * Math.log10(2), 9)
      }),
    )
  })
})
