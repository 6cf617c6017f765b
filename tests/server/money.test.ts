import { beforeAll, describe, expect, it } from 'vitest'
import { addMember, signUp, type Client } from './client'
import { createAssessment, createOption } from './options-helpers'
import { createSite, makeTeam } from './sites-helpers'

// Money in the organisation's currency: the setting (admins only), and the figures that carry it:
// GET /api/me, a site, the portfolio and its CSV, the comparison, an assessment's CSV.

let team: Awaited<ReturnType<typeof makeTeam>>
let other: Awaited<ReturnType<typeof makeTeam>>
let both: Client
let siteId: number
let optionId: number
let assessment: any
let otherOptionId: number

beforeAll(async () => {
  team = await makeTeam('money')
  other = await makeTeam('money-other')
  siteId = (await createSite(team.engineer, team.orgId, { name: 'Money weir' })).id
  optionId = (await createOption(team.engineer, siteId, { name: 'Money pair', design: { costs: { fixedCost: 40_000, ratedPowerPrice: 700, civilsPerDesignFlow: 90_000 } } })).id
  assessment = await createAssessment(team.engineer, optionId)
  const otherSite = (await createSite(other.engineer, other.orgId, { name: 'Other weir' })).id
  otherOptionId = (await createOption(other.engineer, otherSite, { name: 'Other pair' })).id
  await createAssessment(other.engineer, otherOptionId)
  const person = await signUp('money-both')
  await addMember(team.admin, team.orgId, person, 'viewer')
  await addMember(other.admin, other.orgId, person, 'viewer')
  both = person.client
})

const settings = () => `/api/orgs/${team.orgId}/settings`

describe('the organisation\'s currency', () => {
  it('is pounds sterling until an admin changes it, and every member may read it', async () => {
    for (const c of [team.admin, team.engineer, team.reviewer, team.viewer]) {
      const res = await c.get(settings())
      expect(res.status).toBe(200)
      expect(res.body).toEqual({ orgId: team.orgId, name: expect.any(String), currency: { code: 'GBP', symbol: '£' } })
    }
    expect((await team.outsider.get(settings())).status).toBe(404)
  })

  it('may be changed by an admin only (others 403, an outsider 404), audited, and shows in /api/me and on the site', async () => {
    for (const c of [team.engineer, team.reviewer, team.viewer]) {
      const res = await c.patch(settings(), { currency: { code: 'USD', symbol: '$' } })
      expect(res.status).toBe(403)
    }
    expect((await team.outsider.patch(settings(), { currency: { code: 'USD', symbol: '$' } })).status).toBe(404)
    expect((await team.viewer.get(settings())).body.currency).toEqual({ code: 'GBP', symbol: '£' })

    const res = await team.admin.patch(settings(), { currency: { code: 'EUR', symbol: '€' } })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.currency).toEqual({ code: 'EUR', symbol: '€' })
    const me = await team.viewer.get('/api/me')
    expect(me.body.memberships.find((m: { orgId: number }) => m.orgId === team.orgId).currency).toEqual({ code: 'EUR', symbol: '€' })
    expect((await team.viewer.get(`/api/sites/${siteId}`)).body.currency).toEqual({ code: 'EUR', symbol: '€' })
    const audit = await team.admin.get(`/api/orgs/${team.orgId}/audit?action=organisation.settings-changed`)
    expect(audit.body.entries[0].detail).toEqual({ currency: { from: { code: 'GBP', symbol: '£' }, to: { code: 'EUR', symbol: '€' } } })
  })

  it('answers 400 naming the field for a code that is not ISO 4217 or a bad symbol, and keeps what was stored', async () => {
    const before = (await team.admin.get(settings())).body.currency
    const cases: [unknown, RegExp][] = [
      [{ currency: { code: 'eur', symbol: '€' } }, /^currency\.code: must be an ISO 4217 code/],
      [{ currency: { code: 'XQZ', symbol: '€' } }, /^currency\.code: is not an ISO 4217 currency code/],
      [{ currency: { code: 'EUR', symbol: '' } }, /^currency\.symbol: must not be empty/],
      [{ currency: { code: 'EUR', symbol: '1€' } }, /^currency\.symbol: must hold no digits or spaces/],
      [{ currency: { code: 'EUR', symbol: 'EUROSS' } }, /^currency\.symbol: must be 5 characters or fewer/],
      [{}, /^currency: /],
    ]
    for (const [body, message] of cases) {
      const res = await team.admin.patch(settings(), body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.message, JSON.stringify(body)).toMatch(message)
    }
    expect((await team.admin.get(settings())).body.currency).toEqual(before)
  })
})

describe('money figures with the currency', () => {
  it('the portfolio carries each site\'s latest NPV and capital cost, sorts by them, and names the currency', async () => {
    const res = await team.viewer.get(`/api/orgs/${team.orgId}/portfolio?sort=npv&dir=desc`)
    expect(res.status).toBe(200)
    expect(res.body.currency).toEqual({ code: 'EUR', symbol: '€' })
    const row = res.body.rows.find((r: { name: string }) => r.name === 'Money weir')
    expect(row.latest).toMatchObject({ assessmentId: assessment.id, npv: assessment.result.money.npv, capex: assessment.result.money.capex })
    expect((await team.viewer.get(`/api/orgs/${team.orgId}/portfolio?sort=capex`)).status).toBe(200)
  })

  it('the portfolio CSV names amounts by the currency code, never the word "currency"', async () => {
    const text = new TextDecoder().decode((await team.viewer.download(`/api/orgs/${team.orgId}/portfolio?format=csv`)).bytes)
    const [header, ...rows] = text.trim().split(/\r\n/)
    const cols = header!.split(',')
    expect(cols).toContain('Levelised cost (EUR/MWh)')
    expect(cols).toContain('Net present value (EUR)')
    expect(cols).toContain('Capital cost (EUR)')
    expect(header).not.toMatch(/currency/i)
    const cells = rows.find((l) => l.includes('Money weir'))!.split(',')
    expect(Number(cells[cols.indexOf('Net present value (EUR)')])).toBe(assessment.result.money.npv)
    expect(Number(cells[cols.indexOf('Capital cost (EUR)')])).toBe(assessment.result.money.capex)
  })

  it('the comparison carries NPV and capital cost, and each option\'s organisation\'s currency', async () => {
    const res = await both.get(`/api/compare?options=${optionId},${otherOptionId}`)
    expect(res.status).toBe(200)
    const [mine, theirs] = res.body.items
    expect(mine.site.currency).toEqual({ code: 'EUR', symbol: '€' })
    expect(theirs.site.currency).toEqual({ code: 'GBP', symbol: '£' })
    expect(mine.latestAssessment).toMatchObject({ npv: assessment.result.money.npv, capex: assessment.result.money.capex })
    expect(typeof theirs.latestAssessment.npv).toBe('number')
  })

  it('a stored assessment carries the break-even price, whether it pays, and the money flag; its CSV names the currency', async () => {
    const m = assessment.result.money
    expect(m.breakEvenPrice).toBeCloseTo(m.lcoe, 9)
    expect(m.pays).toBe(m.npv >= 0 && m.annualRevenue >= m.annualOpex)
    const flag = assessment.result.summary.flags.find((f: { id: string }) => f.id === 'does-not-pay')
    expect(flag).toMatchObject({ level: 'money', raised: !m.pays })
    expect(assessment.flagsRaised.includes('does-not-pay')).toBe(!m.pays)
    // civils priced on the design flow: capex = fixed + per kW × rating + per m³/s × design flow
    expect(m.capex).toBeCloseTo(40_000 + 700 * assessment.ratedPower_kW + 90_000 * m.designFlow_m3s, 6)
    const csv = new TextDecoder().decode((await team.viewer.download(`/api/assessments/${assessment.id}/export/summary.csv`)).bytes)
    expect(csv).toContain(`Net present value,${m.npv},EUR`)
    expect(csv).toContain(`Break-even export price,${m.breakEvenPrice},EUR/MWh`)
    expect(csv).not.toMatch(/currency/i)
  })
})
