import { describe, expect, it } from 'vitest'
import { AssessInputSchema } from '../../../shared/schemas/assess'
import { DEFAULTS } from '../../../shared/engine/defaults'
import { draft } from './fixtures'

describe('AssessInputSchema', () => {
  it('fills every default from defaults.ts', () => {
    const p = AssessInputSchema.parse(draft())
    expect(p.option.inletLoss).toBe(DEFAULTS.inletLoss.value)
    expect(p.option.air.jetPumpEfficiency).toBe(DEFAULTS.jetPumpEfficiency.value)
    expect(p.option.turbine.efficiency).toBe(DEFAULTS.turbineEfficiency.value)
    expect(p.option.turbine.ratedPower_kW).toBeNull()
    expect(p.settings.availability).toBe(DEFAULTS.availability.value)
    expect(p.settings.minCavitationMargin_m).toBe(2.5)
    expect(p.settings.tdgLimit).toBe(1.1)
    expect(p.reservedFlow).toEqual({ kind: 'percentile', exceedance: 95 })
  })
  it('every default carries a unit and an origin', () => {
    for (const [k, v] of Object.entries(DEFAULTS)) {
      expect(v.unit.length, k).toBeGreaterThan(0)
      expect(v.source, k).toMatch(/ISO|ASCE|Butts|common practice|from memory|illustrative|judgement|WAC|\b(19|20)\d{2}\b/)
    }
  })
  const bad = (mutate: (d: ReturnType<typeof draft>) => void): boolean => {
    const d = draft()
    mutate(d)
    return AssessInputSchema.safeParse(d).success
  }
  it('rejects non-positive diameters, efficiencies outside 0–1 and non-finite numbers', () => {
    expect(bad(() => {})).toBe(true)
    expect(bad((d) => { d.option.throatDiameter_m = 0 })).toBe(false)
    expect(bad((d) => { d.option.throatDiameter_m = -0.5 })).toBe(false)
    expect(bad((d) => { d.option.air.pipeDiameter_m = 0 })).toBe(false)
    expect(bad((d) => { d.option.air.jetPumpEfficiency = 1.2 })).toBe(false)
    expect(bad((d) => { d.option.turbine = { efficiency: -0.1 } })).toBe(false)
    expect(bad((d) => { d.site.grossHead_m = Number.POSITIVE_INFINITY })).toBe(false)
    expect(bad((d) => { d.site.grossHead_m = Number.NaN })).toBe(false)
    expect(bad((d) => { d.option.units = 1.5 })).toBe(false)
  })
  it('rejects an outlet narrower than the throat, a short month list and an unsorted FDC', () => {
    expect(bad((d) => { d.option.outletDiameter_m = 0.3 })).toBe(false)
    expect(bad((d) => { d.site.months = d.site.months.slice(0, 11) })).toBe(false)
    const r = AssessInputSchema.safeParse({ ...draft(), hydrology: { kind: 'fdc', points: [{ exceedance: 10, flow: 5 }, { exceedance: 5, flow: 6 }, { exceedance: 50, flow: 2 }] } })
    expect(r.success).toBe(false)
    if (!r.success) expect(r.error.issues[0]?.path).toEqual(['hydrology', 'points', 1, 'exceedance'])
  })
})
