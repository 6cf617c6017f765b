import Database from 'better-sqlite3'
import { SMTPServer } from 'smtp-server'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startBuiltServer, type BuiltServer } from '../../scripts/builtServer.mjs'
import { Client, signUp, uniqueEmail } from './client'
import { lastOutboxId, makePeople, outboxSince, siteWithAssessment } from './review-helpers'

// E-mail: without SMTP_URL every message stays in the outbox, which admins page through; with
// SMTP_URL it is delivered (proved here with a real SMTP server on 127.0.0.1 and a second Gillwatt
// server started with SMTP_URL on its own database), and the outbox records sent_at or the error.

describe('the outbox without SMTP', () => {
  let team: Awaited<ReturnType<typeof makePeople>>

  beforeAll(async () => {
    team = await makePeople('mail')
    const s = await siteWithAssessment(team.engineer.client, team.orgId, 'Outbox weir')
    await team.engineer.client.post(`/api/sites/${s.siteId}/review/submit`, { assessmentId: s.assessmentId })
    await team.reviewer.client.post(`/api/sites/${s.siteId}/review/decision`, { decision: 'returned', reason: 'More data' })
    await team.admin.client.post(`/api/orgs/${team.orgId}/invitations`, { email: uniqueEmail('mailed'), role: 'viewer' })
  })

  it('holds every message of the organisation, newest first, for admins, paged and filtered by kind', async () => {
    const res = await team.admin.client.get(`/api/orgs/${team.orgId}/outbox`)
    expect(res.status).toBe(200)
    expect(res.body.smtpConfigured).toBe(false)
    // Newest first: the invitation, the decision, the submission, then the three that brought the team in.
    expect(res.body.messages.map((m: { kind: string }) => m.kind)).toEqual(['invitation', 'review-decided', 'review-submitted', 'invitation', 'invitation', 'invitation'])
    expect(res.body.total).toBe(6)
    const m = res.body.messages[2]
    expect(m).toMatchObject({ to: team.reviewer.email, sentAt: null, error: null })
    expect(m.subject).toBe('Submitted for review: Outbox weir')
    expect(m.html).toMatch(/^<!doctype html>/)
    const page2 = await team.admin.client.get(`/api/orgs/${team.orgId}/outbox?page=2&pageSize=1`)
    expect(page2.body.messages).toHaveLength(1)
    expect(page2.body.messages[0].kind).toBe('review-decided')
    const kind = await team.admin.client.get(`/api/orgs/${team.orgId}/outbox?kind=invitation`)
    expect(kind.body.messages.map((x: { kind: string }) => x.kind)).toEqual(['invitation', 'invitation', 'invitation', 'invitation'])
  })

  it('is for admins only, and names a bad query field', async () => {
    for (const who of ['engineer', 'reviewer', 'viewer'] as const) expect((await team[who].client.get(`/api/orgs/${team.orgId}/outbox`)).status, who).toBe(403)
    expect((await team.outsider.client.get(`/api/orgs/${team.orgId}/outbox`)).status).toBe(404)
    expect((await new Client().get(`/api/orgs/${team.orgId}/outbox`)).status).toBe(401)
    for (const [q, field] of [['kind=spam', 'kind'], ['pageSize=500', 'pageSize'], ['page=0', 'page']]) {
      const res = await team.admin.client.get(`/api/orgs/${team.orgId}/outbox?${q}`)
      expect(res.status).toBe(400)
      expect(res.body.message).toMatch(new RegExp(`^${field}:`))
    }
  })

  it('never shows another organisation\'s mail, nor password-reset mail', async () => {
    const before = lastOutboxId()
    await new Client().post('/api/auth/password-reset', { email: team.admin.email })
    expect(outboxSince(before).map((m) => m.kind)).toEqual(['password-reset'])
    const mine = await team.admin.client.get(`/api/orgs/${team.orgId}/outbox?pageSize=200`)
    expect(mine.body.messages.map((m: { kind: string }) => m.kind)).not.toContain('password-reset')
    const theirs = await team.outsider.client.get(`/api/orgs/${team.outsiderOrgId}/outbox`)
    expect(theirs.status).toBe(200)
    expect(theirs.body.messages).toEqual([])
  })
})

// ——— Real SMTP delivery ———

interface Received {
  from: string
  to: string[]
  raw: string
}

describe('delivery through a real SMTP server', () => {
  const received: Received[] = []
  let smtp: SMTPServer
  let smtpPort: number
  let app: BuiltServer

  beforeAll(async () => {
    smtp = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS'],
      logger: false,
      onData(stream, session, callback) {
        let raw = ''
        stream.setEncoding('utf8')
        stream.on('data', (chunk: string) => (raw += chunk))
        stream.on('end', () => {
          received.push({ from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '', to: session.envelope.rcptTo.map((r) => r.address), raw })
          callback()
        })
      },
    })
    await new Promise<void>((resolve) => smtp.listen(0, '127.0.0.1', () => resolve()))
    smtpPort = (smtp.server.address() as { port: number }).port
    app = await startBuiltServer({
      prefix: 'gillwatt-smtp-',
      sessionPassword: 'test-only-session-password-0123456789abcdef',
      env: { SMTP_URL: `smtp://127.0.0.1:${smtpPort}`, NUXT_PUBLIC_APP_URL: 'https://gillwatt.test.example' },
    })
  })

  afterAll(async () => {
    await app?.close()
    await new Promise<void>((resolve) => (smtp ? smtp.close(() => resolve()) : resolve()))
  })

  it('delivers an invitation over SMTP and records when it was sent', async () => {
    const owner = await signUpAt(app.baseURL, 'smtp-admin')
    // Sign-up's confirmation e-mail went out over SMTP too (delivered after the answer).
    for (let i = 0; i < 50 && received.length < 1; i++) await new Promise((r) => setTimeout(r, 20))
    expect(received.map((m) => m.raw)).toEqual([expect.stringMatching(/^Subject: Confirm your e-mail address for Gillwatt/m)])
    received.length = 0
    const email = uniqueEmail('smtp-guest')
    const res = await owner.client.post(`/api/orgs/${owner.orgId}/invitations`, { email, role: 'viewer' })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(received).toHaveLength(1)
    const msg = received[0]!
    expect(msg.to).toEqual([email])
    expect(msg.from).toBe('no-reply@gillwatt.example')
    const raw = msg.raw.replace(/=\r?\n/g, '')
    expect(raw).toMatch(/^Subject: Join Org of smtp-admin on Gillwatt/m)
    expect(raw).toMatch(/https:\/\/gillwatt\.test\.example\/invitations\/[A-Za-z0-9_-]{22}/)
    expect(raw).toMatch(/Content-Type: text\/plain/)
    expect(raw).toMatch(/Content-Type: text\/html/)
    const outbox = await owner.client.get(`/api/orgs/${owner.orgId}/outbox`)
    expect(outbox.body.smtpConfigured).toBe(true)
    expect(outbox.body.messages[0]).toMatchObject({ to: email, kind: 'invitation', error: null })
    expect(Date.parse(outbox.body.messages[0].sentAt)).not.toBeNaN()
  })

  it('keeps the change and records the error when the SMTP server is gone', async () => {
    await new Promise<void>((resolve) => smtp.close(() => resolve()))
    const owner = await signUpAt(app.baseURL, 'smtp-down')
    const email = uniqueEmail('smtp-lost')
    const res = await owner.client.post(`/api/orgs/${owner.orgId}/invitations`, { email, role: 'viewer' })
    expect(res.status).toBe(201)
    const list = await owner.client.get(`/api/orgs/${owner.orgId}/invitations`)
    expect(list.body.invitations.map((i: { email: string }) => i.email)).toEqual([email])
    const db = new Database(app.databasePath, { readonly: true })
    const row = db.prepare('select sent_at, error from outbox where to_address = ?').get(email) as { sent_at: string | null; error: string | null }
    db.close()
    expect(row.sent_at).toBeNull()
    expect(row.error).toMatch(/ECONNREFUSED|connect/i)
  })
})

/** `signUp` against another server than the shared one (the address stays unconfirmed there). */
const signUpAt = (baseURL: string, tag: string) => signUp(tag, { verify: false, baseURL })
