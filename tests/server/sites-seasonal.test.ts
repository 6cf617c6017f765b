import { beforeAll, describe, expect, it } from 'vitest'
import { createSite, makeTeam, siteBody } from './sites-helpers'

let team: Awaited<ReturnType<typeof makeTeam>>

beforeAll(async () => {
  team = await makeTeam('sites-seasonal')
})

const FLOWS = [12, 11, 9, 7, 5, 3.5, 2.8, 2.6, 3.4, 6, 9, 11]

describe('PATCH /api/sites/[id]: month flows, unmeasured oxygen and the weir aeration model', () => {
  it('stores the twelve month flows, a not-measured mark and a measured deficit ratio', async () => {
    const site = await createSite(team.engineer, team.orgId)
    const created = site.months as { flow_m3s?: number }[]
    expect(created[0]).toMatchObject({ upstreamOxygen: { measured: true } })
    expect(created[0]!.flow_m3s).toBeUndefined()
    const months = siteBody().months.map((m, i) => ({ ...m, upstreamOxygen: { ...m.upstreamOxygen, measured: i > 1 }, flow_m3s: FLOWS[i] }))
    const weir = { ...siteBody().weir, aerationModel: 'measured', measuredDeficitRatio: { r: 1.7, temperature_C: 13.5, drowned: false, note: 'Spot survey, July, low flow' } }
    const res = await team.engineer.patch(`/api/sites/${site.id}`, { version: 1, months, weir })
    expect(res.status).toBe(200)
    const stored = (await team.viewer.get(`/api/sites/${site.id}`)).body
    expect(stored.months.map((m: { flow_m3s: number }) => m.flow_m3s)).toEqual(FLOWS)
    expect(stored.months.map((m: { upstreamOxygen: { measured: boolean } }) => m.upstreamOxygen.measured)).toEqual([false, false, true, true, true, true, true, true, true, true, true, true])
    expect(stored.weir).toEqual(weir)

    // A month left blank is stored as not entered; the others stay.
    const partial = months.map((m, i) => (i === 4 ? { ...m, flow_m3s: null } : m))
    const again = await team.engineer.patch(`/api/sites/${site.id}`, { version: 2, months: partial })
    expect(again.status).toBe(200)
    expect(again.body.months[4].flow_m3s).toBeNull()
    expect(again.body.months[5].flow_m3s).toBe(3.5)
  })

  it('answers 400 naming weir.measuredDeficitRatio.r for a ratio below 1, and months.N.flow_m3s for a negative flow, storing nothing', async () => {
    const site = await createSite(team.engineer, team.orgId)
    const weir = { ...siteBody().weir, aerationModel: 'measured', measuredDeficitRatio: { r: 0.5, temperature_C: 12, drowned: false, note: '' } }
    const bad = await team.engineer.patch(`/api/sites/${site.id}`, { version: 1, weir })
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^weir\.measuredDeficitRatio\.r: must be 1 or more/)

    const months = siteBody().months.map((m, i) => ({ ...m, flow_m3s: i === 3 ? -2 : 4 }))
    const badFlow = await team.engineer.patch(`/api/sites/${site.id}`, { version: 1, months })
    expect(badFlow.status).toBe(400)
    expect(badFlow.body.message).toMatch(/^months\.3\.flow_m3s:/)

    const unchanged = (await team.engineer.get(`/api/sites/${site.id}`)).body
    expect(unchanged.version).toBe(1)
    expect(unchanged.weir.measuredDeficitRatio).toBeUndefined()
  })
})
