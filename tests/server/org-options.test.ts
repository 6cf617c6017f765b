import { beforeAll, describe, expect, it } from 'vitest'
import { Client } from './client'
import { createAssessment, createOption } from './options-helpers'
import { createSite, makeTeam } from './sites-helpers'

// GET /api/orgs/[orgId]/options: the comparison picker's one request for every live site of the
// organisation with its live options, instead of one request per site.
let team: Awaited<ReturnType<typeof makeTeam>>
let other: Awaited<ReturnType<typeof makeTeam>>
const ids: Record<string, number> = {}

beforeAll(async () => {
  team = await makeTeam('org-options')
  other = await makeTeam('org-options-other')
  const beck = await createSite(team.engineer, team.orgId, { name: 'Beck weir' })
  const aldby = await createSite(team.engineer, team.orgId, { name: 'Aldby weir', riverName: 'Aldby Water' })
  const gone = await createSite(team.engineer, team.orgId, { name: 'Cold weir' })
  await createSite(other.engineer, other.orgId, { name: 'Elsewhere weir' })
  ids.beck = beck.id
  ids.aldby = aldby.id
  ids.beckOne = (await createOption(team.engineer, beck.id, { name: 'Beck one', design: { units: 1 } })).id
  ids.beckTwo = (await createOption(team.engineer, beck.id, { name: 'Beck two' })).id
  ids.beckDeleted = (await createOption(team.engineer, beck.id, { name: 'Beck deleted' })).id
  ids.goneOption = (await createOption(team.engineer, gone.id, { name: 'On a deleted site' })).id
  await createAssessment(team.engineer, ids.beckTwo)
  expect((await team.engineer.delete(`/api/options/${ids.beckDeleted}`)).status).toBe(200)
  expect((await team.engineer.delete(`/api/sites/${gone.id}`)).status).toBe(200)
})

describe('GET /api/orgs/[orgId]/options', () => {
  it('answers every live site by name with its live options, oldest first, and their newest assessments', async () => {
    const res = await team.viewer.get(`/api/orgs/${team.orgId}/options`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ page: 1, pageSize: 200, total: 2 })
    expect(res.body.sites.map((s: { siteName: string }) => s.siteName)).toEqual(['Aldby weir', 'Beck weir'])
    const [aldby, beck] = res.body.sites
    expect(aldby).toMatchObject({ siteId: ids.aldby, riverName: 'Aldby Water', options: [] })
    expect(beck.siteId).toBe(ids.beck)
    expect(beck.options.map((o: { id: number }) => o.id)).toEqual([ids.beckOne, ids.beckTwo])
    expect(beck.options[0]).toMatchObject({ name: 'Beck one', latestAssessment: null })
    expect(beck.options[0].design.units).toBe(1)
    expect(beck.options[1].latestAssessment).toMatchObject({ optionId: ids.beckTwo })
    // The same options as the per-site route answers.
    const perSite = await team.viewer.get(`/api/sites/${ids.beck}/options`)
    expect(beck.options).toEqual(perSite.body.options)
  })

  it('pages the sites: total counts them all', async () => {
    const second = await team.reviewer.get(`/api/orgs/${team.orgId}/options?page=2&pageSize=1`)
    expect(second.status).toBe(200)
    expect(second.body).toMatchObject({ page: 2, pageSize: 1, total: 2 })
    expect(second.body.sites.map((s: { siteId: number }) => s.siteId)).toEqual([ids.beck])
    const past = await team.reviewer.get(`/api/orgs/${team.orgId}/options?page=3&pageSize=1`)
    expect(past.body.sites).toEqual([])
  })

  it('answers 400 naming the field for a page size over 200 or junk paging', async () => {
    for (const [query, field] of [['pageSize=201', 'pageSize'], ['pageSize=0', 'pageSize'], ['page=0', 'page'], ['page=x', 'page']] as const) {
      const res = await team.viewer.get(`/api/orgs/${team.orgId}/options?${query}`)
      expect(res.status, query).toBe(400)
      expect(res.body.message, query).toMatch(new RegExp(`^${field}`))
    }
  })

  it('answers 404 to people outside the organisation and 401 signed out', async () => {
    expect((await team.outsider.get(`/api/orgs/${team.orgId}/options`)).status).toBe(404)
    expect((await other.admin.get(`/api/orgs/${team.orgId}/options`)).status).toBe(404)
    const mine = await other.viewer.get(`/api/orgs/${other.orgId}/options`)
    expect(mine.body.sites.map((s: { siteName: string }) => s.siteName)).toEqual(['Elsewhere weir'])
    expect((await new Client().get(`/api/orgs/${team.orgId}/options`)).status).toBe(401)
  })
})
