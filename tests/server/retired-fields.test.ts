import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import { createOption, optionBody } from './options-helpers'
import { createSite, makeTeam, siteBody } from './sites-helpers'

// Quantities are named with their unit after an underscore. A caller still sending a name from
// before (this file keeps them on purpose) is refused with a 400 naming the field and its new name,
// and nothing is stored: the schemas drop unknown keys, so the value would otherwise be lost silently.

let team: Awaited<ReturnType<typeof makeTeam>>
let siteId: number

beforeAll(async () => {
  team = await makeTeam('retired')
  siteId = (await createSite(team.engineer, team.orgId, { name: 'Renamed fields weir' })).id
})

const example = (name: string) => JSON.parse(readFileSync(join(process.cwd(), `docs/examples/${name}.request.json`), 'utf8')) as Record<string, any>
const issuePaths = (body: { data?: { issues?: { path: string }[] } }) => (body.data?.issues ?? []).map((i) => i.path)

describe('a site body with the old unit names', () => {
  it('is refused on create, naming each old field and its new name, and stores nothing', async () => {
    const before = (await team.admin.get(`/api/orgs/${team.orgId}/sites`)).body.total
    const body = siteBody({
      altitude_m: undefined,
      altitudeM: 120,
      weir: { grossHeadM: 2.1, crestWidthM: 14, shape: 'sharp-crested-vertical-face', waterQuality: 'clean' },
      catchment: { siteAreaKm2: 10, gaugeAreaKm2: 12 },
      targetOxygenMgL: 7,
      months: Array.from({ length: 12 }, () => ({ waterTempC: 10, upstreamOxygen: { value: 9, unit: 'mg/L' } })),
    })
    const res = await team.engineer.post(`/api/orgs/${team.orgId}/sites`, body)
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('weir.grossHeadM: is no longer accepted: the field is now called grossHead_m (and 17 more)')
    expect(issuePaths(res.body)).toEqual([
      'weir.grossHeadM', 'weir.crestWidthM', ...Array.from({ length: 12 }, (_, i) => `months.${i}.waterTempC`),
      'altitudeM', 'catchment.siteAreaKm2', 'catchment.gaugeAreaKm2', 'targetOxygenMgL',
    ])
    expect(res.body.data.issues.find((i: { path: string }) => i.path === 'weir.grossHeadM').message).toBe('is no longer accepted: the field is now called grossHead_m')
    expect((await team.admin.get(`/api/orgs/${team.orgId}/sites`)).body.total).toBe(before)
  })

  it('is refused on change, leaving the site as it was', async () => {
    const site = (await team.engineer.get(`/api/sites/${siteId}`)).body
    const res = await team.engineer.patch(`/api/sites/${siteId}`, { version: site.version, targetOxygenMgL: 8 })
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('targetOxygenMgL: is no longer accepted: the field is now called targetOxygen_mgL')
    const after = (await team.engineer.get(`/api/sites/${siteId}`)).body
    expect(after.version).toBe(site.version)
    expect(after.targetOxygen_mgL).toBe(site.targetOxygen_mgL)
  })

  it('is taken under the new names', async () => {
    const site = (await team.engineer.get(`/api/sites/${siteId}`)).body
    const res = await team.engineer.patch(`/api/sites/${siteId}`, { version: site.version, targetOxygen_mgL: 8, altitude_m: 150 })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ targetOxygen_mgL: 8, altitude_m: 150 })
  })
})

describe('an option or engine body with the old money names', () => {
  it('is refused for a stored option, naming the path', async () => {
    const cost = await team.engineer.post(`/api/sites/${siteId}/options`, optionBody({ design: { costs: { costPerKw: 5000 } } }))
    expect(cost.status).toBe(400)
    expect(cost.body.message).toBe('design.costs.costPerKw: is no longer accepted: the field is now called ratedPowerPrice')
    const option = await createOption(team.engineer, siteId)
    const life = await team.engineer.patch(`/api/options/${option.id}`, { version: option.version, settings: { lifeYears: 40 } })
    expect(life.status).toBe(400)
    expect(life.body.message).toBe('settings.lifeYears: is no longer accepted: the field is now called life_yr')
  })

  it('is refused by the engine routes, inside the input', async () => {
    const assess = example('assess')
    assess.settings = { lifeYears: 40 }
    const one = await team.viewer.post('/api/engine/assess', assess)
    expect(one.status).toBe(400)
    expect(one.body.message).toMatch(/^settings\.lifeYears: is no longer accepted: the field is now called life_yr/)
    const sweep = example('sweep')
    sweep.input.option.costs = { costPerKw: 5000 }
    const two = await team.viewer.post('/api/engine/sweep', sweep)
    expect(two.status).toBe(400)
    expect(two.body.message).toMatch(/^input\.option\.costs\.costPerKw: is no longer accepted: the field is now called ratedPowerPrice/)
  })
})

describe('an option or engine body with civils per unit (replaced by civils per m³/s of design flow)', () => {
  it('is refused, naming the new field, and stores nothing', async () => {
    const before = (await team.engineer.get(`/api/sites/${siteId}/options`)).body
    const res = await team.engineer.post(`/api/sites/${siteId}/options`, optionBody({ name: 'Civils per unit', design: { costs: { civilsPerUnit: 40_000 } } }))
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('design.costs.civilsPerUnit: is no longer accepted: civil works are now priced per m³/s of the design flow, in civilsPerDesignFlow')
    expect((await team.engineer.get(`/api/sites/${siteId}/options`)).body).toEqual(before)
    const option = await createOption(team.engineer, siteId)
    const patch = await team.engineer.patch(`/api/options/${option.id}`, { version: option.version, design: { ...(option.design as object), costs: { fixedCost: 1, civilsPerUnit: 2 } } })
    expect(patch.status).toBe(400)
    expect(patch.body.message).toMatch(/^design\.costs\.civilsPerUnit: .*civilsPerDesignFlow/)
    const assess = example('assess')
    assess.option.costs = { civilsPerUnit: 40_000 }
    const one = await team.viewer.post('/api/engine/assess', assess)
    expect(one.status).toBe(400)
    expect(one.body.message).toMatch(/^option\.costs\.civilsPerUnit: .*civilsPerDesignFlow/)
  })

  it('is taken under the new name', async () => {
    const res = await team.engineer.post(`/api/sites/${siteId}/options`, optionBody({ name: 'Civils per flow', design: { costs: { civilsPerDesignFlow: 90_000 } } }))
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body.design.costs.civilsPerDesignFlow).toBe(90_000)
  })
})

describe('other bodies, forms and queries with the old names', () => {
  it('refuses a summary link asked for in days under the old name, and makes none', async () => {
    const res = await team.engineer.post(`/api/sites/${siteId}/summary-links`, { expiresInDays: 3 })
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('expiresInDays: is no longer accepted: the field is now called expiresIn_d')
    expect((await team.engineer.get(`/api/sites/${siteId}/summary-links`)).body.total).toBe(0)
  })

  it('refuses a flow record whose form names the catchment areas the old way, and stores no record', async () => {
    const file = { name: 'flows.csv', type: 'text/csv', data: 'date,flow\n2020-01-01,3\n2020-01-02,2\n' }
    const res = await team.engineer.upload(`/api/sites/${siteId}/flow-record`, { file }, { siteAreaKm2: '10', gaugeAreaKm2: '12' })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^siteAreaKm2: is no longer accepted: the field is now called siteArea_km2/)
    expect((await team.engineer.get(`/api/sites/${siteId}`)).body.flowRecord).toBeNull()
  })

  it('refuses the old sort names of the site list and the portfolio, naming the new ones', async () => {
    const list = await team.viewer.get(`/api/orgs/${team.orgId}/sites?sort=grossHeadM`)
    expect(list.status).toBe(400)
    expect(list.body.message).toMatch(/^sort: must be one of .*grossHead_m/)
    const portfolio = await team.viewer.get(`/api/orgs/${team.orgId}/portfolio?sort=annualEnergyMWh`)
    expect(portfolio.status).toBe(400)
    expect(portfolio.body.message).toMatch(/^sort: must be one of .*annualEnergy_MWh/)
  })
})
