import { describe, expect, it, vi } from 'vitest'
import { SiteInputSchema, SitePatchSchema, type SiteDto } from '../../../shared/schemas/site'
import { useFormState } from '../../../composables/useFormState'
import { blankHeadRow } from '../../../utils/headTable'
import { blankSiteDraft, draftFromSite, issuesByPath, monthsBody, monthsFromDraft, newSiteBody, overviewBody, overviewFromDraft, SITE_FORM, type SiteDraft } from '../../../utils/siteDraft'

function filledDraft() {
  const d = blankSiteDraft()
  Object.assign(d, { name: 'Mill weir', riverName: 'Brackwin Water', lat: 54.5, lng: -2.6, grossHead_m: 2.1, crestWidth_m: 14 })
  return d
}

function storedSite(draft = filledDraft()): SiteDto {
  const input = SiteInputSchema.parse({ ...overviewFromDraft(draft), months: monthsFromDraft(draft.months) })
  return { ...input, id: 7, orgId: 1, version: 4, createdAt: '', updatedAt: '', createdBy: null, deletedAt: null, hydrologySource: 'none', flowRecord: null } as SiteDto
}

/** The new-site form as SiteNewForm builds it. */
const newSiteForm = (blank: SiteDraft, send = vi.fn()) => useFormState({ ...SITE_FORM, blank, schema: SiteInputSchema, toBody: newSiteBody, send })
/** A stored site's section as SiteOverviewSection and SiteMonthsSection build it. */
const sectionForm = (site: SiteDto, toBody: (d: SiteDraft) => object, send = vi.fn()) => useFormState({ ...SITE_FORM, stored: () => site, schema: SitePatchSchema, toBody, send })

describe('site draft', () => {
  it('a blank draft fails with a message on each required field, keyed by the API path', async () => {
    const form = newSiteForm(blankSiteDraft())
    expect(await form.save()).toBeNull()
    const e = form.errors.value
    expect(e['name']).toBeTruthy()
    expect(e['riverName']).toBeTruthy()
    expect(e['location']).toBe('Place the site on the map, or enter its latitude and longitude')
    expect(e['weir.grossHead_m']).toBe('is required')
    expect(e['weir.crestWidth_m']).toBe('is required')
    expect(form.formError.value).toBe('Some fields need attention; see the messages beside them.')
  })

  it('a filled draft passes the server schema, months, head table and reserved flow included', () => {
    const d = filledDraft()
    d.headRows = [{ ...blankHeadRow(), flow: '2', head: '2' }]
    const input = newSiteForm(d).toBody()
    expect(input).not.toBeNull()
    expect(input!.months).toHaveLength(12)
    expect(input!.headTable).toEqual([{ flow: 2, head: 2 }])
    expect(input!.reservedFlow).toEqual({ kind: 'percentile', exceedance: 95 })
    expect(input!.catchment).toBeNull()
    expect(SiteInputSchema.safeParse(input).success).toBe(true)
  })

  it('builds the reserved flow the chosen way, and reports a missing fixed flow on its field', () => {
    const d = filledDraft()
    d.reservedKind = 'fixed'
    expect(overviewFromDraft(d).reservedFlow).toEqual({ kind: 'fixed', flow: null })
    const form = sectionForm(storedSite(), overviewBody)
    Object.assign(form.draft, d)
    expect(form.toBody()).toBeNull()
    expect(form.errors.value['reservedFlow.flow']).toBe('is required')
    form.draft.reservedFlow = Number.NaN
    expect(form.toBody()).toBeNull()
    expect(form.errors.value['reservedFlow.flow']).toBe('must be a number')
    form.draft.reservedFlow = 0.4
    expect(form.toBody()).toMatchObject({ reservedFlow: { kind: 'fixed', flow: 0.4 }, version: 4 })
  })

  it('after a refused save, fixing a field clears its message straight away', async () => {
    const form = newSiteForm(blankSiteDraft())
    await form.save()
    expect(form.errors.value['name']).toBeTruthy()
    form.draft.name = 'Low drop'
    expect(form.errors.value['name']).toBeUndefined()
    expect(form.errors.value['riverName']).toBeTruthy()
  })

  it('asks for both catchment areas or neither', () => {
    const form = sectionForm(storedSite(), overviewBody)
    form.draft.siteArea_km2 = 40
    expect(form.toBody()).toBeNull()
    expect(form.errors.value['catchment.gaugeArea_km2']).toBeTruthy()
  })

  it('checks months and keys their errors months.N.field', () => {
    const form = sectionForm(storedSite(), monthsBody)
    form.draft.months[3]!.waterTemp_C = 55
    form.draft.months[6]!.oxygenUnit = 'mg/L'
    form.draft.months[6]!.oxygenValue = 100
    expect(form.toBody()).toBeNull()
    expect(form.errors.value['months.3.waterTemp_C']).toBe('must be 40 °C or less')
    expect(form.errors.value['months.6.upstreamOxygen.value']).toBe('must be 30 mg/L or less')
    form.draft.months[3]!.waterTemp_C = 12
    form.draft.months[6]!.oxygenValue = 9.5
    const body = form.toBody()
    expect(Object.keys(body!).sort()).toEqual(['months', 'version'])
    expect(body!.months?.[6]).toEqual({ waterTemp_C: 10, upstreamOxygen: { value: 9.5, unit: 'mg/L', measured: true }, flow_m3s: null })
  })

  it('sends the month flows and a not-measured mark, and names a bad flow months.N.flow_m3s', () => {
    const form = sectionForm(storedSite(), monthsBody)
    form.draft.months.forEach((m, i) => { m.flow_m3s = 3 + i })
    form.draft.months[0]!.oxygenMeasured = false
    form.draft.months[2]!.flow_m3s = -1
    expect(form.toBody()).toBeNull()
    expect(form.errors.value['months.2.flow_m3s']).toBe('must be 0 or more')
    form.draft.months[2]!.flow_m3s = 5
    const body = form.toBody()
    expect(body!.months?.map((m) => m.flow_m3s)).toEqual([3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14])
    expect(body!.months?.[0]!.upstreamOxygen.measured).toBe(false)
    expect(body!.months?.[1]!.upstreamOxygen.measured).toBe(true)
  })

  it('keeps the weir aeration model and measured ratio in the overview body, and names a bad ratio', () => {
    const form = sectionForm(storedSite(), overviewBody)
    expect(form.toBody()!.weir).toMatchObject({ aerationModel: 'butts-evans', measuredDeficitRatio: null })
    form.draft.aerationModel = 'measured'
    expect(form.toBody()).toBeNull()
    expect(form.errors.value['weir.measuredDeficitRatio']).toBe('is needed when the aeration model is "measured"')
    Object.assign(form.draft, { measuredR: 0.5, measuredTemp_C: 12, measuredDrowned: true, measuredNote: ' June, low flow ' })
    expect(form.toBody()).toBeNull()
    expect(form.errors.value['weir.measuredDeficitRatio.r']).toBe('must be 1 or more (1 means no aeration)')
    form.draft.measuredR = 1.8
    expect(form.toBody()!.weir).toEqual({
      grossHead_m: 2.1, crestWidth_m: 14, shape: 'sharp-crested-vertical-face', waterQuality: 'clean',
      aerationModel: 'measured', measuredDeficitRatio: { r: 1.8, temperature_C: 12, drowned: true, note: 'June, low flow' },
      hydraulics: null,
    })
  })

  it('sends the weir hydraulics when heads come from them, naming a bad field, and none for the head table', () => {
    const form = sectionForm(storedSite(), overviewBody)
    expect(form.draft.headsFrom).toBe('head-table')
    Object.assign(form.draft, { headsFrom: 'hydraulics', crestHeight_m: 1.9, channelWidth_m: 14, bedSlope: 0.0015, roughnessN: 0.5 })
    expect(form.toBody()).toBeNull()
    expect(form.errors.value['weir.hydraulics.tail.roughnessN']).toBe('must be between 0.01 and 0.2')
    form.draft.roughnessN = 0.04
    expect(form.toBody()!.weir!.hydraulics).toEqual({ crestHeight_m: 1.9, dischargeCoefficient: null, tail: { kind: 'manning', channelWidth_m: 14, bedSlope: 0.0015, roughnessN: 0.04 } })
    form.draft.tailKind = 'table'
    form.draft.tailRows = [{ key: 1, flow_m3s: '2', depth_m: '0.4' }, { key: 2, flow_m3s: '1', depth_m: '0.6' }]
    expect(form.toBody()).toBeNull()
    expect(form.errors.value['weir.hydraulics.tail.rows.1.flow_m3s']).toBe('rows must be sorted by rising flow, without repeats')
    form.draft.headsFrom = 'head-table'
    expect(form.toBody()!.weir!.hydraulics).toBeNull()
  })

  it('reads a site stored before month flows and the measured mark as measured, no flows, and unchanged', () => {
    const stored = storedSite()
    const old = { ...stored, months: stored.months.map((m) => ({ waterTemp_C: m.waterTemp_C, upstreamOxygen: { value: m.upstreamOxygen.value, unit: m.upstreamOxygen.unit } })) }
    const form = sectionForm(old, monthsBody)
    expect(form.draft.months.every((m) => m.oxygenMeasured && m.flow_m3s === null)).toBe(true)
    expect(form.dirty.value).toBe(false)
  })

  it('round-trips a stored site and tracks unsaved changes, the head rows by their text', () => {
    const site = { ...storedSite(), headTable: [{ flow: 1, head: 1.4 }] }
    const form = sectionForm(site, overviewBody)
    expect(form.dirty.value).toBe(false)
    expect(form.toBody()).toMatchObject({ name: 'Mill weir', weir: { grossHead_m: 2.1, crestWidth_m: 14 }, headTable: [{ flow: 1, head: 1.4 }], version: 4 })
    form.draft.notes = 'Fish pass on the left bank'
    expect(form.dirty.value).toBe(true)
    form.reset()
    expect(form.dirty.value).toBe(false)
    expect(form.draft.notes).toBe('')
    form.draft.headRows = [{ ...blankHeadRow(), flow: ' 1 ', head: '1.4' }]
    expect(form.dirty.value).toBe(false)
    form.draft.headRows[0]!.head = '1.5'
    expect(form.dirty.value).toBe(true)
    expect(draftFromSite(site).headRows.map((r) => [r.flow, r.head])).toEqual([['1', '1.4']])
  })

  it("maps a server 400 onto the fields in the form's words", async () => {
    const send = vi.fn()
    const form = sectionForm(storedSite(), overviewBody, send)
    send.mockRejectedValueOnce({ data: { statusCode: 400, message: 'name: is too long', data: { issues: [{ path: 'name', message: 'is too long' }, { path: 'location.lat', message: 'must be a number' }] } } })
    await form.save()
    expect(form.errors.value).toEqual({ 'name': 'is too long', 'location.lat': 'Place the site on the map, or enter its latitude and longitude' })
    expect(form.formError.value).toBe('Some fields need attention; see the messages beside them.')
    send.mockRejectedValueOnce({ data: { statusCode: 403, message: 'This needs the admin or engineer role; you are viewer' } })
    await form.save()
    expect(form.errors.value).toEqual({})
    expect(form.formError.value).toMatch(/needs the admin or engineer role/)
  })

  it('keeps the first message per path', () => {
    expect(issuesByPath([{ path: ['a', 0], message: 'one' }, { path: ['a', 0], message: 'two' }])).toEqual({ 'a.0': 'one' })
  })
})
