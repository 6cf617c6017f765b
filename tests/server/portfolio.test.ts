import { beforeAll, describe, expect, it } from 'vitest'
import { Client } from './client'
import { createAssessment, createOption } from './options-helpers'
import { createSite, makeTeam } from './sites-helpers'

let team: Awaited<ReturnType<typeof makeTeam>>
const ids: Record<string, number> = {}
let latestOfAlder: any
let bigger: any
let smaller: any

// Four sites: Alder (two options; the newest assessment is of the second), Birch (one assessment of
// a bigger design), Cedar (never assessed) and "=Danger" on another river (a name a spreadsheet would run).
beforeAll(async () => {
  team = await makeTeam('portfolio')
  for (const [name, river] of [['Alder weir', 'Portfolio Water'], ['Birch weir', 'Portfolio Water'], ['Cedar weir', 'Portfolio Water'], ['=Danger weir', 'Other Beck']] as const) {
    ids[name] = (await createSite(team.engineer, team.orgId, { name, riverName: river })).id
  }
  const alder1 = await createOption(team.engineer, ids['Alder weir']!, { name: 'Alder small', design: { units: 1 } })
  const alder2 = await createOption(team.engineer, ids['Alder weir']!, { name: 'Alder pair' })
  smaller = await createAssessment(team.engineer, alder1.id)
  latestOfAlder = await createAssessment(team.engineer, alder2.id)
  const birch = await createOption(team.engineer, ids['Birch weir']!, { name: 'Birch big', design: { units: 3, throatDiameter_m: 0.6, outletDiameter_m: 1.2 } })
  bigger = await createAssessment(team.engineer, birch.id)
  // A later assessment of a deleted option must not count as the site's latest.
  const gone = await createOption(team.engineer, ids['Birch weir']!, { name: 'Birch deleted' })
  await createAssessment(team.engineer, gone.id)
  expect((await team.engineer.delete(`/api/options/${gone.id}`)).status).toBe(200)
  // Reviews: Alder submitted, Birch submitted then accepted; Cedar and =Danger never submitted (draft).
  expect((await team.engineer.post(`/api/sites/${ids['Alder weir']}/review/submit`, { assessmentId: latestOfAlder.id })).status).toBe(200)
  expect((await team.engineer.post(`/api/sites/${ids['Birch weir']}/review/submit`, { assessmentId: bigger.id })).status).toBe(200)
  expect((await team.reviewer.post(`/api/sites/${ids['Birch weir']}/review/decision`, { decision: 'accepted', reason: 'Oxygen and cost both fine.' })).status).toBe(200)
})

const get = (query = '') => team.viewer.get(`/api/orgs/${team.orgId}/portfolio${query}`)
const names = (rows: { name: string }[]) => rows.map((r) => r.name)

describe('GET /api/orgs/[orgId]/portfolio', () => {
  it('lists the live sites with the headline figures of their latest assessment and their location', async () => {
    const res = await get()
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ page: 1, pageSize: 50, total: 4, sort: 'name', dir: 'asc' })
    expect(names(res.body.rows)).toEqual(['=Danger weir', 'Alder weir', 'Birch weir', 'Cedar weir'])
    const alder = res.body.rows.find((r: { name: string }) => r.name === 'Alder weir')
    expect(alder.location).toEqual({ lat: 54.4, lng: -2.9 })
    expect(alder.latest).toMatchObject({
      assessmentId: latestOfAlder.id,
      optionName: 'Alder pair',
      stale: false,
      annualEnergy_MWh: latestOfAlder.annualEnergy_MWh,
      capacityFactor: latestOfAlder.capacityFactor,
      netOxygenGainSummerLowFlow_mgL: latestOfAlder.netOxygenGainSummerLowFlow_mgL,
      lcoe: latestOfAlder.lcoe,
      minCavitationMargin_m: latestOfAlder.minCavitationMargin_m,
      flagsRaised: latestOfAlder.flagsRaised,
    })
    const birch = res.body.rows.find((r: { name: string }) => r.name === 'Birch weir')
    expect(birch.latest.assessmentId).toBe(bigger.id)
    // How sure: the stored Monte Carlo's P50/P90 energy and chance of a net oxygen loss; no record (an entered curve).
    const mc = latestOfAlder.result.uncertainty
    expect(mc.draws).toBeGreaterThan(0)
    expect(alder.latest).toMatchObject({ energyP50_MWh: mc.energy_MWh.p50, energyP90_MWh: mc.energy_MWh.p90, netLossProbability: mc.netLossProbability, recordP90_MWh: null })
    expect(typeof alder.latest.energyP90_MWh).toBe('number')
    expect(latestOfAlder).toMatchObject({ energyP90_MWh: mc.energy_MWh.p90, recordP90_MWh: null })
    // the pair a reviewer asks for: a conventional turbine at the same weir beside the scheme
    expect(alder.latest.baselineEnergy_MWh).toBe(latestOfAlder.result.baseline.annualEnergy_MWh)
    expect(latestOfAlder.baselineEnergy_MWh).toBe(latestOfAlder.result.baseline.annualEnergy_MWh)
    expect(res.body.rows.find((r: { name: string }) => r.name === 'Cedar weir').latest).toBeNull()
    expect(Object.fromEntries(res.body.rows.map((r: { name: string; reviewState: string }) => [r.name, r.reviewState]))).toEqual({
      '=Danger weir': 'draft', 'Alder weir': 'submitted', 'Birch weir': 'accepted', 'Cedar weir': 'draft',
    })
  })

  it('sorts by review state in the order of the review (draft, submitted, accepted…), ties by site', async () => {
    // Ties (both draft) go by site id in the same direction; Cedar was made before =Danger.
    expect(names((await get('?sort=reviewState&dir=asc')).body.rows)).toEqual(['Cedar weir', '=Danger weir', 'Alder weir', 'Birch weir'])
    expect(names((await get('?sort=reviewState&dir=desc')).body.rows)).toEqual(['Birch weir', 'Alder weir', '=Danger weir', 'Cedar weir'])
  })

  it('filters by review state, a site never submitted counting as draft, with the total to match', async () => {
    const draft = await get('?reviewState=draft')
    expect(names(draft.body.rows)).toEqual(['=Danger weir', 'Cedar weir'])
    expect(draft.body.total).toBe(2)
    expect(names((await get('?reviewState=submitted')).body.rows)).toEqual(['Alder weir'])
    expect(names((await get('?reviewState=accepted')).body.rows)).toEqual(['Birch weir'])
    expect((await get('?reviewState=returned')).body).toMatchObject({ total: 0, rows: [] })
    expect(names((await get('?reviewState=draft&q=cedar')).body.rows)).toEqual(['Cedar weir'])
  })

  it('answers every matching row unpaged for the map (format=map), filters still applied', async () => {
    const map = await get('?format=map&pageSize=1&page=3')
    expect(map.status).toBe(200)
    expect(map.body.total).toBe(4)
    expect(names(map.body.rows)).toEqual(['=Danger weir', 'Alder weir', 'Birch weir', 'Cedar weir'])
    expect(map.body.rows[1].latest.netOxygenGainSummerLowFlow_mgL).toBe(latestOfAlder.netOxygenGainSummerLowFlow_mgL)
    expect(names((await get('?format=map&reviewState=accepted')).body.rows)).toEqual(['Birch weir'])
  })

  it('sorts by an allow-listed figure either way, sites never assessed last', async () => {
    // The two designs differ, so their energies do; the expected order follows the stored figures.
    expect(bigger.annualEnergy_MWh).not.toBe(latestOfAlder.annualEnergy_MWh)
    const highFirst = bigger.annualEnergy_MWh > latestOfAlder.annualEnergy_MWh ? ['Birch weir', 'Alder weir'] : ['Alder weir', 'Birch weir']
    const desc = await get('?sort=annualEnergy_MWh&dir=desc')
    expect(names(desc.body.rows).slice(0, 2)).toEqual(highFirst)
    expect(desc.body.rows.slice(2).every((r: { latest: unknown }) => r.latest === null)).toBe(true)
    const asc = await get('?sort=annualEnergy_MWh&dir=asc')
    expect(names(asc.body.rows).slice(0, 2)).toEqual([...highFirst].reverse())
    expect(asc.body.rows.slice(2).every((r: { latest: unknown }) => r.latest === null)).toBe(true)
    const p90 = (a: any) => a.result.uncertainty.energy_MWh.p90 as number
    expect(p90(bigger)).not.toBe(p90(latestOfAlder))
    const byP90 = await get('?sort=energyP90_MWh&dir=desc')
    expect(byP90.status).toBe(200)
    expect(names(byP90.body.rows).slice(0, 2)).toEqual(p90(bigger) > p90(latestOfAlder) ? ['Birch weir', 'Alder weir'] : ['Alder weir', 'Birch weir'])
    expect(byP90.body.rows.slice(2).every((r: { latest: unknown }) => r.latest === null)).toBe(true)
    for (const sort of ['baselineEnergy_MWh', 'capacityFactor', 'lcoe', 'netOxygenGainSummerLowFlow_mgL', 'minCavitationMargin_m', 'ratedPower_kW', 'flagsRaised', 'assessedAt', 'riverName', 'grossHead_m']) {
      const res = await get(`?sort=${sort}&dir=desc`)
      expect(res.status, sort).toBe(200)
      expect(res.body.total, sort).toBe(4)
    }
    const byDate = await get('?sort=assessedAt&dir=desc')
    expect(names(byDate.body.rows)[0]).toBe('Birch weir')
  })

  it('filters by text, river and whether assessed', async () => {
    expect(names((await get('?q=birch')).body.rows)).toEqual(['Birch weir'])
    expect(names((await get('?q=%25')).body.rows)).toEqual([])
    expect(names((await get('?river=other%20beck')).body.rows)).toEqual(['=Danger weir'])
    expect(names((await get('?assessed=yes')).body.rows)).toEqual(['Alder weir', 'Birch weir'])
    expect(names((await get('?assessed=no')).body.rows)).toEqual(['=Danger weir', 'Cedar weir'])
  })

  it('pages, and still counts the total on a page past the end', async () => {
    const page2 = await get('?pageSize=1&page=2')
    expect(page2.body).toMatchObject({ page: 2, pageSize: 1, total: 4 })
    expect(names(page2.body.rows)).toEqual(['Alder weir'])
    const past = await get('?pageSize=2&page=9')
    expect(past.body.rows).toEqual([])
    expect(past.body.total).toBe(4)
  })

  it('leaves out deleted sites', async () => {
    const site = await createSite(team.engineer, team.orgId, { name: 'Short-lived weir' })
    expect((await get()).body.total).toBe(5)
    expect((await team.engineer.delete(`/api/sites/${site.id}`)).status).toBe(200)
    expect((await get()).body.total).toBe(4)
  })

  it('answers 400 naming the field for a bad query', async () => {
    for (const [query, field] of [['?sort=password', 'sort'], ['?dir=up', 'dir'], ['?page=0', 'page'], ['?pageSize=500', 'pageSize'], ['?assessed=maybe', 'assessed'], ['?format=xml', 'format'], ['?reviewState=maybe', 'reviewState']]) {
      const res = await get(query)
      expect(res.status, query).toBe(400)
      expect(res.body.message, query).toMatch(new RegExp(`^${field}:`))
    }
  })

  it('lets every role read; 404 to an outsider, 401 signed out', async () => {
    for (const who of ['admin', 'engineer', 'reviewer', 'viewer'] as const) {
      expect((await team[who].get(`/api/orgs/${team.orgId}/portfolio`)).status, who).toBe(200)
    }
    expect((await team.outsider.get(`/api/orgs/${team.orgId}/portfolio`)).status).toBe(404)
    expect((await new Client().get(`/api/orgs/${team.orgId}/portfolio`)).status).toBe(401)
  })

  it('exports the same rows as CSV, every page, units in the header, formulas defused', async () => {
    const res = await team.viewer.download(`/api/orgs/${team.orgId}/portfolio?format=csv&sort=annualEnergy_MWh&dir=desc&pageSize=1`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename=".+\.csv"$/)
    const text = new TextDecoder().decode(res.bytes)
    expect(text.endsWith('\r\n')).toBe(true) // RFC 4180, 2.2: the last record may end with a line break; Gillwatt's CSVs always do
    const lines = text.trim().split(/\r\n/)
    expect(lines[0]).toContain('Annual energy (MWh/yr)')
    expect(lines[0]).toContain('Net oxygen gain at summer low flow (mg/L)')
    const header = lines[0]!.split(',')
    const cells = (name: string) => lines.find((l) => l.includes(name))!.split(',')
    const p90At = header.indexOf('P90 annual energy of the Monte Carlo (MWh/yr)')
    const chanceAt = header.indexOf('Chance of a net oxygen loss in the worst month (-)')
    expect(p90At).toBeGreaterThan(0)
    expect(chanceAt).toBeGreaterThan(0)
    expect(Number(cells('Alder weir')[p90At])).toBe(latestOfAlder.result.uncertainty.energy_MWh.p90)
    expect(Number(cells('Alder weir')[chanceAt])).toBe(latestOfAlder.result.uncertainty.netLossProbability)
    expect(cells('Cedar weir')[p90At]).toBe('')
    expect(lines).toHaveLength(5)
    const top = bigger.annualEnergy_MWh > latestOfAlder.annualEnergy_MWh ? { name: 'Birch weir', a: bigger } : { name: 'Alder weir', a: latestOfAlder }
    expect(lines[1]).toMatch(new RegExp(`^${ids[top.name]},${top.name},Portfolio Water,`))
    expect(lines[1]).toContain(`,${top.a.annualEnergy_MWh},`)
    expect(lines.find((l) => l.includes('Danger'))).toMatch(/^\d+,'=Danger weir,/)
    expect(lines[0]!.split(',').at(-1)).toBe('Review state')
    expect(lines.find((l) => l.includes('Alder weir'))!.split(',').at(-1)).toBe('submitted')
    expect(lines.find((l) => l.includes('Cedar weir'))!.split(',').at(-1)).toBe('draft')
    const filtered = new TextDecoder().decode((await team.viewer.download(`/api/orgs/${team.orgId}/portfolio?format=csv&reviewState=accepted`)).bytes).trim().split(/\r\n/)
    expect(filtered).toHaveLength(2)
    expect(filtered[1]).toMatch(new RegExp(`^${ids['Birch weir']},Birch weir,`))
    expect((await team.outsider.download(`/api/orgs/${team.orgId}/portfolio?format=csv`)).status).toBe(404)
  })

  it('keeps the smaller option\'s assessment, only not as the latest', async () => {
    const kept = await team.viewer.get(`/api/assessments/${smaller.id}`)
    expect(kept.status).toBe(200)
  })
})
