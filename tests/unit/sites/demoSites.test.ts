import { describe, expect, it } from 'vitest'
import { DEMO_SITES, demoDailyFlows } from '../../../db/demo-scenario'
import { fdcFromPoints, fdcFromRecord, fdcStats, scaleFdcByAreaRatio } from '../../../shared/engine/hydrology'
import { SiteInputSchema } from '../../../shared/schemas/site'
import { siteToEngine } from '../../../shared/utils/siteEngineInput'

describe('demo sites on the Brackwin Water', () => {
  it('are valid site inputs on one invented river, with heads of 1.2–3 m', () => {
    expect(DEMO_SITES.map((d) => d.site.name)).toEqual(['Hollin Mill weir', 'Skelby gauging weir', 'Cragg Foot drop'])
    for (const { site } of DEMO_SITES) {
      expect(SiteInputSchema.parse(site)).toEqual(site)
      expect(site.riverName).toBe('Brackwin Water')
      expect(site.weir.grossHead_m).toBeGreaterThanOrEqual(1.2)
      expect(site.weir.grossHead_m).toBeLessThanOrEqual(3)
      expect(site.reach?.coordinates.length).toBeGreaterThanOrEqual(2)
    }
    expect(DEMO_SITES.filter((d) => d.record)).toHaveLength(1)
    expect(DEMO_SITES.filter((d) => !d.record && d.site.fdcPoints.length >= 3)).toHaveLength(2)
    expect(DEMO_SITES.filter((d) => d.site.headTable.length > 0)).toHaveLength(1)
  })

  it('give Skelby gauging weir a seasonal profile, wetter in winter, and mark Cragg Foot drop\'s winter oxygen as not measured', () => {
    const bySite = (name: string) => DEMO_SITES.find((d) => d.site.name === name)!.site
    const skelby = siteToEngine(bySite('Skelby gauging weir'), null).site.months.map((m) => m.flow_m3s!)
    expect(skelby).toHaveLength(12)
    expect(Math.min(skelby[0]!, skelby[1]!, skelby[11]!)).toBeGreaterThan(Math.max(skelby[5]!, skelby[6]!, skelby[7]!))
    const cragg = siteToEngine(bySite('Cragg Foot drop'), null).site.months
    expect(cragg.map((m) => m.upstreamMeasured)).toEqual([false, false, true, true, true, true, true, true, true, true, true, false])
    expect(cragg.every((m) => m.flow_m3s === undefined)).toBe(true)
  })

  it('have mean flows of 2–12 m³/s', () => {
    for (const { site, record } of DEMO_SITES) {
      let mean: number
      if (record) mean = fdcStats(fdcFromRecord(demoDailyFlows(record))).mean
      else {
        const fdc = fdcFromPoints(site.fdcPoints)
        mean = (site.catchment ? scaleFdcByAreaRatio(fdc, site.catchment.siteArea_km2, site.catchment.gaugeArea_km2) : fdc).meanFlow
      }
      expect(mean, site.name).toBeGreaterThanOrEqual(2)
      expect(mean, site.name).toBeLessThanOrEqual(12)
    }
  })

  it('generate the same daily record every time: at least 10 years, winter above summer, the outage as gaps', () => {
    const spec = DEMO_SITES.find((d) => d.record)!.record!
    const a = demoDailyFlows(spec)
    expect(demoDailyFlows(spec)).toEqual(a)
    expect(demoDailyFlows({ ...spec, noiseStart: spec.noiseStart + 1 })).not.toEqual(a)
    expect(a.length).toBeGreaterThanOrEqual(3652)
    expect(a[0]!.date).toBe(spec.firstDay)
    expect(new Set(a.map((d) => d.date)).size).toBe(a.length)
    expect(a.filter((d) => d.flow === null).map((d) => d.date)).toEqual(
      Array.from({ length: 12 }, (_, i) => `2018-07-${String(9 + i).padStart(2, '0')}`),
    )
    const monthMean = (m: string) => {
      const flows = a.filter((d) => d.date.slice(5, 7) === m && d.flow !== null).map((d) => d.flow!)
      return flows.reduce((s, q) => s + q, 0) / flows.length
    }
    expect(monthMean('01')).toBeGreaterThan(2 * monthMean('07'))
    expect(a.every((d) => d.flow === null || d.flow > 0)).toBe(true)
  })
})
