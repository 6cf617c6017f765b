import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { ENGINE_VERSION } from '../../shared/engine/version'
import { Client } from './client'
import { createAssessment, createOption, optionBody } from './options-helpers'
import { createSite, makeTeam } from './sites-helpers'

let team: Awaited<ReturnType<typeof makeTeam>>
let siteId: number
let optionId: number
let first: any
// The test database, opened beside the running server (WAL lets both in).
let sqlite: Database.Database

beforeAll(async () => {
  team = await makeTeam('assess')
  siteId = (await createSite(team.admin, team.orgId, { name: 'Assessed weir' })).id
  optionId = (await createOption(team.engineer, siteId, { name: 'Assessed option' })).id
  first = await createAssessment(team.engineer, optionId)
  sqlite = new Database(inject('databasePath'))
  sqlite.pragma('busy_timeout = 5000')
})

afterAll(() => sqlite?.close())

describe('POST /api/options/[id]/assessments', () => {
  it('runs the engine on the server and stores the exact input, engine version, figures and whole result', () => {
    expect(first).toMatchObject({ siteId, optionId, engineVersion: ENGINE_VERSION, stale: false, supersedes: null, supersededBy: null })
    expect(first.createdBy.name).toContain('engineer')
    const s = first.result.summary
    expect(first.annualEnergy_MWh).toBe(s.annualEnergy_MWh)
    expect(first.capacityFactor).toBe(s.capacityFactor)
    expect(first.ratedPower_kW).toBe(s.ratedPower_kW)
    expect(first.minCavitationMargin_m).toBe(s.minCavitationMargin_m)
    expect(first.netOxygenGainSummerLowFlow_mgL).toBe(s.netOxygenGainSummerLowFlow_mgL)
    expect(first.lcoe).toBe(s.lcoe)
    expect(first.flagsRaised).toEqual(s.flags.filter((f: { raised: boolean }) => f.raised).map((f: { id: string }) => f.id))
    expect(first.result.engineVersion).toBe(ENGINE_VERSION)
    // The stored input is the engine's, defaults filled in, built from the site (sites-helpers siteBody).
    expect(first.input.hydrology).toEqual({ kind: 'fdc', points: [{ exceedance: 5, flow: 20 }, { exceedance: 50, flow: 4 }, { exceedance: 95, flow: 0.8 }] })
    expect(first.input.site).toMatchObject({ altitude_m: 120, grossHead_m: 2.1, weirShape: 'sharp-crested-vertical-face', waterQuality: 'clean' })
    expect(first.input.site.months[3]).toEqual({ temperature_C: 9, upstreamOxygen_mgL: 9.25, upstreamMeasured: true })
    expect(first.input.option).toMatchObject({ units: 2, throatDiameter_m: 0.5, constriction: 'venturi' })
    expect(typeof first.input.settings.availability).toBe('number')
    expect(first.input.settings.oxygenTarget_mgL).toBe(6)
  })

  it('answers 403 to a reviewer and a viewer, 404 to an outsider and for a missing option, 401 signed out', async () => {
    for (const who of ['reviewer', 'viewer'] as const) expect((await team[who].post(`/api/options/${optionId}/assessments`)).status, who).toBe(403)
    expect((await team.outsider.post(`/api/options/${optionId}/assessments`)).status).toBe(404)
    expect((await team.admin.post('/api/options/99999999/assessments')).status).toBe(404)
    expect((await new Client().post(`/api/options/${optionId}/assessments`)).status).toBe(401)
    expect((await team.admin.post(`/api/options/${optionId}/assessments`)).status).toBe(201)
  })

  it('answers 400 naming the field for a malformed body', async () => {
    const cases: [unknown, RegExp][] = [
      [{ rerunOf: 'abc' }, /^rerunOf:/],
      [{ rerunOf: -3 }, /^rerunOf:/],
      [{ use: 'stored' }, /^rerunOf:/],
      [{ rerunOf: first.id, use: 'sometimes' }, /^use:/],
    ]
    for (const [body, message] of cases) {
      const res = await team.engineer.post(`/api/options/${optionId}/assessments`, body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.message).toMatch(message)
    }
  })

  it('answers 422 naming rerunOf for an assessment of another option', async () => {
    const other = await createOption(team.engineer, siteId, { name: 'Other option' })
    const res = await team.engineer.post(`/api/options/${other.id}/assessments`, { rerunOf: first.id })
    expect(res.status).toBe(422)
    expect(res.body.message).toMatch(/^rerunOf:/)
  })

  it('answers 422 naming the site field when the site cannot be assessed yet, storing nothing', async () => {
    const bare = await createSite(team.admin, team.orgId, { name: 'Bare weir', fdcPoints: [] })
    const opt = await createOption(team.engineer, bare.id)
    const res = await team.engineer.post(`/api/options/${opt.id}/assessments`)
    expect(res.status).toBe(422)
    expect(res.body.message).toBe('site.hydrology: add FDC points or upload a flow record first')
    expect((await team.engineer.get(`/api/options/${opt.id}/assessments`)).body.total).toBe(0)
  })

  it('converts upstream oxygen given in % saturation to mg/L at the site altitude', async () => {
    const months = Array.from({ length: 12 }, () => ({ waterTemp_C: 20, upstreamOxygen: { value: 100, unit: '%sat' } }))
    const site = await createSite(team.admin, team.orgId, { name: 'Sea-level weir', altitude_m: 0, months })
    const opt = await createOption(team.engineer, site.id)
    const a = await createAssessment(team.engineer, opt.id)
    // Saturation at 20 °C, 1 atm, fresh water: 9.092 mg/L (APHA Standard Methods 4500-O, Table 4500-O:I; Benson & Krause 1984).
    expect(a.input.site.months[0].upstreamOxygen_mgL).toBeCloseTo(9.092, 2)
  })
})

describe('reproducibility', () => {
  it('a stored assessment reproduces its figures when its stored input is re-run on the same engine version', async () => {
    const stored = await team.viewer.get(`/api/assessments/${first.id}`)
    expect(stored.status).toBe(200)
    expect(stored.body.stale).toBe(false)
    const rerun = await team.viewer.post('/api/engine/assess', stored.body.input)
    expect(rerun.status).toBe(200)
    expect(rerun.body.engineVersion).toBe(stored.body.engineVersion)
    expect(rerun.body.summary).toEqual(stored.body.result.summary)
    expect(rerun.body.perFlow).toEqual(stored.body.result.perFlow)
    expect(rerun.body.months).toEqual(stored.body.result.months)
    // the stored input carries the Monte Carlo's draws and seed, so its spread re-runs to the same figures
    expect(stored.body.result.uncertainty.seed).toBe(stored.body.input.settings.monteCarloSeed)
    expect(rerun.body.uncertainty).toEqual(stored.body.result.uncertainty)
  })

  it('a re-run of the stored input through the re-run route gives the same figures and links the two', async () => {
    const base = await createAssessment(team.engineer, optionId)
    const again = await createAssessment(team.engineer, optionId, { rerunOf: base.id, use: 'stored' })
    expect(again.supersedes).toBe(base.id)
    expect(again.input).toEqual(base.input)
    expect(again.result.summary).toEqual(base.result.summary)
    expect(again.result.uncertainty).toEqual(base.result.uncertainty)
    expect(base.result.uncertainty.draws).toBe(base.input.settings.monteCarloDraws)
    const old = await team.viewer.get(`/api/assessments/${base.id}`)
    expect(old.status).toBe(200)
    expect(old.body.supersededBy).toBe(again.id)
  })

  it('does not recompute a stored assessment when the option changes afterwards', async () => {
    const opt = await createOption(team.engineer, siteId, { name: 'Changed later' })
    const a = await createAssessment(team.engineer, opt.id)
    const changed = await team.engineer.patch(`/api/options/${opt.id}`, { version: 1, design: { units: 4, throatDiameter_m: 0.3, outletDiameter_m: 0.7, throatDepth_m: 2, air: { pipeDiameter_m: 0.3, pipeLength_m: 5 } } })
    expect(changed.status).toBe(200)
    const read = await team.viewer.get(`/api/assessments/${a.id}`)
    expect(read.body.input.option.units).toBe(2)
    expect(read.body.result.summary).toEqual(a.result.summary)
    const fresh = await createAssessment(team.engineer, opt.id)
    expect(fresh.input.option.units).toBe(4)
  })
})

describe('stale detection', () => {
  /** Copies a stored assessment row as if an older engine had written it; returns the new id. */
  function writeOldAssessment(fromId: number, engineVersion: string): number {
    const copy = sqlite.transaction(() => {
      const info = sqlite
        .prepare(`insert into assessments (option_id, site_id, org_id, engine_version, annual_energy_mwh, capacity_factor, rated_power_kw, min_cavitation_margin_m,
            net_oxygen_gain_slf_mgl, lcoe, flags_raised, flag_count, supersedes_id, created_by, created_at)
          select option_id, site_id, org_id, ?, annual_energy_mwh + 1, capacity_factor, rated_power_kw, min_cavitation_margin_m,
            net_oxygen_gain_slf_mgl, lcoe, flags_raised, flag_count, null, created_by, created_at from assessments where id = ?`)
        .run(engineVersion, fromId)
      const id = Number(info.lastInsertRowid)
      sqlite.prepare('insert into assessment_payloads (assessment_id, input_json, result_json) select ?, input_json, result_json from assessment_payloads where assessment_id = ?').run(id, fromId)
      return id
    })
    return copy()
  }

  it('reports an assessment made by another engine version as stale, in the detail and the list', async () => {
    const oldId = writeOldAssessment(first.id, '0.0.1-old')
    const read = await team.reviewer.get(`/api/assessments/${oldId}`)
    expect(read.status).toBe(200)
    expect(read.body).toMatchObject({ id: oldId, engineVersion: '0.0.1-old', stale: true })
    // Never recomputed silently: the stored figure (changed when written) comes back as stored.
    expect(read.body.annualEnergy_MWh).toBeCloseTo(first.annualEnergy_MWh + 1, 10)
    const list = await team.reviewer.get(`/api/options/${optionId}/assessments?pageSize=200`)
    const row = list.body.assessments.find((a: { id: number }) => a.id === oldId)
    expect(row.stale).toBe(true)
    expect(list.body.assessments.find((a: { id: number }) => a.id === first.id).stale).toBe(false)
  })

  it('a re-run of a stale assessment keeps the old one, links it, and is current; a second re-run is refused', async () => {
    const oldId = writeOldAssessment(first.id, '0.0.2-old')
    const rerun = await createAssessment(team.engineer, optionId, { rerunOf: oldId })
    expect(rerun).toMatchObject({ supersedes: oldId, stale: false, engineVersion: ENGINE_VERSION })
    const old = await team.viewer.get(`/api/assessments/${oldId}`)
    expect(old.status).toBe(200)
    expect(old.body).toMatchObject({ stale: true, supersededBy: rerun.id, engineVersion: '0.0.2-old' })
    const twice = await team.engineer.post(`/api/options/${optionId}/assessments`, { rerunOf: oldId })
    expect(twice.status).toBe(409)
    expect(twice.body.message).toMatch(/^rerunOf:/)
    const trail = await team.admin.get(`/api/orgs/${team.orgId}/audit`)
    const entry = trail.body.entries.find((e: { action: string; targetId: number }) => e.action === 'assessment.created' && e.targetId === rerun.id)
    expect(entry).toBeTruthy()
  })
})

describe('GET /api/options/[id]/assessments and GET /api/assessments/[id]', () => {
  it('lists newest first for every role, with paging; 404 for an outsider, 401 signed out', async () => {
    for (const who of ['admin', 'engineer', 'reviewer', 'viewer'] as const) {
      const res = await team[who].get(`/api/options/${optionId}/assessments`)
      expect(res.status, who).toBe(200)
      const ids = res.body.assessments.map((a: { id: number }) => a.id)
      expect([...ids].sort((a, b) => b - a)).toEqual(ids)
      expect(res.body.assessments[0]).not.toHaveProperty('result')
    }
    const page = await team.viewer.get(`/api/options/${optionId}/assessments?pageSize=1&page=2`)
    expect(page.body.assessments).toHaveLength(1)
    expect(page.body.total).toBeGreaterThan(2)
    const bad = await team.viewer.get(`/api/options/${optionId}/assessments?pageSize=0`)
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^pageSize:/)
    expect((await team.outsider.get(`/api/options/${optionId}/assessments`)).status).toBe(404)
    expect((await team.outsider.get(`/api/assessments/${first.id}`)).status).toBe(404)
    expect((await new Client().get(`/api/assessments/${first.id}`)).status).toBe(401)
    expect((await team.admin.get('/api/assessments/99999999')).status).toBe(404)
  })

  it('shows the option its newest assessment', async () => {
    const opt = await team.viewer.get(`/api/options/${optionId}`)
    const list = await team.viewer.get(`/api/options/${optionId}/assessments`)
    expect(opt.body.latestAssessment.id).toBe(list.body.assessments[0].id)
  })

  it('answers 404 for the assessments of a deleted option', async () => {
    const opt = await createOption(team.engineer, siteId, { name: 'Deleted with its runs' })
    const a = await createAssessment(team.engineer, opt.id)
    expect((await team.engineer.delete(`/api/options/${opt.id}`)).status).toBe(200)
    expect((await team.admin.get(`/api/assessments/${a.id}`)).status).toBe(404)
  })
})

describe('GET /api/assessments/[id]/export/[table].csv', () => {
  it('downloads each table as CSV with units in the header', async () => {
    const per = await team.viewer.download(`/api/assessments/${first.id}/export/perFlow.csv`)
    expect(per.status).toBe(200)
    expect(per.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(per.headers.get('content-disposition')).toMatch(/^attachment; filename=".*perFlow\.csv"$/)
    const lines = new TextDecoder().decode(per.bytes).trim().split(/\r\n/)
    expect(lines[0]).toContain('River flow (m³/s)')
    expect(lines[0]).toContain('Electrical power (kW)')
    expect(lines).toHaveLength(first.result.perFlow.length + 1)
    expect(Number(lines[1]!.split(',')[1])).toBeCloseTo(first.result.perFlow[0].riverFlow_m3s, 10)

    const months = new TextDecoder().decode((await team.viewer.download(`/api/assessments/${first.id}/export/months.csv`)).bytes).trim().split(/\r\n/)
    expect(months).toHaveLength(13)
    expect(months[0]).toContain('Water temperature (°C)')

    const summary = new TextDecoder().decode((await team.viewer.download(`/api/assessments/${first.id}/export/summary.csv`)).bytes).trim().split(/\r\n/)
    expect(summary[0]).toBe('Figure,Value,Unit')
    expect(summary.find((l) => l.startsWith('Annual energy,'))).toBe(`Annual energy,${first.result.summary.annualEnergy_MWh},MWh/yr`)
  })

  it('answers 400 naming the table for an unknown one, 404 to an outsider, 401 signed out', async () => {
    const bad = await team.viewer.get(`/api/assessments/${first.id}/export/secrets.csv`)
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^file: must be one of perFlow\.csv, months\.csv, summary\.csv/)
    expect((await team.outsider.download(`/api/assessments/${first.id}/export/perFlow.csv`)).status).toBe(404)
    expect((await new Client().download(`/api/assessments/${first.id}/export/perFlow.csv`)).status).toBe(401)
  })
})

describe('the conventional baseline beside every assessment', () => {
  it('is stored with the result: a screw at the default design flow, and what the scheme gives up against it', () => {
    const b = first.result.baseline
    // ENGINE.md §11: same site, same flow rules; the brief's definitions of the comparison figures
    expect(b).toMatchObject({ kind: 'screw', kindLabel: 'Archimedes screw' })
    expect(b.designFlow_m3s).toBeGreaterThan(0)
    expect(b.annualEnergy_MWh).toBeGreaterThan(first.result.summary.annualEnergy_MWh)
    expect(b.energyGivenUp_MWh).toBeCloseTo(b.annualEnergy_MWh - first.result.summary.annualEnergy_MWh, 6)
    expect(b.designFlowBasis).toMatch(/30 %/)
    expect(first.result.defaultsUsed.map((d: { field: string }) => d.field)).toContain('option.baseline.costs.ratedPowerPrice')
  })

  it('follows the option: another kind and a given design flow', async () => {
    const opt = await createOption(team.engineer, siteId, { name: 'Propeller baseline', design: { baseline: { kind: 'propeller', designFlow_m3s: 3 } } })
    const a = await createAssessment(team.engineer, opt.id)
    expect(a.result.baseline).toMatchObject({ kind: 'propeller', designFlow_m3s: 3, designFlowBasis: 'given with the option' })
    const compared = await team.viewer.get(`/api/compare?options=${opt.id},${optionId}`)
    expect(compared.status).toBe(200)
    expect(compared.body.items[0].baseline).toMatchObject({ kindLabel: 'propeller (Kaplan-type)', annualEnergy_MWh: a.result.baseline.annualEnergy_MWh })
  })

  it('answers 400 naming the field for bad baseline values, on options and on the stateless engine route', async () => {
    const cases: [Record<string, unknown>, RegExp][] = [
      [{ kind: 'water-wheel' }, /^design\.baseline\.kind:/],
      [{ designFlow_m3s: -2 }, /^design\.baseline\.designFlow_m3s:/],
      [{ designFlow_m3s: 'lots' }, /^design\.baseline\.designFlow_m3s:/],
      [{ headLossFraction: 0.9 }, /^design\.baseline\.headLossFraction:/],
      [{ generatorEfficiency: 1.2 }, /^design\.baseline\.generatorEfficiency:/],
      [{ costs: { ratedPowerPrice: -1 } }, /^design\.baseline\.costs\.ratedPowerPrice:/],
    ]
    for (const [baseline, message] of cases) {
      const res = await team.engineer.post(`/api/sites/${siteId}/options`, optionBody({ design: { baseline } }))
      expect(res.status, JSON.stringify(baseline)).toBe(400)
      expect(res.body.message).toMatch(message)
    }
    const stored = (await team.viewer.get(`/api/assessments/${first.id}`)).body
    const bad = await team.viewer.post('/api/engine/assess', { ...stored.input, option: { ...stored.input.option, baseline: { kind: 'water-wheel' } } })
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^option\.baseline\.kind:/)
  })

  it('is added to an option stored before the baseline existed, which still assesses', async () => {
    const opt = await createOption(team.engineer, siteId, { name: 'Stored before the baseline' })
    const row = sqlite.prepare('select design from options where id = ?').get(opt.id) as { design: string }
    const design = JSON.parse(row.design)
    delete design.baseline
    sqlite.prepare('update options set design = ? where id = ?').run(JSON.stringify(design), opt.id)
    const a = await createAssessment(team.engineer, opt.id)
    expect(a.result.baseline.kind).toBe('screw')
    expect((await team.viewer.get(`/api/options/${opt.id}`)).status).toBe(200)
  })
})
