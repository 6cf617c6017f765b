import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { migrateToLatest, openDatabase } from '../../../db/connection'
import { changePassword, loadMe, signUp } from '../../../server/domain/accounts'
import { listAuditEntries, recordAudit } from '../../../server/domain/audit'
import { DomainError } from '../../../server/domain/errors'
import type { Mailer, MailMessage } from '../../../server/domain/mail/outbox'
import { changeMemberRole, listMembers, removeMember } from '../../../server/domain/members'
import { assertPasswordResetOpen, completePasswordReset, passwordResetByToken, requestPasswordReset } from '../../../server/domain/passwordResets'
import { createSession, endSessionOf, findSession } from '../../../server/domain/sessions'
import { assertNotThrottledIn, clearThrottleHits, recordThrottleHits, type ThrottleCheck } from '../../../server/domain/throttle'
import { confirmEmail, isVerified, sendVerification, verificationByToken } from '../../../server/domain/verification'
import { AuditQuerySchema } from '../../../shared/schemas/admin'

// The account, member, session, throttle and audit operations of server/domain against an in-memory
// database, with no server: what the routes answer is tested over HTTP in tests/server; here, the
// rules themselves.

let db: ReturnType<typeof openDatabase>
beforeEach(async () => {
  db = openDatabase(':memory:')
  await migrateToLatest(db)
})
afterEach(async () => {
  await db.destroy()
})

/** A mailer that keeps what it is given. */
function keepingMailer(): Mailer & { sent: MailMessage[] } {
  const sent: MailMessage[] = []
  return { sent, queue: async (m) => (sent.push(m), { outboxId: 0, delivery: Promise.resolve({ outboxId: 0, sent: false, error: null }) }), link: (p) => `http://app.example${p}` }
}

const refusal = (p: Promise<unknown>) => p.then(() => null, (e: unknown) => e as DomainError)

async function newAccount(email = 'ada@test.example') {
  const outcome = await signUp(db, { email, name: 'Ada Lovelace', organisationName: 'Test Mill', passwordHash: 'hash-1', mailer: keepingMailer() })
  if (outcome.kind !== 'created') throw new Error(`sign-up: ${outcome.kind}`)
  return outcome
}

describe('signing up', () => {
  it('makes the person admin of their new organisation, opened by default; a taken address changes nothing and mails its owner', async () => {
    const { user, orgId } = await newAccount()
    expect(await loadMe(db, user.id)).toMatchObject({ user, emailVerifiedAt: null, lastOrgId: orgId, memberships: [{ orgId, orgName: 'Test Mill', role: 'admin' }] })
    const mailer = keepingMailer()
    expect(await signUp(db, { email: user.email, name: 'Someone else', organisationName: 'Other', passwordHash: 'hash-2', mailer })).toEqual({ kind: 'taken', userId: user.id })
    expect(mailer.sent.map((m) => [m.to, m.kind])).toEqual([[user.email, 'signup-exists']])
    expect(await db.selectFrom('organisations').select('name').execute()).toEqual([{ name: 'Test Mill' }])
  })
})

describe('members', () => {
  it('keep at least one admin: the last one can neither step down nor go, and a member who goes loses their default organisation', async () => {
    const { user: admin, orgId } = await newAccount()
    const { user: other } = await newAccount('bo@test.example')
    await db.insertInto('memberships').values({ user_id: other.id, org_id: orgId, role: 'engineer' }).execute()
    await db.updateTable('users').set({ last_org_id: orgId }).where('id', '=', other.id).execute()

    expect(await refusal(changeMemberRole(db, { orgId, userId: admin.id, role: 'engineer' }))).toMatchObject({ status: 409, message: 'role: the organisation must keep at least one admin' })
    expect(await refusal(removeMember(db, { orgId, userId: admin.id, leaving: true }))).toMatchObject({ status: 409, message: expect.stringMatching(/^userId: .*before you leave$/) })
    expect(await refusal(removeMember(db, { orgId, userId: 999, leaving: false }))).toMatchObject({ status: 404, message: 'userId: no such member in this organisation' })

    expect(await changeMemberRole(db, { orgId, userId: other.id, role: 'admin' })).toEqual({ from: 'engineer', to: 'admin' })
    expect(await removeMember(db, { orgId, userId: admin.id, leaving: true })).toBe('admin')
    expect((await listMembers(db, orgId)).map((m) => [m.userId, m.role])).toEqual([[other.id, 'admin']])
    expect((await loadMe(db, admin.id))?.lastOrgId).toBeNull()
  })
})

describe('sessions', () => {
  it('are found by their key for their own person only, and end for good', async () => {
    const { user } = await newAccount()
    const id = await createSession(db, { userId: user.id, key: 'key-1', userAgent: 'test' })
    const now = Date.now()
    expect(await findSession(db, user.id, 'key-1', now)).toEqual({ id, userId: user.id })
    expect(await findSession(db, user.id + 1, 'key-1', now)).toBeNull()
    expect(await findSession(db, user.id, 'key-2', now)).toBeNull()
    expect(await refusal(endSessionOf(db, user.id + 1, id))).toMatchObject({ status: 404, message: 'id: no such session of yours' })
    expect(await changePassword(db, user.id, 'hash-2')).toBe(1)
    expect(await findSession(db, user.id, 'key-1', now)).toBeNull()
  })
})

describe('the throttle', () => {
  it('lets the free attempts through, then refuses with the wait, naming the field; clearing forgets the hits', async () => {
    const checks: ThrottleCheck[] = [['sign-in-account', 'ada@test.example|1.2.3.4']]
    const now = Date.parse('2026-06-01T12:00:00.000Z')
    for (let i = 0; i < 5; i++) {
      await assertNotThrottledIn(db, checks, { now: now + i, addressFactor: 1 })
      await recordThrottleHits(db, checks, now + i)
    }
    const refused = await refusal(assertNotThrottledIn(db, checks, { now: now + 5, addressFactor: 1 }))
    expect(refused).toBeInstanceOf(DomainError)
    expect(refused).toMatchObject({ status: 429, field: 'email', data: { retryAfter_s: 30 } })
    expect(refused?.message).toMatch(/^email: too many failed sign-ins/)
    await clearThrottleHits(db, checks)
    await assertNotThrottledIn(db, checks, { now: now + 5, addressFactor: 1 })
  })
})

describe('password resets and e-mail confirmation', () => {
  it('a reset link works once: it sets the password, confirms the address and ends every session', async () => {
    const { user } = await newAccount()
    await createSession(db, { userId: user.id, key: 'key-1', userAgent: 'test' })
    const mailer = keepingMailer()
    const requested = await requestPasswordReset(db, { email: user.email, now: Date.now(), mailer })
    expect(requested).toMatchObject({ userId: user.id })
    expect(await requestPasswordReset(db, { email: 'nobody@test.example', now: Date.now(), mailer })).toBeNull()
    const token = /reset-password\/([\w-]+)/.exec(mailer.sent[0]!.text)![1]!
    const reset = (await passwordResetByToken(db, token))!
    expect(await passwordResetByToken(db, `${token}x`)).toBeNull()
    const at = new Date().toISOString()
    assertPasswordResetOpen(reset, at)
    expect(await completePasswordReset(db, { reset, passwordHash: 'hash-2', now: at })).toEqual({ user: { id: user.id, email: user.email }, sessionsEnded: 1 })
    expect(await isVerified(db, user.id)).toBe(true)
    expect(await refusal(completePasswordReset(db, { reset, passwordHash: 'hash-3', now: at }))).toMatchObject({ status: 410, data: { state: 'used' } })
    const used = (await passwordResetByToken(db, token))!
    expect(() => assertPasswordResetOpen(used, at)).toThrow(/already been used/)
  })

  it('a confirmation link confirms the address it was sent to, once', async () => {
    const { user } = await newAccount()
    const mailer = keepingMailer()
    await sendVerification(db, { user, now: Date.now(), mailer })
    const token = /verify-email\/([\w-]+)/.exec(mailer.sent[0]!.text)![1]!
    const verification = (await verificationByToken(db, token))!
    const at = new Date().toISOString()
    expect(await confirmEmail(db, verification, at)).toEqual({ user: { id: user.id, email: user.email }, alreadyConfirmed: false })
    expect(await confirmEmail(db, verification, at)).toEqual({ user: { id: user.id, email: user.email }, alreadyConfirmed: true })
    await db.updateTable('users').set({ email: 'new@test.example' }).where('id', '=', user.id).execute()
    expect(await confirmEmail(db, verification, at)).toBeNull()
  })
})

describe('the audit trail', () => {
  it('keeps each line with its details and pages it newest first, by action prefix and day', async () => {
    const { user, orgId } = await newAccount()
    await recordAudit(db, { orgId, userId: user.id, action: 'review.submitted', targetType: 'site', targetId: 1, detail: { note: 'a' }, at: '2026-03-01T10:00:00.000Z' })
    await recordAudit(db, { orgId, userId: user.id, action: 'review.decided', targetType: 'site', targetId: 1, at: '2026-03-02T10:00:00.000Z' })
    await recordAudit(db, { orgId, userId: null, action: 'member.added', at: '2026-03-02T11:00:00.000Z' })
    const list = (q: Record<string, string>) => listAuditEntries(db, orgId, AuditQuerySchema.parse(q))
    const reviews = await list({ action: 'review.' })
    expect(reviews.total).toBe(2)
    expect(reviews.entries.map((e) => [e.action, e.userName, e.detail])).toEqual([
      ['review.decided', 'Ada Lovelace', null],
      ['review.submitted', 'Ada Lovelace', { note: 'a' }],
    ])
    expect((await list({ from: '2026-03-02', to: '2026-03-02' })).entries.map((e) => e.action)).toEqual(['member.added', 'review.decided'])
  })
})
