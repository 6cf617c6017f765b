import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import { Client } from './client'
import { createOption, optionBody } from './options-helpers'
import { createSite, makeTeam } from './sites-helpers'

let team: Awaited<ReturnType<typeof makeTeam>>
let siteId: number

beforeAll(async () => {
  team = await makeTeam('options')
  siteId = (await createSite(team.admin, team.orgId, { name: 'Options weir' })).id
})

describe('POST /api/sites/[id]/options', () => {
  it('lets the admin and an engineer add an option (201), defaults filled in and stored', async () => {
    for (const who of ['admin', 'engineer'] as const) {
      const res = await team[who].post(`/api/sites/${siteId}/options`, optionBody({ name: `By ${who}` }))
      expect(res.status, who).toBe(201)
      expect(res.body).toMatchObject({ name: `By ${who}`, siteId, orgId: team.orgId, version: 1, latestAssessment: null })
      // Defaults of the engine's option and settings are stored with it (shared/engine/defaults.ts).
      expect(res.body.design).toMatchObject({ units: 2, constriction: 'venturi', operation: { mode: 'energy-first', allowedDrawdown_m: 0.05, closedMonths: [] } })
      expect(typeof res.body.design.air.jetPumpEfficiency).toBe('number')
      expect(typeof res.body.settings.availability).toBe('number')
      expect(res.body.createdBy.name).toContain(who)
      const again = await team.viewer.get(`/api/options/${res.body.id}`)
      expect(again.body.design).toEqual(res.body.design)
    }
  })

  it('answers 403 to a reviewer and a viewer, 404 to an outsider and for a missing site, 401 signed out', async () => {
    for (const who of ['reviewer', 'viewer'] as const) {
      expect((await team[who].post(`/api/sites/${siteId}/options`, optionBody())).status, who).toBe(403)
    }
    expect((await team.outsider.post(`/api/sites/${siteId}/options`, optionBody())).status).toBe(404)
    expect((await team.admin.post(`/api/sites/99999999/options`, optionBody())).status).toBe(404)
    expect((await new Client().post(`/api/sites/${siteId}/options`, optionBody())).status).toBe(401)
  })

  it('answers 400 naming the field for a malformed body, and stores nothing', async () => {
    const before = (await team.admin.get(`/api/sites/${siteId}/options`)).body.options.length
    const cases: [unknown, RegExp][] = [
      [{ ...optionBody(), name: '' }, /^name:/],
      [optionBody({ design: { units: 0 } }), /^design\.units:/],
      [optionBody({ design: { units: 1.5 } }), /^design\.units:/],
      [optionBody({ design: { outletDiameter_m: 0.3 } }), /^design\.outletDiameter_m:/],
      [optionBody({ design: { air: { pipeDiameter_m: -1, pipeLength_m: 8 } } }), /^design\.air\.pipeDiameter_m:/],
      [optionBody({ settings: { availability: 2 } }), /^settings\.availability:/],
      [{ name: 'No design' }, /^design:/],
    ]
    for (const [body, message] of cases) {
      const res = await team.engineer.post(`/api/sites/${siteId}/options`, body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.message, JSON.stringify(body)).toMatch(message)
    }
    expect((await team.admin.get(`/api/sites/${siteId}/options`)).body.options.length).toBe(before)
  })

  it('drops unknown keys instead of writing them', async () => {
    const res = await team.engineer.post(`/api/sites/${siteId}/options`, { ...optionBody({ name: 'Extra keys' }), orgId: 1, site_id: 1, version: 40 })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ orgId: team.orgId, siteId, version: 1 })
  })
})

describe('GET /api/sites/[id]/options and GET /api/options/[id]', () => {
  it('let every role read, oldest first; 404 for an outsider, 401 signed out', async () => {
    const made = await createOption(team.engineer, siteId, { name: 'Listed' })
    for (const who of ['admin', 'engineer', 'reviewer', 'viewer'] as const) {
      const list = await team[who].get(`/api/sites/${siteId}/options`)
      expect(list.status, who).toBe(200)
      const ids = list.body.options.map((o: { id: number }) => o.id)
      expect(ids).toContain(made.id)
      expect([...ids].sort((a, b) => a - b)).toEqual(ids)
      expect((await team[who].get(`/api/options/${made.id}`)).status, who).toBe(200)
    }
    expect((await team.outsider.get(`/api/sites/${siteId}/options`)).status).toBe(404)
    expect((await team.outsider.get(`/api/options/${made.id}`)).status).toBe(404)
    expect((await new Client().get(`/api/options/${made.id}`)).status).toBe(401)
    expect((await team.admin.get(`/api/options/99999999`)).status).toBe(404)
  })

  it('answers 400 naming the id for a malformed one', async () => {
    const res = await team.admin.get('/api/options/abc')
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^id:/)
  })
})

describe('PATCH /api/options/[id]', () => {
  it('changes the fields given, raises the version, and refuses a stale version with 409', async () => {
    const made = await createOption(team.engineer, siteId, { name: 'To change' })
    const res = await team.engineer.patch(`/api/options/${made.id}`, { version: 1, name: 'Changed', design: { ...optionBody().design, units: 3 } })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ name: 'Changed', version: 2, notes: 'Test option' })
    expect(res.body.design.units).toBe(3)

    const stale = await team.admin.patch(`/api/options/${made.id}`, { version: 1, name: 'Lost update' })
    expect(stale.status).toBe(409)
    expect(stale.body.message).toMatch(/^version:/)
    expect(stale.body.data.currentVersion).toBe(2)
    expect((await team.admin.get(`/api/options/${made.id}`)).body.name).toBe('Changed')
  })

  it('needs the version (400 naming it) and a valid design (400 naming the field), changing nothing', async () => {
    const made = await createOption(team.engineer, siteId, { name: 'Kept' })
    const noVersion = await team.engineer.patch(`/api/options/${made.id}`, { name: 'x' })
    expect(noVersion.status).toBe(400)
    expect(noVersion.body.message).toMatch(/^version:/)
    const bad = await team.engineer.patch(`/api/options/${made.id}`, { version: 1, design: { ...optionBody().design, throatDepth_m: -2 } })
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^design\.throatDepth_m:/)
    const now = await team.engineer.get(`/api/options/${made.id}`)
    expect(now.body).toMatchObject({ name: 'Kept', version: 1 })
  })

  it('answers 403 to a reviewer and a viewer, 404 to an outsider, 401 signed out', async () => {
    const made = await createOption(team.engineer, siteId)
    for (const who of ['reviewer', 'viewer'] as const) {
      expect((await team[who].patch(`/api/options/${made.id}`, { version: 1, name: 'x' })).status, who).toBe(403)
    }
    expect((await team.outsider.patch(`/api/options/${made.id}`, { version: 1, name: 'x' })).status).toBe(404)
    expect((await new Client().patch(`/api/options/${made.id}`, { version: 1, name: 'x' })).status).toBe(401)
  })
})

describe('DELETE /api/options/[id]', () => {
  it('deletes softly: 404 from then on, gone from the list, written to the audit trail', async () => {
    const made = await createOption(team.engineer, siteId, { name: 'To delete' })
    for (const who of ['reviewer', 'viewer'] as const) expect((await team[who].delete(`/api/options/${made.id}`)).status, who).toBe(403)
    expect((await team.outsider.delete(`/api/options/${made.id}`)).status).toBe(404)
    expect((await new Client().delete(`/api/options/${made.id}`)).status).toBe(401)
    const res = await team.engineer.delete(`/api/options/${made.id}`)
    expect(res.status).toBe(200)
    expect(res.body.deletedAt).toBeTruthy()
    expect((await team.admin.get(`/api/options/${made.id}`)).status).toBe(404)
    expect((await team.admin.delete(`/api/options/${made.id}`)).status).toBe(404)
    const list = await team.admin.get(`/api/sites/${siteId}/options`)
    expect(list.body.options.map((o: { id: number }) => o.id)).not.toContain(made.id)
    const trail = await team.admin.get(`/api/orgs/${team.orgId}/audit`)
    expect(trail.body.entries.some((e: { action: string; targetId: number }) => e.action === 'option.deleted' && e.targetId === made.id)).toBe(true)
  })
})

describe('POST /api/options/[id]/sweep and /sweep/save', () => {
  const grid = { throatDiameters_m: [0.4, 0.5], units: [1, 2], throatDepths_m: [2.5] }

  it('runs the engine sweep for every role and answers every grid point', async () => {
    const made = await createOption(team.engineer, siteId, { name: 'Swept' })
    const res = await team.viewer.post(`/api/options/${made.id}/sweep`, { grid })
    expect(res.status).toBe(200)
    expect(res.body.optionId).toBe(made.id)
    expect(res.body.points).toHaveLength(4)
    expect(res.body.points.map((p: { throatDiameter_m: number; units: number }) => `${p.throatDiameter_m}x${p.units}`).sort()).toEqual(['0.4x1', '0.4x2', '0.5x1', '0.5x2'])
    expect(typeof res.body.reason).toBe('string')
    expect((await team.outsider.post(`/api/options/${made.id}/sweep`, { grid })).status).toBe(404)
    expect((await new Client().post(`/api/options/${made.id}/sweep`, { grid })).status).toBe(401)
  })

  it('answers 400 naming the field for a malformed grid', async () => {
    const made = await createOption(team.engineer, siteId)
    const res = await team.engineer.post(`/api/options/${made.id}/sweep`, { grid: { ...grid, units: [0] } })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^grid\.units\.0:/)
    const missing = await team.engineer.post(`/api/options/${made.id}/sweep`, {})
    expect(missing.status).toBe(400)
    expect(missing.body.message).toMatch(/^grid:/)
  })

  it('saves a grid point as a new option (engineers and admins) with the same settings', async () => {
    const made = await createOption(team.engineer, siteId, { name: 'Source', settings: { availability: 0.9 } })
    const body = { throatDiameter_m: 0.4, units: 3, throatDepth_m: 3, name: 'From the sweep' }
    for (const who of ['reviewer', 'viewer'] as const) expect((await team[who].post(`/api/options/${made.id}/sweep/save`, body)).status, who).toBe(403)
    expect((await team.outsider.post(`/api/options/${made.id}/sweep/save`, body)).status).toBe(404)
    const res = await team.engineer.post(`/api/options/${made.id}/sweep/save`, body)
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ name: 'From the sweep', siteId, version: 1 })
    expect(res.body.design).toMatchObject({ throatDiameter_m: 0.4, units: 3, throatDepth_m: 3 })
    // The outlet keeps the source's area ratio, as the sweep varies it: 1.0 × 0.4 / 0.5.
    expect(res.body.design.outletDiameter_m).toBeCloseTo(0.8, 10)
    expect(res.body.settings.availability).toBe(0.9)
    const bad = await team.engineer.post(`/api/options/${made.id}/sweep/save`, { ...body, units: 0 })
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^units:/)
    const noName = await team.engineer.post(`/api/options/${made.id}/sweep/save`, { ...body, name: undefined })
    expect(noName.status).toBe(400)
    expect(noName.body.message).toMatch(/^name:/)
  })

  it('answers 422 naming the site field when the site has no hydrology yet', async () => {
    const bare = await createSite(team.admin, team.orgId, { name: 'No hydrology', fdcPoints: [] })
    const made = await createOption(team.engineer, bare.id)
    const res = await team.engineer.post(`/api/options/${made.id}/sweep`, { grid })
    expect(res.status).toBe(422)
    expect(res.body.message).toBe('site.hydrology: add FDC points or upload a flow record first')
  })
})

describe('hostile input', () => {
  it('never makes the option, assessment, sweep, portfolio or compare routes answer 5xx, nor changes a stored option', async () => {
    const made = await createOption(team.engineer, siteId, { name: 'Hostile target' })
    const stored = (o: Record<string, unknown>) => ({ name: o.name, notes: o.notes, design: o.design, settings: o.settings, version: o.version })
    // What the option must hold at the end: as created, or as the last PATCH that was accepted left it.
    let expected = stored((await team.engineer.get(`/api/options/${made.id}`)).body)
    const body = fc.oneof(
      fc.jsonValue(),
      fc.record({ name: fc.jsonValue(), design: fc.jsonValue(), settings: fc.jsonValue(), version: fc.jsonValue(), rerunOf: fc.jsonValue(), use: fc.jsonValue(), grid: fc.jsonValue() }, { requiredKeys: [] }),
      fc.record({ version: fc.constant(99), design: fc.record({ units: fc.jsonValue(), throatDiameter_m: fc.jsonValue(), air: fc.jsonValue() }, { requiredKeys: [] }) }),
      fc.record({ throatDiameter_m: fc.jsonValue(), units: fc.jsonValue(), throatDepth_m: fc.jsonValue(), name: fc.jsonValue() }, { requiredKeys: [] }),
    )
    const routes: [string, string][] = [
      ['POST', `/api/sites/${siteId}/options`],
      ['PATCH', `/api/options/${made.id}`],
      ['POST', `/api/options/${made.id}/assessments`],
      ['POST', `/api/options/${made.id}/sweep`],
      ['POST', `/api/options/${made.id}/sweep/save`],
    ]
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...routes), body, async ([method, path], b) => {
        const res = await team.engineer.request(method, path, JSON.stringify(b))
        expect(res.status, `${method} ${path} ${JSON.stringify(b)}`).toBeLessThan(500)
        if (res.status >= 400) expect(typeof res.body?.message).toBe('string')
        if (method === 'PATCH' && res.status === 200) expected = stored(res.body)
      }),
      { numRuns: 120 },
    )
    const queries = fc.dictionary(fc.constantFrom('page', 'pageSize', 'sort', 'dir', 'q', 'river', 'assessed', 'format', 'options'), fc.string({ maxLength: 40 }))
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(`/api/orgs/${team.orgId}/portfolio`, '/api/compare', `/api/options/${made.id}/assessments`), queries, async (path, q) => {
        const res = await team.engineer.get(`${path}?${new URLSearchParams(q).toString()}`)
        expect(res.status, `${path} ${JSON.stringify(q)}`).toBeLessThan(500)
      }),
      { numRuns: 80 },
    )
    // Refused bodies changed nothing.
    expect(stored((await team.engineer.get(`/api/options/${made.id}`)).body)).toEqual(expected)
  })
})
