// The live preview of the option editor: the debounced runner over the real engine, and the site
// mapping it shares with the server (server/domain/assessments.ts).
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { assess } from '../../../shared/engine/assess'
import { buildAssessInput } from '../../../server/domain/assessments'
import type { SiteRow } from '../../../db/schema'
import { DEMO_OPTIONS, DEMO_SITES, demoDailyFlows } from '../../../db/demo-scenario'
import { OptionInputSchema } from '../../../shared/schemas/option'
import type { SiteInput } from '../../../shared/schemas/site'
import { draftFromOption, type OptionDraft, starterDraft } from '../../../utils/optionFields'
import { assembleInput, computePreview, createPreviewRunner, PREVIEW_DELAY_MS, PreviewInputError, type PreviewSite, previewSiteFrom, type PreviewState } from '../../../utils/preview'
import type { AssessResult } from '../../../shared/engine/results'

const demoSite = (name: string): SiteInput => DEMO_SITES.find((s) => s.site.name === name)!.site

/** The stored row of a site as the server reads it (JSON columns as text). */
function rowOf(site: SiteInput): SiteRow {
  return {
    altitude_m: site.altitude_m, weir: JSON.stringify(site.weir), months: JSON.stringify(site.months), head_table: JSON.stringify(site.headTable),
    reserved_flow: JSON.stringify(site.reservedFlow), flow_rules: JSON.stringify(site.flowRules), fdc_points: JSON.stringify(site.fdcPoints),
    catchment: site.catchment ? JSON.stringify(site.catchment) : null, target_oxygen_mgl: site.targetOxygen_mgL,
  } as unknown as SiteRow
}

describe('site mapping of the preview', () => {
  // Both sides are this project's code: the check is that the browser builds the server's input.
  for (const name of ['Skelby gauging weir', 'Cragg Foot drop']) {
    it(`builds the same engine input as the server for ${name} (FDC points, %sat or mg/L months, catchment scaling)`, () => {
      const site = demoSite(name)
      const option = OptionInputSchema.parse(DEMO_OPTIONS.find((o) => o.siteName === name)!.option)
      const server = buildAssessInput(rowOf(site), null, { design: option.design, settings: option.settings })
      const browser = assembleInput(previewSiteFrom(site, null), draftFromOption(option))
      expect(browser).toEqual(server)
    })
  }

  it('builds the same engine input as the server for Hollin Mill weir (a daily record)', () => {
    const demo = DEMO_SITES.find((s) => s.site.name === 'Hollin Mill weir')!
    const days = demoDailyFlows(demo.record!)
    const option = OptionInputSchema.parse(DEMO_OPTIONS.find((o) => o.siteName === 'Hollin Mill weir')!.option)
    const server = buildAssessInput(rowOf(demo.site), { days, scale: null }, { design: option.design, settings: option.settings })
    const browser = assembleInput(previewSiteFrom(demo.site, days), draftFromOption(option))
    expect(browser).toEqual(server)
  })

  it('refuses a site with no hydrology, naming site.hydrology', () => {
    const site = { ...demoSite('Skelby gauging weir'), fdcPoints: [] }
    expect(() => previewSiteFrom(site, null)).toThrow(PreviewInputError)
    try {
      previewSiteFrom(site, null)
    } catch (e) {
      expect((e as PreviewInputError).field).toBe('site.hydrology')
    }
  })
})

describe('preview runner', () => {
  const site: PreviewSite = previewSiteFrom(demoSite('Skelby gauging weir'), null)
  let states: PreviewState<AssessResult>[]
  const latest = () => states[states.length - 1]!
  const runner = () => createPreviewRunner((d: OptionDraft) => computePreview(assess, site, d), PREVIEW_DELAY_MS, (s) => states.push(s))

  beforeEach(() => {
    vi.useFakeTimers()
    states = []
  })
  afterEach(() => vi.useRealTimers())

  it('runs only after the debounce, once for a burst of edits', async () => {
    const r = runner()
    const d = starterDraft('Preview')
    r.schedule(d)
    await vi.advanceTimersByTimeAsync(PREVIEW_DELAY_MS - 50)
    const changed = starterDraft('Preview')
    changed.values['design.units'] = 3
    r.schedule(changed)
    await vi.advanceTimersByTimeAsync(PREVIEW_DELAY_MS - 1)
    expect(latest().runs).toBe(0)
    expect(latest().pending).toBe(true)
    await vi.advanceTimersByTimeAsync(1)
    expect(latest().runs).toBe(1)
    expect(latest().pending).toBe(false)
    expect(latest().error).toBeNull()
    // The burst ran once, with the newest draft: three units.
    expect(latest().result!.summary.ratedPower_kW).toBeCloseTo(assess(assembleInput(site, changed)).summary.ratedPower_kW, 9)
  })

  it('recomputes after an edit: more units give a different rating', async () => {
    const r = runner()
    r.schedule(starterDraft('Preview'))
    await vi.advanceTimersByTimeAsync(PREVIEW_DELAY_MS)
    const two = latest().result!.summary.ratedPower_kW
    const d = starterDraft('Preview')
    d.values['design.units'] = 4
    r.schedule(d)
    await vi.advanceTimersByTimeAsync(PREVIEW_DELAY_MS)
    expect(latest().runs).toBe(2)
    expect(latest().result!.summary.ratedPower_kW).not.toBeCloseTo(two, 3)
  })

  it('keeps the last good result on bad input and names the field', async () => {
    const r = runner()
    r.schedule(starterDraft('Preview'))
    await vi.advanceTimersByTimeAsync(PREVIEW_DELAY_MS)
    const good = latest().result
    expect(good).not.toBeNull()

    const bad = starterDraft('Preview')
    bad.values['design.throatDiameter_m'] = Number.NaN // the text typed was not a number
    r.schedule(bad)
    await vi.advanceTimersByTimeAsync(PREVIEW_DELAY_MS)
    expect(latest().error).toEqual({ field: 'design.throatDiameter_m', message: 'must be a number' })
    expect(latest().result).toBe(good)

    const narrow = starterDraft('Preview')
    narrow.values['design.outletDiameter_m'] = 0.2 // smaller than the 0.5 m throat
    r.schedule(narrow)
    await vi.advanceTimersByTimeAsync(PREVIEW_DELAY_MS)
    expect(latest().error?.field).toBe('design.outletDiameter_m')
    expect(latest().result).toBe(good)
  })

  it('an unnamed option still previews (the name is only needed to save)', async () => {
    const r = runner()
    r.schedule(starterDraft(''))
    await vi.advanceTimersByTimeAsync(PREVIEW_DELAY_MS)
    expect(latest().error).toBeNull()
    expect(latest().result!.summary.annualEnergy_MWh).toBeGreaterThan(0)
  })
})
