import { beforeAll, describe, expect, it } from 'vitest'
import { Client, addMember, signUp } from './client'
import { createAssessment, createOption } from './options-helpers'
import { createSite, makeTeam } from './sites-helpers'

// Two organisations; one person is a viewer in the first and a reviewer in the second, so they may
// compare options across both. The outsider of the first team belongs to neither.
let north: Awaited<ReturnType<typeof makeTeam>>
let south: Awaited<ReturnType<typeof makeTeam>>
let both: Client
const opt: number[] = []
let assessed: any

beforeAll(async () => {
  north = await makeTeam('compare-north')
  south = await makeTeam('compare-south')
  const person = await signUp('compare-both')
  await addMember(north.admin, north.orgId, person, 'viewer')
  await addMember(south.admin, south.orgId, person, 'reviewer')
  both = person.client
  const n1 = await createSite(north.engineer, north.orgId, { name: 'North weir' })
  const n2 = await createSite(north.engineer, north.orgId, { name: 'North drop' })
  const s1 = await createSite(south.engineer, south.orgId, { name: 'South weir', riverName: 'South Water' })
  for (const [site, name, units] of [[n1.id, 'N one', 1], [n1.id, 'N two', 2], [n2.id, 'N drop', 2], [s1.id, 'S pair', 2], [s1.id, 'S three', 3], [s1.id, 'S four', 4], [s1.id, 'S five', 5]] as const) {
    opt.push((await createOption(site === s1.id ? south.engineer : north.engineer, site, { name, design: { units } })).id)
  }
  assessed = await createAssessment(north.engineer, opt[1]!)
})

describe('GET /api/compare', () => {
  it('puts 2 to 6 options side by side, across the organisations the user belongs to, in the order asked', async () => {
    const res = await both.get(`/api/compare?options=${opt[3]},${opt[1]},${opt[0]}`)
    expect(res.status).toBe(200)
    expect(res.body.items.map((i: { option: { id: number } }) => i.option.id)).toEqual([opt[3], opt[1], opt[0]])
    const [south1, north2, north1] = res.body.items
    expect(south1.site).toMatchObject({ name: 'South weir', riverName: 'South Water', orgId: south.orgId })
    expect(south1.option).toMatchObject({ name: 'S pair', version: 1 })
    expect(south1.option.design.units).toBe(2)
    expect(typeof south1.option.settings.discountRate).toBe('number')
    expect(south1.latestAssessment).toBeNull()
    expect(north2.latestAssessment).toMatchObject({ id: assessed.id, annualEnergy_MWh: assessed.annualEnergy_MWh, lcoe: assessed.lcoe, stale: false })
    // How sure: the stored Monte Carlo's figures (an entered curve has no record P90 year).
    const mc = assessed.result.uncertainty
    expect(mc.draws).toBeGreaterThan(0)
    expect(north2.latestAssessment).toMatchObject({ energyP50_MWh: mc.energy_MWh.p50, energyP90_MWh: mc.energy_MWh.p90, netLossProbability: mc.netLossProbability, recordP90_MWh: null })
    expect(typeof north2.latestAssessment.energyP90_MWh).toBe('number')
    expect(north1.site.orgId).toBe(north.orgId)
    const six = await both.get(`/api/compare?options=${opt.slice(0, 6).join(',')}`)
    expect(six.status).toBe(200)
    expect(six.body.items).toHaveLength(6)
  })

  it('answers 400 naming options for fewer than 2, more than 6, repeats, junk or none', async () => {
    for (const query of [`?options=${opt[0]}`, `?options=${opt.join(',')}`, `?options=${opt[0]},${opt[0]}`, '?options=a,b', '?options=', '']) {
      const res = await both.get(`/api/compare${query}`)
      expect(res.status, query).toBe(400)
      expect(res.body.message, query).toMatch(/^options/)
    }
  })

  it('answers 404 naming the option when any is not visible, missing or deleted; 401 signed out', async () => {
    const hidden = await north.outsider.get(`/api/compare?options=${opt[0]},${opt[1]}`)
    expect(hidden.status).toBe(404)
    expect(hidden.body.message).toBe(`options: option ${opt[0]} not found`)
    // A member of the south only cannot see a northern option even beside a southern one.
    const partly = await south.viewer.get(`/api/compare?options=${opt[3]},${opt[1]}`)
    expect(partly.status).toBe(404)
    expect(partly.body.message).toBe(`options: option ${opt[1]} not found`)
    expect((await both.get(`/api/compare?options=${opt[0]},99999999`)).status).toBe(404)
    const gone = await createOption(north.engineer, (await createSite(north.engineer, north.orgId, { name: 'Gone weir' })).id, { name: 'Gone' })
    expect((await north.engineer.delete(`/api/options/${gone.id}`)).status).toBe(200)
    expect((await north.admin.get(`/api/compare?options=${opt[0]},${gone.id}`)).status).toBe(404)
    expect((await new Client().get(`/api/compare?options=${opt[0]},${opt[1]}`)).status).toBe(401)
  })
})
