import { describe, expect, it } from 'vitest'
import { AssessInputSchema } from '../../../shared/schemas/assess'
import { SiteInputSchema, type Month } from '../../../shared/schemas/site'
import { siteToEngine, type SiteForEngine } from '../../../shared/utils/siteEngineInput'

const FLOWS = [12, 11, 9, 7, 5, 3.5, 2.8, 2.6, 3.4, 6, 9, 11]

function site(months: Month[], weir: Partial<SiteForEngine['weir']> = {}): SiteForEngine {
  return {
    altitude_m: 100,
    weir: { grossHead_m: 2, crestWidth_m: 12, shape: 'sharp-crested-vertical-face', waterQuality: 'clean', ...weir },
    headTable: [],
    months,
    reservedFlow: { kind: 'percentile', exceedance: 95 },
    catchment: null,
    fdcPoints: [{ exceedance: 5, flow: 20 }, { exceedance: 50, flow: 5 }, { exceedance: 95, flow: 1 }],
    targetOxygen_mgL: 6,
  }
}
const plainMonths = (): Month[] => FLOWS.map(() => ({ waterTemp_C: 10, upstreamOxygen: { value: 10, unit: 'mg/L' } }))

describe('the site as the engine reads it', () => {
  it('passes the twelve month flows as the seasonal profile', () => {
    const months = plainMonths().map((m, i) => ({ ...m, flow_m3s: FLOWS[i] }))
    expect(siteToEngine(site(months), null).site.months.map((m) => m.flow_m3s)).toEqual(FLOWS)
  })

  it('passes no month flow at all while any month is blank', () => {
    const months = plainMonths().map((m, i) => ({ ...m, flow_m3s: i === 7 ? null : FLOWS[i] }))
    const out = siteToEngine(site(months), null).site.months
    expect(out.every((m) => !('flow_m3s' in m))).toBe(true)
    const stored = siteToEngine(site(plainMonths()), null).site.months
    expect(stored.every((m) => !('flow_m3s' in m))).toBe(true)
  })

  it('passes a month marked not measured as upstreamMeasured false, and reads older months as measured', () => {
    const months = plainMonths().map((m, i) => (i < 2 ? { ...m, upstreamOxygen: { ...m.upstreamOxygen, measured: false } } : m))
    const out = siteToEngine(site(months), null).site.months
    expect(out.map((m) => m.upstreamMeasured)).toEqual([false, false, true, true, true, true, true, true, true, true, true, true])
    // The stand-in value is still used.
    expect(out[0]!.upstreamOxygen_mgL).toBe(10)
  })

  it('passes the weir aeration model and the measured ratio with its conditions', () => {
    const weir = { aerationModel: 'measured' as const, measuredDeficitRatio: { r: 1.6, temperature_C: 14, drowned: true, note: 'June survey' } }
    const out = siteToEngine(site(plainMonths(), weir), null).site.weirAeration
    expect(out).toEqual({ model: 'measured', measured: { r: 1.6, tC: 14, drowned: true } })
    expect(siteToEngine(site(plainMonths(), { aerationModel: 'avery-novak', measuredDeficitRatio: null }), null).site.weirAeration).toEqual({ model: 'avery-novak', measured: null })
    expect(siteToEngine(site(plainMonths()), null).site.weirAeration).toEqual({ model: 'butts-evans', measured: null })
  })

  it('gives the engine an input it accepts, from a site the site schema accepts', () => {
    const input = SiteInputSchema.parse({
      name: 'Test weir', riverName: 'Test beck', location: { lat: 54, lng: -2 },
      weir: { grossHead_m: 2, crestWidth_m: 12, shape: 'sharp-crested-vertical-face', waterQuality: 'clean' },
      months: FLOWS.map((q, i) => ({ waterTemp_C: 10, upstreamOxygen: { value: 95, unit: '%sat', measured: i !== 0 }, flow_m3s: q })),
      fdcPoints: [{ exceedance: 5, flow: 20 }, { exceedance: 50, flow: 5 }, { exceedance: 95, flow: 1 }],
    })
    const part = siteToEngine(input, null)
    const option = { units: 1, throatDepth_m: 1.5, throatDiameter_m: 0.3, outletDiameter_m: 0.6, submergence_m: 2, air: { pipeDiameter_m: 0.2, pipeLength_m: 5 } }
    const parsed = AssessInputSchema.safeParse({ ...part, option })
    expect(parsed.error?.issues ?? []).toEqual([])
    expect(parsed.data!.site.months[0]!.upstreamMeasured).toBe(false)
    expect(parsed.data!.site.months[1]!.upstreamMeasured).toBe(true)
    expect(parsed.data!.site.months[11]!.flow_m3s).toBe(11)
  })
})
