import { createHash } from 'node:crypto'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { Client, GOOD_PASSWORD, signUp, uniqueEmail } from './client'
import { daysAgo, lastOutboxId, makePeople, outboxSince, siteWithAssessment, testDb, tokenFromMail } from './review-helpers'

// Invitations: admins invite by e-mail to the organisation or to review one site; the link (by
// e-mail only, stored hashed) says what it is for, creates or links an account once, and answers
// 410 once used, withdrawn or expired.

let team: Awaited<ReturnType<typeof makePeople>>
let siteId: number
const sha256 = (s: string) => createHash('sha256').update(s).digest('hex')

/** Invites `email` as admin and returns the invitation and the token from its e-mail. */
async function invite(body: Record<string, unknown>) {
  const before = lastOutboxId()
  const res = await team.admin.client.post(`/api/orgs/${team.orgId}/invitations`, body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  const mails = outboxSince(before)
  expect(mails).toHaveLength(1)
  return { invitation: res.body, token: tokenFromMail(mails[0]!.text, '/invitations'), mail: mails[0]! }
}

beforeAll(async () => {
  team = await makePeople('inv')
  siteId = (await siteWithAssessment(team.engineer.client, team.orgId, 'Invited weir')).siteId
})

describe('sending an invitation', () => {
  it('e-mails a link to the invited address and stores only the token hash', async () => {
    const email = uniqueEmail('newcomer')
    const { invitation, token, mail } = await invite({ email: email.toUpperCase(), role: 'engineer' })
    expect(invitation).toMatchObject({ email, role: 'engineer', state: 'pending', site: null, invitedBy: { id: team.admin.id } })
    expect(JSON.stringify(invitation)).not.toContain(token)
    expect(mail).toMatchObject({ to_address: email, kind: 'invitation', org_id: team.orgId })
    expect(mail.subject).toContain('Org of inv-admin')
    expect(mail.text).toContain(`http://localhost:3000/invitations/${token}`)
    expect(mail.html).toContain(`/invitations/${token}`)
    const row = testDb().prepare('select * from invitations where id = ?').get(invitation.id) as Record<string, unknown>
    expect(row.token_hash).toBe(sha256(token))
    expect(JSON.stringify(row)).not.toContain(token)
    const days = (Date.parse(invitation.expiresAt) - Date.now()) / 86_400_000
    expect(days).toBeGreaterThan(6.9)
    expect(days).toBeLessThanOrEqual(7)
  })

  it('is for admins only', async () => {
    const body = { email: uniqueEmail('x'), role: 'viewer' }
    for (const who of ['engineer', 'reviewer', 'viewer'] as const) expect((await team[who].client.post(`/api/orgs/${team.orgId}/invitations`, body)).status, who).toBe(403)
    expect((await team.outsider.client.post(`/api/orgs/${team.orgId}/invitations`, body)).status).toBe(404)
    expect((await new Client().post(`/api/orgs/${team.orgId}/invitations`, body)).status).toBe(401)
    for (const who of ['engineer', 'viewer'] as const) expect((await team[who].client.get(`/api/orgs/${team.orgId}/invitations`)).status, who).toBe(403)
  })

  it('names the bad field: e-mail, role, a site for anything but a reviewer, a site of another organisation', async () => {
    const outsiderSite = (await siteWithAssessment(team.outsider.client, team.outsiderOrgId, 'Not theirs')).siteId
    for (const [body, field, status] of [
      [{ email: 'nope', role: 'viewer' }, 'email', 400],
      [{ email: uniqueEmail('r'), role: 'owner' }, 'role', 400],
      [{ email: uniqueEmail('r'), role: 'engineer', siteId }, 'role', 400],
      [{ email: uniqueEmail('r'), role: 'reviewer', siteId: 'x' }, 'siteId', 400],
      [{ email: uniqueEmail('r'), role: 'reviewer', siteId: outsiderSite }, 'siteId', 422],
    ] as const) {
      const res = await team.admin.client.post(`/api/orgs/${team.orgId}/invitations`, body)
      expect(res.status, JSON.stringify(body)).toBe(status)
      expect(res.body.message).toMatch(new RegExp(`^${field}:`))
    }
  })

  it('refuses a member, and a second invitation while one waits (409 naming email)', async () => {
    const member = await team.admin.client.post(`/api/orgs/${team.orgId}/invitations`, { email: team.viewer.email, role: 'engineer' })
    expect(member.status).toBe(409)
    expect(member.body.message).toMatch(/^email: already a member/)
    const email = uniqueEmail('twice')
    await invite({ email, role: 'viewer' })
    const again = await team.admin.client.post(`/api/orgs/${team.orgId}/invitations`, { email, role: 'viewer' })
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/^email: an invitation is already waiting/)
  })
})

describe('opening and accepting an invitation', () => {
  it('shows what it is for without signing in, and nothing more', async () => {
    const email = uniqueEmail('peek')
    const { token } = await invite({ email, role: 'reviewer', siteId })
    const res = await new Client().get(`/api/invitations/${token}`)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({
      organisationName: 'Org of inv-admin',
      role: 'reviewer',
      roleLabel: 'Reviewer',
      siteName: 'Invited weir',
      email,
      invitedByName: 'Test inv-admin',
      expiresAt: expect.any(String),
      needs: 'new-account',
    })
    const unknown = await new Client().get('/api/invitations/AAAAAAAAAAAAAAAAAAAAAA')
    expect(unknown.status).toBe(404)
  })

  it('creates the account, joins with the role, signs in, and works only once', async () => {
    const email = uniqueEmail('joiner')
    const { invitation, token } = await invite({ email, role: 'engineer' })
    const client = new Client()
    const missing = await client.post(`/api/invitations/${token}/accept`, { password: GOOD_PASSWORD })
    expect(missing.status).toBe(422)
    expect(missing.body.message).toMatch(/^name:/)
    const short = await client.post(`/api/invitations/${token}/accept`, { name: 'Joiner', password: 'short' })
    expect(short.status).toBe(400)
    expect(short.body.message).toMatch(/^password:/)
    const res = await client.post(`/api/invitations/${token}/accept`, { name: 'Joiner', password: GOOD_PASSWORD })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ user: { email, name: 'Joiner' }, orgId: team.orgId, role: 'engineer', siteId: null, created: true })
    const me = await client.get('/api/me')
    expect(me.body.memberships).toEqual([{ orgId: team.orgId, orgName: 'Org of inv-admin', role: 'engineer', currency: { code: 'GBP', symbol: '£' } }])
    const twice = await new Client().post(`/api/invitations/${token}/accept`, { name: 'Thief', password: GOOD_PASSWORD })
    expect(twice.status).toBe(410)
    expect(twice.body.message).toMatch(/already been used/)
    expect((await new Client().get(`/api/invitations/${token}`)).status).toBe(410)
    // The page at a used or unknown link answers with the same status as the API.
    expect((await fetch(`${inject('baseURL')}/invitations/${token}`, { headers: { accept: 'text/html' } })).status).toBe(410)
    expect((await fetch(`${inject('baseURL')}/invitations/not-a-real-invitation-token`, { headers: { accept: 'text/html' } })).status).toBe(404)
    const list = await team.admin.client.get(`/api/orgs/${team.orgId}/invitations?state=accepted`)
    expect(list.body.invitations.find((i: { id: number }) => i.id === invitation.id).state).toBe('accepted')
  })

  it('links an existing account once it is signed in as the invited address, and no other', async () => {
    const existing = await signUp('existing')
    const { token } = await invite({ email: existing.email, role: 'viewer' })
    expect((await new Client().get(`/api/invitations/${token}`)).body.needs).toBe('sign-in')
    // Signed out, even the right password does not accept: sign in first.
    const stranger = new Client()
    const signedOut = await stranger.post(`/api/invitations/${token}/accept`, { password: GOOD_PASSWORD })
    expect(signedOut.status).toBe(401)
    expect(signedOut.body.message).toContain(existing.email)
    // Another signed-in account is refused, naming the invited address.
    const other = await signUp('signedin')
    const refused = await other.client.post(`/api/invitations/${token}/accept`, {})
    expect(refused.status).toBe(403)
    expect(refused.body.message).toMatch(new RegExp(`^invitation: this invitation is for ${existing.email.replace(/[.+]/g, '\\$&')}`))
    // The invited account, signed in, joins.
    const ok = await existing.client.post(`/api/invitations/${token}/accept`, {})
    expect(ok.status).toBe(200)
    expect(ok.body).toMatchObject({ created: false, role: 'viewer', user: { id: existing.user.id } })
    const me = await existing.client.get('/api/me')
    expect(me.body.memberships.map((m: { orgId: number; role: string }) => `${m.orgId}:${m.role}`)).toContain(`${team.orgId}:viewer`)
  })

  it('grants one site to a single-site reviewer, without membership', async () => {
    const email = uniqueEmail('one-site')
    const { token } = await invite({ email, role: 'reviewer', siteId })
    const client = new Client()
    const res = await client.post(`/api/invitations/${token}/accept`, { name: 'One Site', password: GOOD_PASSWORD })
    expect(res.status).toBe(200)
    expect(res.body.siteId).toBe(siteId)
    expect((await client.get('/api/me')).body.memberships).toEqual([])
    expect((await client.get(`/api/sites/${siteId}`)).status).toBe(200)
    const grant = testDb().prepare('select role, org_id from site_grants where user_id = ? and site_id = ?').get(res.body.user.id, siteId)
    expect(grant).toEqual({ role: 'reviewer', org_id: team.orgId })
  })
})

describe('withdrawn and expired invitations', () => {
  it('revoke for admins of the organisation; the link then answers 410; revoking twice is 409', async () => {
    const { invitation, token } = await invite({ email: uniqueEmail('withdrawn'), role: 'viewer' })
    expect((await team.engineer.client.delete(`/api/invitations/${invitation.id}`)).status).toBe(403)
    expect((await team.outsider.client.delete(`/api/invitations/${invitation.id}`)).status).toBe(404)
    expect((await new Client().delete(`/api/invitations/${invitation.id}`)).status).toBe(401)
    expect((await team.admin.client.delete('/api/invitations/abc')).body.message).toMatch(/^id:/)
    const res = await team.admin.client.delete(`/api/invitations/${invitation.id}`)
    expect(res.status).toBe(200)
    expect(res.body.state).toBe('revoked')
    const again = await team.admin.client.delete(`/api/invitations/${invitation.id}`)
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/revoked/)
    for (const r of [await new Client().get(`/api/invitations/${token}`), await new Client().post(`/api/invitations/${token}/accept`, { name: 'Late', password: GOOD_PASSWORD })]) {
      expect(r.status).toBe(410)
      expect(r.body.message).toMatch(/withdrawn/)
    }
  })

  it('expire after their date with a clear 410, and show as expired', async () => {
    const { invitation, token } = await invite({ email: uniqueEmail('expired'), role: 'viewer' })
    testDb().prepare('update invitations set expires_at = ? where id = ?').run(daysAgo(1), invitation.id)
    const res = await new Client().post(`/api/invitations/${token}/accept`, { name: 'Late', password: GOOD_PASSWORD })
    expect(res.status).toBe(410)
    expect(res.body.message).toMatch(/expired on \d{4}-\d{2}-\d{2}.*new one/)
    const list = await team.admin.client.get(`/api/orgs/${team.orgId}/invitations?state=expired`)
    expect(list.body.invitations.map((i: { id: number }) => i.id)).toContain(invitation.id)
    expect(list.body.invitations.every((i: { state: string }) => i.state === 'expired')).toBe(true)
    expect((await team.admin.client.delete(`/api/invitations/${invitation.id}`)).status).toBe(409)
  })

  it('are audited with before and after, never with the token', async () => {
    const res = await team.admin.client.get(`/api/orgs/${team.orgId}/audit?action=invitation.&pageSize=200`)
    const actions = new Set(res.body.entries.map((e: { action: string }) => e.action))
    expect(actions).toEqual(new Set(['invitation.created', 'invitation.accepted', 'invitation.revoked']))
    const revoked = res.body.entries.find((e: { action: string }) => e.action === 'invitation.revoked')
    expect(revoked.detail).toMatchObject({ before: { state: 'pending' }, after: { state: 'revoked' } })
    const tokens = (testDb().prepare('select text from outbox where kind = ? and org_id = ?').all('invitation', team.orgId) as { text: string }[]).map((m) => tokenFromMail(m.text, '/invitations'))
    const json = JSON.stringify(res.body)
    for (const t of tokens) expect(json).not.toContain(t)
    const filtered = await team.admin.client.get(`/api/orgs/${team.orgId}/audit?targetType=invitation&userId=${team.admin.id}&from=2000-01-01&to=2999-12-31`)
    expect(filtered.body.entries.length).toBeGreaterThan(0)
    expect(filtered.body.entries.every((e: { targetType: string; userId: number }) => e.targetType === 'invitation' && e.userId === team.admin.id)).toBe(true)
    const none = await team.admin.client.get(`/api/orgs/${team.orgId}/audit?to=2000-01-01`)
    expect(none.body.total).toBe(0)
    for (const [q, field] of [['from=yesterday', 'from'], ['userId=x', 'userId'], ['action=DROP TABLE', 'action'], ['from=2026-02-01&to=2026-01-01', 'to'], ['from=2026-02-30', 'from']] as const) {
      const bad = await team.admin.client.get(`/api/orgs/${team.orgId}/audit?${q}`)
      expect(bad.status, q).toBe(400)
      expect(bad.body.message).toMatch(new RegExp(`^${field}:`))
    }
  })
})
