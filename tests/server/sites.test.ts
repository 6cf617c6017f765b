import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import { Client } from './client'
import { createSite, makeTeam, siteBody } from './sites-helpers'

let team: Awaited<ReturnType<typeof makeTeam>>
let other: Awaited<ReturnType<typeof makeTeam>>

beforeAll(async () => {
  team = await makeTeam('sites')
  other = await makeTeam('sites-other')
})

describe('POST /api/orgs/[orgId]/sites', () => {
  it('lets the admin and an engineer create a site (201) with defaults filled in', async () => {
    for (const who of ['admin', 'engineer'] as const) {
      const res = await team[who].post(`/api/orgs/${team.orgId}/sites`, siteBody({ name: `Made by ${who}` }))
      expect(res.status, who).toBe(201)
      expect(res.body).toMatchObject({
        name: `Made by ${who}`,
        orgId: team.orgId,
        version: 1,
        targetOxygen_mgL: 6,
        reservedFlow: { kind: 'percentile', exceedance: 95 },
        headTable: [],
        catchment: null,
        hydrologySource: 'points',
        flowRecord: null,
        deletedAt: null,
      })
      expect(res.body.createdBy.name).toContain(who)
    }
  })

  it('answers 403 to a reviewer and a viewer, 404 to an outsider, 401 when signed out', async () => {
    for (const who of ['reviewer', 'viewer'] as const) {
      const res = await team[who].post(`/api/orgs/${team.orgId}/sites`, siteBody())
      expect(res.status, who).toBe(403)
    }
    expect((await team.outsider.post(`/api/orgs/${team.orgId}/sites`, siteBody())).status).toBe(404)
    expect((await new Client().post(`/api/orgs/${team.orgId}/sites`, siteBody())).status).toBe(401)
  })

  it('answers 400 naming the field, row by row for FDC points', async () => {
    const fdc = await team.engineer.post(`/api/orgs/${team.orgId}/sites`, siteBody({
      fdcPoints: [{ exceedance: 5, flow: 10 }, { exceedance: 30, flow: 6 }, { exceedance: 50, flow: 4 }, { exceedance: 70, flow: 5 }],
    }))
    expect(fdc.status).toBe(400)
    expect(fdc.body.message).toMatch(/^fdcPoints\.3\.flow:/)
    expect(fdc.body.data.issues).toEqual([{ path: 'fdcPoints.3.flow', message: 'flow must not rise as exceedance rises' }])

    const cases: [Record<string, unknown>, RegExp][] = [
      [{ name: '' }, /^name:/],
      [{ location: { lat: 91, lng: 0 } }, /^location\.lat:/],
      [{ reach: { type: 'LineString', coordinates: [[0, 0]] } }, /^reach\.coordinates:/],
      [{ weir: { grossHead_m: 25, crestWidth_m: 10, shape: 'sharp-crested-vertical-face', waterQuality: 'clean' } }, /^weir\.grossHead_m:/],
      [{ weir: { grossHead_m: 2, crestWidth_m: 10, shape: 'ogee', waterQuality: 'clean' } }, /^weir\.shape:/],
      [{ months: siteBody().months.slice(0, 11) }, /^months:/],
      [{ fdcPoints: [{ exceedance: 5, flow: 10 }, { exceedance: 50, flow: 4 }] }, /^fdcPoints:/],
      [{ headTable: [{ flow: 5, head: 2 }, { flow: 2, head: 2.2 }] }, /^headTable\.1\.flow:/],
      [{ reservedFlow: { kind: 'percentile', exceedance: 120 } }, /^reservedFlow\.exceedance:/],
    ]
    for (const [over, message] of cases) {
      const res = await team.engineer.post(`/api/orgs/${team.orgId}/sites`, siteBody(over))
      expect(res.status, JSON.stringify(over)).toBe(400)
      expect(res.body.message, JSON.stringify(over)).toMatch(message)
    }
  })

  it('ignores keys the schema does not know (callers cannot set version or org)', async () => {
    const site = await createSite(team.engineer, team.orgId, { version: 99, orgId: other.orgId, id: 1 })
    expect(site.version).toBe(1)
    expect(site.orgId).toBe(team.orgId)
  })
})

describe('GET /api/sites/[id]', () => {
  it('is readable by every role of the organisation', async () => {
    const site = await createSite(team.engineer, team.orgId, { name: 'Readable' })
    for (const who of ['admin', 'engineer', 'reviewer', 'viewer'] as const) {
      const res = await team[who].get(`/api/sites/${site.id}`)
      expect(res.status, who).toBe(200)
      expect(res.body.name).toBe('Readable')
      expect(res.body.months).toHaveLength(12)
    }
  })

  it('answers 404 to an outsider and to another organisation, 401 signed out, 404 for no such site, 400 for a bad id', async () => {
    const site = await createSite(team.engineer, team.orgId)
    expect((await team.outsider.get(`/api/sites/${site.id}`)).status).toBe(404)
    expect((await other.admin.get(`/api/sites/${site.id}`)).status).toBe(404)
    expect((await new Client().get(`/api/sites/${site.id}`)).status).toBe(401)
    expect((await team.admin.get('/api/sites/99999999')).status).toBe(404)
    const bad = await team.admin.get('/api/sites/abc')
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^id:/)
  })
})

describe('GET /api/orgs/[orgId]/sites', () => {
  let orgId: number
  let admin: Client
  beforeAll(async () => {
    const t = await makeTeam('list')
    orgId = t.orgId
    admin = t.admin
    for (const [name, river, head] of [
      ['Charlie weir', 'Alder Beck', 1.5],
      ['alpha drop', 'Alder Beck', 2.8],
      ['Bravo mill', 'Birk Water', 1.2],
      ['Delta 50%_off', 'Birk Water', 2.0],
      ['Echo sluice', 'Alder Beck', 3.0],
    ] as const) {
      await createSite(admin, orgId, { name, riverName: river, weir: { ...siteBody().weir, grossHead_m: head } })
    }
  })

  it('pages and sorts by name case-insensitively, with a total', async () => {
    const p1 = await admin.get(`/api/orgs/${orgId}/sites?pageSize=2&page=1&sort=name`)
    expect(p1.status).toBe(200)
    expect(p1.body.total).toBe(5)
    expect(p1.body.sites.map((s: { name: string }) => s.name)).toEqual(['alpha drop', 'Bravo mill'])
    const p3 = await admin.get(`/api/orgs/${orgId}/sites?pageSize=2&page=3&sort=name`)
    expect(p3.body.sites.map((s: { name: string }) => s.name)).toEqual(['Echo sluice'])
    const desc = await admin.get(`/api/orgs/${orgId}/sites?sort=grossHead_m&dir=desc`)
    expect(desc.body.sites.map((s: { grossHead_m: number }) => s.grossHead_m)).toEqual([3.0, 2.8, 2.0, 1.5, 1.2])
    expect(desc.body.sites[0]).toMatchObject({ name: 'Echo sluice', riverName: 'Alder Beck', hydrologySource: 'points', recordMeanFlow: null, location: { lat: 54.4, lng: -2.9 } })
  })

  it('filters by text (wildcards taken literally) and by river', async () => {
    const q = await admin.get(`/api/orgs/${orgId}/sites?q=${encodeURIComponent('50%_')}`)
    expect(q.body.sites.map((s: { name: string }) => s.name)).toEqual(['Delta 50%_off'])
    const percent = await admin.get(`/api/orgs/${orgId}/sites?q=${encodeURIComponent('%')}`)
    expect(percent.body.total).toBe(1)
    const byRiverText = await admin.get(`/api/orgs/${orgId}/sites?q=birk`)
    expect(byRiverText.body.total).toBe(2)
    const river = await admin.get(`/api/orgs/${orgId}/sites?river=${encodeURIComponent('alder beck')}&sort=riverName`)
    expect(river.body.sites.map((s: { name: string }) => s.name).sort()).toEqual(['Charlie weir', 'Echo sluice', 'alpha drop'])
  })

  it('refuses a sort outside the allow-list and bad paging with 400 naming the field', async () => {
    const sort = await admin.get(`/api/orgs/${orgId}/sites?sort=password_hash`)
    expect(sort.status).toBe(400)
    expect(sort.body.message).toMatch(/^sort:/)
    expect((await admin.get(`/api/orgs/${orgId}/sites?pageSize=1000`)).body.message).toMatch(/^pageSize:/)
    expect((await admin.get(`/api/orgs/${orgId}/sites?dir=sideways`)).body.message).toMatch(/^dir:/)
  })

  it('shows one organisation none of another\'s sites, and answers 404 to outsiders', async () => {
    const res = await other.admin.get(`/api/orgs/${other.orgId}/sites?pageSize=200`)
    expect(res.status).toBe(200)
    expect(res.body.sites.every((s: { name: string }) => !['Charlie weir', 'Echo sluice'].includes(s.name))).toBe(true)
    expect((await other.admin.get(`/api/orgs/${orgId}/sites`)).status).toBe(404)
    expect((await new Client().get(`/api/orgs/${orgId}/sites`)).status).toBe(401)
  })

  it('gives every live site as a map marker', async () => {
    const res = await admin.get(`/api/orgs/${orgId}/sites/map`)
    expect(res.status).toBe(200)
    expect(res.body.sites).toHaveLength(5)
    expect(res.body.sites[0]).toEqual({ id: expect.any(Number), name: 'alpha drop', riverName: 'Alder Beck', lat: 54.4, lng: -2.9, grossHead_m: 2.8, hydrologySource: 'points' })
    expect((await other.admin.get(`/api/orgs/${orgId}/sites/map`)).status).toBe(404)
  })
})

describe('PATCH /api/sites/[id]', () => {
  it('changes only the fields sent, raises the version, and refuses a stale version with 409', async () => {
    const site = await createSite(team.engineer, team.orgId, { notes: 'keep me', targetOxygen_mgL: 7 })
    const res = await team.engineer.patch(`/api/sites/${site.id}`, { version: 1, name: 'Renamed', weir: { ...siteBody().weir, grossHead_m: 2.6 } })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ name: 'Renamed', version: 2, notes: 'keep me', targetOxygen_mgL: 7, weir: { grossHead_m: 2.6 } })
    const listed = await team.engineer.get(`/api/orgs/${team.orgId}/sites?q=Renamed`)
    expect(listed.body.sites.find((s: { id: number }) => s.id === site.id).grossHead_m).toBe(2.6)

    const stale = await team.admin.patch(`/api/sites/${site.id}`, { version: 1, name: 'Lost update' })
    expect(stale.status).toBe(409)
    expect(stale.body.message).toMatch(/^version:/)
    expect(stale.body.data.currentVersion).toBe(2)
    const after = await team.viewer.get(`/api/sites/${site.id}`)
    expect(after.body).toMatchObject({ name: 'Renamed', version: 2 })

    const cleared = await team.admin.patch(`/api/sites/${site.id}`, { version: 2, reach: null, catchment: { siteArea_km2: 80, gaugeArea_km2: 100 } })
    expect(cleared.status).toBe(200)
    expect(cleared.body).toMatchObject({ reach: null, catchment: { siteArea_km2: 80, gaugeArea_km2: 100 }, version: 3 })
  })

  it('answers 400 without a version or with a bad field, 403 to reviewer and viewer, 404 to outsiders and another organisation', async () => {
    const site = await createSite(team.engineer, team.orgId)
    const noVersion = await team.engineer.patch(`/api/sites/${site.id}`, { name: 'x' })
    expect(noVersion.status).toBe(400)
    expect(noVersion.body.message).toMatch(/^version:/)
    const bad = await team.engineer.patch(`/api/sites/${site.id}`, { version: 1, months: [] })
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^months:/)
    for (const who of ['reviewer', 'viewer'] as const) {
      expect((await team[who].patch(`/api/sites/${site.id}`, { version: 1, name: 'x' })).status, who).toBe(403)
    }
    expect((await team.outsider.patch(`/api/sites/${site.id}`, { version: 1, name: 'x' })).status).toBe(404)
    expect((await other.admin.patch(`/api/sites/${site.id}`, { version: 1, name: 'x' })).status).toBe(404)
    expect((await new Client().patch(`/api/sites/${site.id}`, { version: 1, name: 'x' })).status).toBe(401)
    const unchanged = await team.viewer.get(`/api/sites/${site.id}`)
    expect(unchanged.body).toMatchObject({ name: 'Test weir', version: 1 })
  })
})

describe('DELETE /api/sites/[id] and restore', () => {
  it('soft-deletes: 404 to everyone after, listed only in the admin\'s deleted list, restored by the admin', async () => {
    const site = await createSite(team.engineer, team.orgId, { name: 'Short-lived' })
    for (const who of ['reviewer', 'viewer'] as const) expect((await team[who].delete(`/api/sites/${site.id}`)).status, who).toBe(403)
    expect((await team.outsider.delete(`/api/sites/${site.id}`)).status).toBe(404)
    expect((await other.admin.delete(`/api/sites/${site.id}`)).status).toBe(404)

    const del = await team.engineer.delete(`/api/sites/${site.id}`)
    expect(del.status).toBe(200)
    for (const who of ['admin', 'engineer', 'reviewer', 'viewer'] as const) {
      expect((await team[who].get(`/api/sites/${site.id}`)).status, who).toBe(404)
    }
    expect((await team.engineer.patch(`/api/sites/${site.id}`, { version: 1, name: 'x' })).status).toBe(404)
    expect((await team.engineer.delete(`/api/sites/${site.id}`)).status).toBe(404)
    const live = await team.admin.get(`/api/orgs/${team.orgId}/sites?q=Short-lived`)
    expect(live.body.total).toBe(0)

    const deleted = await team.admin.get(`/api/orgs/${team.orgId}/sites?deleted=only&q=Short-lived`)
    expect(deleted.status).toBe(200)
    expect(deleted.body.sites).toHaveLength(1)
    expect(deleted.body.sites[0].deletedAt).toBeTruthy()
    const notAdmin = await team.engineer.get(`/api/orgs/${team.orgId}/sites?deleted=only`)
    expect(notAdmin.status).toBe(403)
    expect(notAdmin.body.message).toMatch(/^deleted:/)

    expect((await team.engineer.post(`/api/sites/${site.id}/restore`)).status).toBe(403)
    expect((await other.admin.post(`/api/sites/${site.id}/restore`)).status).toBe(404)
    const restored = await team.admin.post(`/api/sites/${site.id}/restore`)
    expect(restored.status).toBe(200)
    expect(restored.body).toMatchObject({ name: 'Short-lived', deletedAt: null, version: 2 })
    expect((await team.viewer.get(`/api/sites/${site.id}`)).status).toBe(200)
    expect((await team.admin.post(`/api/sites/${site.id}/restore`)).status).toBe(409)
  })

  it('records every change in the audit trail', async () => {
    const site = await createSite(team.engineer, team.orgId, { name: 'Audited' })
    await team.engineer.patch(`/api/sites/${site.id}`, { version: 1, notes: 'n' })
    await team.engineer.delete(`/api/sites/${site.id}`)
    await team.admin.post(`/api/sites/${site.id}/restore`)
    const log = await team.admin.get(`/api/orgs/${team.orgId}/audit?pageSize=200`)
    const actions = log.body.entries.filter((e: { targetId: number; targetType: string }) => e.targetType === 'site' && e.targetId === site.id).map((e: { action: string }) => e.action)
    expect(actions).toEqual(['site.restored', 'site.deleted', 'site.updated', 'site.created'])
  })
})

describe('GET /api/sites/[id]/hydrology from entered points', () => {
  it('uses the points, scaled by the catchment, with the reserved flow at Q95', async () => {
    const site = await createSite(team.engineer, team.orgId, { catchment: { siteArea_km2: 50, gaugeArea_km2: 100 } })
    const res = await team.viewer.get(`/api/sites/${site.id}/hydrology`)
    expect(res.status).toBe(200)
    expect(res.body.source).toBe('points')
    expect(res.body.points).toEqual([{ exceedance: 5, flow: 10 }, { exceedance: 50, flow: 2 }, { exceedance: 95, flow: 0.4 }])
    expect(res.body.stats.q95).toBeCloseTo(0.4, 10)
    expect(res.body.stats.q50).toBeCloseTo(2, 10)
    expect(res.body.reservedFlow).toEqual({ setting: { kind: 'percentile', exceedance: 95 }, flow: expect.closeTo(0.4, 10) })
    expect(res.body.scale).toEqual({ siteArea_km2: 50, gaugeArea_km2: 100, factor: 0.5 })
    expect(res.body.monthly).toHaveLength(12)
    expect((await team.outsider.get(`/api/sites/${site.id}/hydrology`)).status).toBe(404)
  })

  it('says none when a site has neither record nor points, keeping a fixed reserved flow', async () => {
    const site = await createSite(team.engineer, team.orgId, { fdcPoints: [], reservedFlow: { kind: 'fixed', flow: 0.3 } })
    const res = await team.viewer.get(`/api/sites/${site.id}/hydrology`)
    expect(res.body).toMatchObject({ source: 'none', points: [], stats: null, reservedFlow: { flow: 0.3 } })
  })
})

describe('hostile bodies and queries', () => {
  it('never make the site routes answer 5xx', async () => {
    const site = await createSite(team.engineer, team.orgId)
    const good = siteBody()
    const anyBody = fc.oneof(
      fc.jsonValue(),
      fc.record(Object.fromEntries(Object.keys(good).map((k) => [k, fc.jsonValue()])), { requiredKeys: [] }),
      // One field at a time replaced by anything, so the rest of the body is valid.
      fc.tuple(fc.constantFrom(...Object.keys(good)), fc.jsonValue()).map(([k, v]) => ({ ...good, [k]: v, version: 1 })),
    )
    await fc.assert(
      fc.asyncProperty(fc.constantFrom('POST', 'PATCH'), anyBody, async (method, body) => {
        const path = method === 'POST' ? `/api/orgs/${team.orgId}/sites` : `/api/sites/${site.id}`
        const res = await team.engineer.request(method, path, JSON.stringify(body))
        expect(res.status, `${method} ${JSON.stringify(body)}`).toBeLessThan(500)
        if (res.status >= 400) expect(typeof res.body?.message).toBe('string')
      }),
      { numRuns: 150 },
    )
    await fc.assert(
      fc.asyncProperty(fc.dictionary(fc.constantFrom('page', 'pageSize', 'sort', 'dir', 'q', 'river', 'deleted'), fc.string({ maxLength: 30 })), async (query) => {
        const res = await team.viewer.get(`/api/orgs/${team.orgId}/sites?${new URLSearchParams(query)}`)
        expect(res.status, JSON.stringify(query)).toBeLessThan(500)
      }),
      { numRuns: 100 },
    )
  })
})
