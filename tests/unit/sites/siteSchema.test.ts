import { describe, expect, it } from 'vitest'
import { SiteInputSchema, SitePatchSchema } from '../../../shared/schemas/site'
import { SiteListQuerySchema } from '../../../shared/schemas/siteList'
import { validator } from '../../../server/utils/validate'

const months = Array.from({ length: 12 }, () => ({ waterTemp_C: 10, upstreamOxygen: { value: 9, unit: 'mg/L' } }))
const base = {
  name: 'A weir',
  riverName: 'A river',
  location: { lat: 54, lng: -2 },
  weir: { grossHead_m: 2, crestWidth_m: 10, shape: 'sharp-crested-vertical-face', waterQuality: 'clean' },
  months,
}

describe('SiteInputSchema', () => {
  it('fills the defaults: no reach, Q95 reserved flow, 6 mg/L target, empty tables', () => {
    expect(SiteInputSchema.parse(base)).toMatchObject({
      reach: null,
      altitude_m: 0,
      headTable: [],
      fdcPoints: [],
      catchment: null,
      reservedFlow: { kind: 'percentile', exceedance: 95 },
      targetOxygen_mgL: 6, // common practice, no source
      notes: '',
    })
  })

  it('names each bad FDC row and the oxygen limit by unit', () => {
    const check = validator(SiteInputSchema, 'body')
    const fdc = [{ exceedance: 10, flow: 9 }, { exceedance: 10, flow: 8 }, { exceedance: 50, flow: 4 }, { exceedance: 90, flow: 5 }]
    expect(() => check({ ...base, fdcPoints: fdc })).toThrow(/^fdcPoints\.1\.exceedance: .*\(and 1 more\)$/)
    const tooMuch = months.map((m, i) => (i === 6 ? { ...m, upstreamOxygen: { value: 40, unit: 'mg/L' } } : m))
    expect(() => check({ ...base, months: tooMuch })).toThrow(/^months\.6\.upstreamOxygen\.value: must be 30 mg\/L or less/)
    const asPercent = months.map((m) => ({ ...m, upstreamOxygen: { value: 105, unit: '%sat' } }))
    expect(SiteInputSchema.safeParse({ ...base, months: asPercent }).success).toBe(true)
  })
})

describe('SitePatchSchema', () => {
  it('needs the version and fills in nothing the caller left out', () => {
    expect(SitePatchSchema.parse({ version: 3, notes: 'x' })).toEqual({ version: 3, notes: 'x' })
    expect(SitePatchSchema.parse({ version: 3, reach: null })).toEqual({ version: 3, reach: null })
    expect(() => validator(SitePatchSchema, 'body')({ notes: 'x' })).toThrow(/^version: is required/)
  })
})

describe('SiteListQuerySchema', () => {
  it('takes only allow-listed sorts and caps the page size', () => {
    expect(SiteListQuerySchema.parse({})).toEqual({ page: 1, pageSize: 50, sort: 'name', dir: 'asc' })
    expect(SiteListQuerySchema.safeParse({ sort: 'org_id' }).success).toBe(false)
    expect(SiteListQuerySchema.safeParse({ pageSize: '201' }).success).toBe(false)
    expect(SiteListQuerySchema.parse({ page: '2', sort: 'updatedAt', dir: 'desc', q: ' mill ' })).toMatchObject({ page: 2, q: 'mill' })
  })
})
