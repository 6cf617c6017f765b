import { createHash } from 'node:crypto'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { Client } from './client'
import { createAssessment, createOption } from './options-helpers'
import { daysAgo, makePeople, siteWithAssessment, testDb } from './review-helpers'
import { createSite } from './sites-helpers'

// Summary links: made by engineers and admins, shown once, stored hashed, listed with views,
// revocable; the public summary needs no sign-in, shows only the landowner fields of its own site,
// allows no write, and answers an unknown, expired or revoked token with the same 404.

let team: Awaited<ReturnType<typeof makePeople>>
let site: Awaited<ReturnType<typeof siteWithAssessment>>
let otherSiteId: number
let foreignSiteId: number
const OTHER_NAME = 'Neighbouring weir not to show'
const FOREIGN_NAME = 'Foreign org weir not to show'
const sha256 = (s: string) => createHash('sha256').update(s).digest('hex')
const anon = () => new Client()

const makeLink = async (siteId = site.siteId, body: Record<string, unknown> = { note: 'For the landowner' }) => {
  const res = await team.engineer.client.post(`/api/sites/${siteId}/summary-links`, body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body as { id: number; token: string; url: string; path: string; expiresAt: string }
}

beforeAll(async () => {
  team = await makePeople('sl')
  site = await siteWithAssessment(team.engineer.client, team.orgId, 'Summary weir')
  otherSiteId = (await siteWithAssessment(team.engineer.client, team.orgId, OTHER_NAME)).siteId
  foreignSiteId = (await createSite(team.outsider.client, team.outsiderOrgId, { name: FOREIGN_NAME })).id
})

describe('making a summary link', () => {
  it('returns the link once, to engineers and admins, and stores only its hash', async () => {
    const link = await makeLink()
    expect(link.token).toMatch(/^[A-Za-z0-9_-]{22}$/)
    expect(link.path).toBe(`/s/${link.token}`)
    expect(link.url).toBe(`http://localhost:3000/s/${link.token}`)
    const days = (Date.parse(link.expiresAt) - Date.now()) / 86_400_000
    expect(days).toBeGreaterThan(29.9)
    expect(days).toBeLessThanOrEqual(30)
    const row = testDb().prepare('select * from summary_links where id = ?').get(link.id) as Record<string, unknown>
    expect(row.token_hash).toBe(sha256(link.token))
    expect(JSON.stringify(row)).not.toContain(link.token)
    const admin = await team.admin.client.post(`/api/sites/${site.siteId}/summary-links`, { expiresIn_d: 1 })
    expect(admin.status).toBe(201)
  })

  it('is refused to reviewers and viewers (403), outsiders (404) and the signed-out (401)', async () => {
    for (const who of ['reviewer', 'viewer'] as const) expect((await team[who].client.post(`/api/sites/${site.siteId}/summary-links`, {})).status, who).toBe(403)
    expect((await team.outsider.client.post(`/api/sites/${site.siteId}/summary-links`, {})).status).toBe(404)
    expect((await anon().post(`/api/sites/${site.siteId}/summary-links`, {})).status).toBe(401)
  })

  it('names the bad field with 400', async () => {
    for (const [body, field] of [
      [{ expiresIn_d: 0 }, 'expiresIn_d'],
      [{ expiresIn_d: 366 }, 'expiresIn_d'],
      [{ expiresIn_d: 2.5 }, 'expiresIn_d'],
      [{ expiresIn_d: 'soon' }, 'expiresIn_d'],
      [{ note: 'x'.repeat(501) }, 'note'],
      [{ note: 42 }, 'note'],
    ] as const) {
      const res = await team.engineer.client.post(`/api/sites/${site.siteId}/summary-links`, body)
      expect(res.status, JSON.stringify(body).slice(0, 50)).toBe(400)
      expect(res.body.message).toMatch(new RegExp(`^${field}:`))
    }
  })
})

describe('the public summary', () => {
  let link: Awaited<ReturnType<typeof makeLink>>
  beforeAll(async () => {
    link = await makeLink()
  })

  it('needs no sign-in and shows the landowner fields', async () => {
    const res = await anon().get(`/api/public/summary/${link.token}`)
    expect(res.status).toBe(200)
    expect(res.headers.get('cache-control')).toBe('no-store')
    expect(res.headers.get('referrer-policy')).toBe('no-referrer')
    const s = res.body
    expect(s.site).toMatchObject({ name: 'Summary weir', riverName: 'Test Water', location: { lat: 54.4, lng: -2.9 } })
    expect(s.site.reach.type).toBe('LineString')
    expect(s.scheme).toMatchObject({ units: 2, throatDiameter_m: 0.5, outletDiameter_m: 1 })
    expect(s.scheme.description).toMatch(/venturi units/)
    const stored = (await team.engineer.client.get(`/api/assessments/${site.assessmentId}`)).body
    expect(s.energy).toMatchObject({ annualEnergy_MWh: stored.annualEnergy_MWh, annualUsePerHome_kWh: 2700, source: 'illustrative' })
    expect(s.energy.homesEquivalent).toBe(Math.floor((stored.annualEnergy_MWh * 1000) / 2700))
    expect(s.river.months).toHaveLength(12)
    // How sure, from the stored Monte Carlo: its numbers, and the plain sentences made from them.
    const mc = stored.result.uncertainty
    expect(s.howSure).toMatchObject({ recordP90Energy_MWh: null, energyP90_MWh: mc.energy_MWh.p90, netLossProbability: mc.netLossProbability })
    expect(s.howSure.sentences).toHaveLength(2)
    expect(s.howSure.sentences[0]).toMatch(/^In 9 draws of 10 of the uncertain inputs, the scheme would make at least [\d.,]+ MWh in an average year\.$/)
    expect(s.howSure.sentences[1]).toMatch(/the river would lose .*oxygen in its worst month\.$/)
    expect(s.review).toMatchObject({ state: 'draft', decisionText: null })
    expect(s.cautions.length).toBeGreaterThanOrEqual(4)
    expect(s.contact).toEqual({ organisationName: 'Org of sl-admin', preparedBy: 'Test sl-engineer' })
  })

  it('never shows an e-mail address, another site, or any id', async () => {
    const res = await anon().get(`/api/public/summary/${link.token}`)
    const json = JSON.stringify(res.body)
    expect(json).not.toMatch(/@/)
    expect(json).not.toContain(OTHER_NAME)
    expect(json).not.toContain(FOREIGN_NAME)
    const keys: string[] = []
    const walk = (v: unknown) => {
      if (Array.isArray(v)) v.forEach(walk)
      else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) {
        keys.push(k)
        walk(x)
      }
    }
    walk(res.body)
    expect(keys.filter((k) => /id$/i.test(k) || /_id/i.test(k))).toEqual([])
    for (const id of [site.siteId, otherSiteId, foreignSiteId, site.optionId, site.assessmentId]) expect(json).not.toMatch(new RegExp(`"(id|siteId|optionId|assessmentId)":${id}\\b`))
  })

  it('counts each view, and a signed-in GET sees the same summary', async () => {
    const before = (testDb().prepare('select view_count from summary_links where id = ?').get(link.id) as { view_count: number }).view_count
    const a = await anon().get(`/api/public/summary/${link.token}`)
    const b = await team.engineer.client.get(`/api/public/summary/${link.token}`)
    expect(b.body).toEqual(a.body)
    const list = await team.engineer.client.get(`/api/sites/${site.siteId}/summary-links`)
    const mine = list.body.links.find((l: { id: number }) => l.id === link.id)
    expect(mine.viewCount).toBe(before + 2)
    expect(mine.lastViewedAt).not.toBeNull()
  })

  it('allows no write by any method, and nothing changes', async () => {
    const snapshot = () => ({
      link: testDb().prepare('select view_count, revoked_at, expires_at, note from summary_links where id = ?').get(link.id),
      site: testDb().prepare('select name, version, deleted_at from sites where id = ?').get(site.siteId),
      review: testDb().prepare('select count(*) as n from review_events where site_id = ?').get(site.siteId),
      comments: testDb().prepare('select count(*) as n from comments where site_id = ?').get(site.siteId),
    })
    const before = snapshot()
    for (const method of ['POST', 'PUT', 'PATCH', 'DELETE']) {
      for (const client of [anon(), team.admin.client]) {
        const res = await client.request(method, `/api/public/summary/${link.token}`, { name: 'Hacked', revoked: true, viewCount: 0 })
        expect(res.status, method).toBe(405)
        expect(res.headers.get('allow')).toBe('GET, HEAD')
      }
    }
    // HEAD reads without counting a view.
    expect((await anon().request('HEAD', `/api/public/summary/${link.token}`)).status).toBe(200)
    expect(snapshot()).toEqual(before)
    expect((await anon().get(`/api/public/summary/${link.token}`)).status).toBe(200)
  })

  it('answers unknown, malformed, expired and revoked tokens with the same 404', async () => {
    const expired = await makeLink()
    testDb().prepare('update summary_links set expires_at = ? where id = ?').run(daysAgo(1), expired.id)
    const revoked = await makeLink()
    expect((await team.engineer.client.delete(`/api/summary-links/${revoked.id}`)).status).toBe(200)
    const answers = []
    for (const token of ['AAAAAAAAAAAAAAAAAAAAAA', 'not a token at all', 'x'.repeat(300), expired.token, revoked.token, `${link.token}x`]) {
      const res = await anon().get(`/api/public/summary/${encodeURIComponent(token)}`)
      expect(res.status, token.slice(0, 30)).toBe(404)
      answers.push(res.body.message)
    }
    expect(new Set(answers).size).toBe(1)
    expect(answers[0]).toMatch(/does not work/)
    // The page at such a link is a 404 for the browser too, and the neutral page names nothing.
    for (const token of ['AAAAAAAAAAAAAAAAAAAAAA', revoked.token]) {
      const page = await fetch(`${inject('baseURL')}/s/${token}`, { headers: { accept: 'text/html' } })
      expect(page.status, token.slice(0, 8)).toBe(404)
      expect(await page.text()).toContain('data-testid="summary-unavailable"')
    }
    expect((await fetch(`${inject('baseURL')}/s/${link.token}`, { headers: { accept: 'text/html' } })).status).toBe(200)
  })

  it('stops working when its site is deleted', async () => {
    const s = await siteWithAssessment(team.engineer.client, team.orgId, 'Soon deleted weir')
    const l = await makeLink(s.siteId)
    expect((await anon().get(`/api/public/summary/${l.token}`)).status).toBe(200)
    const del = await team.admin.client.delete(`/api/sites/${s.siteId}`)
    expect(del.status).toBeLessThan(300)
    expect((await anon().get(`/api/public/summary/${l.token}`)).status).toBe(404)
  })

  it('takes its figures from the assessment under review over a later one, and shows the decision', async () => {
    const s = await siteWithAssessment(team.engineer.client, team.orgId, 'Under review weir')
    await team.engineer.client.post(`/api/sites/${s.siteId}/review/submit`, { assessmentId: s.assessmentId })
    await team.reviewer.client.post(`/api/sites/${s.siteId}/review/decision`, { decision: 'accepted-with-conditions', reason: 'Gain is real', conditions: 'Keep the fish pass open' })
    const bigger = await createOption(team.engineer.client, s.siteId, { name: 'Bigger', design: { units: 4 } })
    await createAssessment(team.engineer.client, bigger.id)
    const l = await makeLink(s.siteId)
    const res = await anon().get(`/api/public/summary/${l.token}`)
    const underReview = (await team.engineer.client.get(`/api/assessments/${s.assessmentId}`)).body
    expect(res.body.basis.kind).toBe('under-review')
    expect(res.body.scheme.units).toBe(2)
    expect(res.body.energy.annualEnergy_MWh).toBe(underReview.annualEnergy_MWh)
    expect(res.body.review).toMatchObject({ state: 'accepted-with-conditions', decisionText: 'Gain is real', conditions: 'Keep the fish pass open' })
  })
})

describe('listing and revoking', () => {
  it('lists a site\'s links with note, dates, state and views but never a token, to engineers and admins', async () => {
    const link = await makeLink(site.siteId, { note: 'For Tobias', expiresIn_d: 10 })
    const res = await team.engineer.client.get(`/api/sites/${site.siteId}/summary-links`)
    expect(res.status).toBe(200)
    const row = res.body.links.find((l: { id: number }) => l.id === link.id)
    expect(row).toMatchObject({ note: 'For Tobias', state: 'active', viewCount: 0, revokedAt: null, siteName: 'Summary weir', createdBy: { id: team.engineer.id } })
    expect(JSON.stringify(res.body)).not.toContain(link.token)
    expect(Object.keys(row)).not.toContain('token')
    for (const who of ['reviewer', 'viewer'] as const) expect((await team[who].client.get(`/api/sites/${site.siteId}/summary-links`)).status).toBe(403)
    expect((await team.outsider.client.get(`/api/sites/${site.siteId}/summary-links`)).status).toBe(404)
  })

  it('lists every link of the organisation to admins only, with a state filter', async () => {
    const res = await team.admin.client.get(`/api/orgs/${team.orgId}/summary-links?state=revoked`)
    expect(res.status).toBe(200)
    expect(res.body.links.length).toBeGreaterThan(0)
    expect(res.body.links.every((l: { state: string }) => l.state === 'revoked')).toBe(true)
    const all = await team.admin.client.get(`/api/orgs/${team.orgId}/summary-links?pageSize=200`)
    expect(new Set(all.body.links.map((l: { siteName: string }) => l.siteName))).toContain('Under review weir')
    expect((await team.engineer.client.get(`/api/orgs/${team.orgId}/summary-links`)).status).toBe(403)
    expect((await team.outsider.client.get(`/api/orgs/${team.orgId}/summary-links`)).status).toBe(404)
    expect((await team.admin.client.get(`/api/orgs/${team.orgId}/summary-links?state=old`)).body.message).toMatch(/^state:/)
  })

  it('revokes for engineers and admins of the organisation only, once, with an audit entry', async () => {
    const link = await makeLink()
    expect((await team.viewer.client.delete(`/api/summary-links/${link.id}`)).status).toBe(403)
    expect((await team.outsider.client.delete(`/api/summary-links/${link.id}`)).status).toBe(404)
    expect((await anon().delete(`/api/summary-links/${link.id}`)).status).toBe(401)
    expect((await team.admin.client.delete('/api/summary-links/999999')).status).toBe(404)
    expect((await team.admin.client.delete('/api/summary-links/abc')).body.message).toMatch(/^id:/)
    const res = await team.admin.client.delete(`/api/summary-links/${link.id}`)
    expect(res.status).toBe(200)
    expect(res.body.state).toBe('revoked')
    expect((await team.admin.client.delete(`/api/summary-links/${link.id}`)).status).toBe(409)
    const audit = await team.admin.client.get(`/api/orgs/${team.orgId}/audit?action=summary-link.revoked`)
    const entry = audit.body.entries.find((e: { targetId: number }) => e.targetId === link.id)
    expect(entry.detail).toMatchObject({ before: { state: 'active' }, after: { state: 'revoked' } })
    expect(JSON.stringify(audit.body)).not.toContain(link.token)
  })
})
