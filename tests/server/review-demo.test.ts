import { execFileSync } from 'node:child_process'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { DEMO_ACCOUNTS, DEMO_INVITATION, DEMO_PASSWORD, DEMO_REVIEW, DEMO_SUMMARY_TOKEN } from '../../db/demo-scenario'
import { Client } from './client'

// The review part of the demo scenario, as `npm run db:seed` loads it: what the README and the
// demo story promise must be what the server shows, including the claims in the decision text.

const seed = () =>
  execFileSync(process.execPath, ['--import', 'tsx', 'db/cli.ts', 'seed'], { env: { ...process.env, DATABASE_PATH: inject('databasePath') }, encoding: 'utf8' })

async function login(role: string) {
  const account = DEMO_ACCOUNTS.find((a) => a.role === role)!
  const client = new Client()
  const res = await client.post('/api/auth/login', { email: account.email, password: DEMO_PASSWORD })
  expect(res.status).toBe(200)
  return { client, orgId: res.body.memberships[0].orgId as number }
}

let output: string
let siteId: number

beforeAll(async () => {
  output = seed()
  const { client, orgId } = await login('reviewer')
  const sites = await client.get(`/api/orgs/${orgId}/sites?q=Hollin`)
  siteId = sites.body.sites.find((s: { name: string }) => s.name === DEMO_REVIEW.siteName).id
})

describe('the demo review of Hollin Mill weir', () => {
  it('prints the demo summary link with its fixed token, and a second seed adds nothing', () => {
    expect(output).toContain(`/s/${DEMO_SUMMARY_TOKEN}`)
    expect(seed()).toContain('already present')
  })

  it('is accepted with conditions after one submission, with the engineer–reviewer thread', async () => {
    const { client } = await login('reviewer')
    const review = await client.get(`/api/sites/${siteId}/review`)
    expect(review.body.state).toBe('accepted-with-conditions')
    expect(review.body.assessment.optionName).toBe(DEMO_REVIEW.optionName)
    expect(review.body.decision.conditions).toBe(DEMO_REVIEW.decision.conditions)
    expect(review.body.history.map((h: { to: string }) => h.to)).toEqual(['submitted', 'accepted-with-conditions'])
    const comments = await client.get(`/api/sites/${siteId}/comments`)
    expect(comments.body.comments.map((c: { body: string }) => c.body)).toEqual(DEMO_REVIEW.comments.map((c) => c.body))
    expect(comments.body.comments.every((c: { mentions: unknown[] }) => c.mentions.length <= 1)).toBe(true)
  })

  it('says only what its brief shows: reserve kept, target met every month, gas clear, no month with a loss, summer units barely running', async () => {
    const { client } = await login('reviewer')
    const brief = (await client.get(`/api/sites/${siteId}/review/brief`)).body
    expect(brief.reservedFlow.setting).toEqual({ kind: 'percentile', exceedance: 95 })
    expect(brief.reservedFlow.keptAtEveryFlow).toBe(true)
    expect(brief.oxygenByMonth.every((m: { meetsTargetWith: boolean; meetsTargetWithout: boolean; target_mgL: number }) => m.meetsTargetWith && m.meetsTargetWithout && m.target_mgL === 6)).toBe(true)
    expect(brief.gasSupersaturation.raised).toBe(false)
    const losing = brief.oxygenByMonth.filter((m: { netGain_mgL: number }) => m.netGain_mgL < -0.01).map((m: { month: number }) => m.month)
    expect(losing).toEqual([])
    // the gain comes in the wetter months, when the units run most
    const gaining = brief.oxygenByMonth.filter((m: { netGain_mgL: number }) => m.netGain_mgL > 0.05).map((m: { month: number }) => m.month)
    expect(gaining).toEqual(expect.arrayContaining([1, 2, 12]))
  })

  it('opens the fixed-token summary without signing in', async () => {
    const res = await new Client().get(`/api/public/summary/${DEMO_SUMMARY_TOKEN}`)
    expect(res.status).toBe(200)
    expect(res.body.site.name).toBe(DEMO_REVIEW.siteName)
    expect(res.body.review).toMatchObject({ state: 'accepted-with-conditions', conditions: DEMO_REVIEW.decision.conditions })
    expect(res.body.contact).toEqual({ organisationName: 'Tarn & Beck Renewables', preparedBy: 'Idris Penrose' })
  })

  it('has the mails those events produced and a pending single-site invitation', async () => {
    const { client, orgId } = await login('admin')
    const outbox = await client.get(`/api/orgs/${orgId}/outbox?pageSize=200`)
    const kinds = outbox.body.messages.map((m: { kind: string }) => m.kind)
    for (const k of ['review-submitted', 'comment-mention', 'review-decided', 'invitation']) expect(kinds).toContain(k)
    const invitations = await client.get(`/api/orgs/${orgId}/invitations?state=pending`)
    const inv = invitations.body.invitations.find((i: { email: string }) => i.email === DEMO_INVITATION.email)
    expect(inv).toMatchObject({ role: 'reviewer', site: { name: DEMO_INVITATION.siteName } })
  })
})
