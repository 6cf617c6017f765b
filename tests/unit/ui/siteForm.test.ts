import { describe, expect, it } from 'vitest'
import { SiteInputSchema, type SiteDto } from '../../../shared/schemas/site'
import { useSiteForm } from '../../../composables/useSiteForm'
import { blankSiteDraft, draftFromSite, issuesByPath, monthsFromDraft, overviewFromDraft } from '../../../utils/siteDraft'

function filledDraft() {
  const d = blankSiteDraft()
  Object.assign(d, { name: 'Mill weir', riverName: 'Brackwin Water', lat: 54.5, lng: -2.6, grossHead_m: 2.1, crestWidth_m: 14 })
  return d
}

describe('site draft', () => {
  it('a blank draft fails with a message on each required field, keyed by the API path', () => {
    const form = useSiteForm(blankSiteDraft())
    expect(form.checkNew()).toBeNull()
    const e = form.errors.value
    expect(e['name']).toBeTruthy()
    expect(e['riverName']).toBeTruthy()
    expect(e['location']).toBe('Place the site on the map, or enter its latitude and longitude')
    expect(e['weir.grossHead_m']).toBe('is required')
    expect(e['weir.crestWidth_m']).toBe('is required')
    expect(form.formError.value).not.toBe('')
  })

  it('a filled draft passes the server schema, months and reserved flow included', () => {
    const form = useSiteForm(filledDraft())
    const input = form.checkNew()
    expect(input).not.toBeNull()
    expect(input!.months).toHaveLength(12)
    expect(input!.reservedFlow).toEqual({ kind: 'percentile', exceedance: 95 })
    expect(input!.catchment).toBeNull()
    expect(SiteInputSchema.safeParse(input).success).toBe(true)
  })

  it('builds the reserved flow the chosen way, and reports a missing fixed flow on its field', () => {
    const d = filledDraft()
    d.reservedKind = 'fixed'
    expect(overviewFromDraft(d).reservedFlow).toEqual({ kind: 'fixed', flow: null })
    const form = useSiteForm(d)
    expect(form.checkOverview(3)).toBeNull()
    expect(form.errors.value['reservedFlow.flow']).toBe('is required')
    form.draft.reservedFlow = Number.NaN
    expect(form.checkOverview(3)).toBeNull()
    expect(form.errors.value['reservedFlow.flow']).toBe('must be a number')
    form.draft.reservedFlow = 0.4
    expect(form.checkOverview(3)).toMatchObject({ reservedFlow: { kind: 'fixed', flow: 0.4 }, version: 3 })
  })

  it('after a failed check, fixing a field clears its message straight away', () => {
    const form = useSiteForm(blankSiteDraft())
    form.checkNew()
    expect(form.errors.value['name']).toBeTruthy()
    form.draft.name = 'Low drop'
    expect(form.errors.value['name']).toBeUndefined()
    expect(form.errors.value['riverName']).toBeTruthy()
  })

  it('asks for both catchment areas or neither', () => {
    const form = useSiteForm({ ...filledDraft(), siteArea_km2: 40 })
    expect(form.checkOverview(1)).toBeNull()
    expect(form.errors.value['catchment.gaugeArea_km2']).toBeTruthy()
  })

  it('checks months and keys their errors months.N.field', () => {
    const form = useSiteForm(filledDraft())
    form.draft.months[3]!.waterTemp_C = 55
    form.draft.months[6]!.oxygenUnit = 'mg/L'
    form.draft.months[6]!.oxygenValue = 100
    expect(form.checkMonths(2)).toBeNull()
    expect(form.errors.value['months.3.waterTemp_C']).toBe('must be 40 °C or less')
    expect(form.errors.value['months.6.upstreamOxygen.value']).toBe('must be 30 mg/L or less')
    form.draft.months[3]!.waterTemp_C = 12
    form.draft.months[6]!.oxygenValue = 9.5
    expect(form.checkMonths(2)?.months?.[6]).toEqual({ waterTemp_C: 10, upstreamOxygen: { value: 9.5, unit: 'mg/L' } })
  })

  it('round-trips a stored site and tracks unsaved changes', () => {
    const input = SiteInputSchema.parse({ ...overviewFromDraft(filledDraft()), months: monthsFromDraft(blankSiteDraft().months) })
    const site = { ...input, id: 7, orgId: 1, version: 4, createdAt: '', updatedAt: '', createdBy: null, deletedAt: null, hydrologySource: 'none', flowRecord: null } as SiteDto
    const form = useSiteForm(draftFromSite(site))
    expect(form.dirty.value).toBe(false)
    expect(form.checkOverview(4)).toMatchObject({ name: 'Mill weir', weir: { grossHead_m: 2.1, crestWidth_m: 14 }, version: 4 })
    form.draft.notes = 'Fish pass on the left bank'
    expect(form.dirty.value).toBe(true)
    form.reset(draftFromSite(site))
    expect(form.dirty.value).toBe(false)
    expect(form.draft.notes).toBe('')
  })

  it('maps a server 400 onto the fields', () => {
    const form = useSiteForm(filledDraft())
    form.fail({ data: { statusCode: 400, message: 'name: is too long', data: { issues: [{ path: 'name', message: 'is too long' }] } } })
    expect(form.errors.value).toEqual({ name: 'is too long' })
    form.fail({ data: { statusCode: 403, message: 'This needs the admin or engineer role; you are viewer' } })
    expect(form.errors.value).toEqual({})
    expect(form.formError.value).toMatch(/needs the admin or engineer role/)
  })

  it('keeps the first message per path', () => {
    expect(issuesByPath([{ path: ['a', 0], message: 'one' }, { path: ['a', 0], message: 'two' }])).toEqual({ 'a.0': 'one' })
  })
})
