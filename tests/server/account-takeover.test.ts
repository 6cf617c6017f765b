import { describe, expect, it } from 'vitest'
import { Client, GOOD_PASSWORD, addMember, signUp, uniqueEmail } from './client'
import { lastOutboxId, latestToken, outboxSince, testDb } from './mailbox'

// Nobody walks into an account or an organisation: addresses are verified before they can join
// anything, sign-up reveals no account, invitations work only for the invited address, nobody is
// added to an organisation without accepting, members can be removed and can leave.

const signupBody = (email: string, password = GOOD_PASSWORD) => ({ name: 'Someone', email, password, organisationName: 'Some org' })

describe('sign-up', () => {
  it('answers a taken address exactly as a new one, and tells the owner by e-mail instead', async () => {
    const owner = await signUp('taken-owner')
    const fresh = await new Client().post('/api/auth/signup', signupBody(uniqueEmail('fresh')))
    const before = lastOutboxId()
    const taken = await new Client().post('/api/auth/signup', signupBody(owner.email, 'the attackers password'))
    expect(taken.status).toBe(fresh.status)
    expect(taken.status).toBe(202)
    expect(taken.body).toEqual(fresh.body)
    expect(taken.headers.get('set-cookie')).toBeNull()
    const mails = outboxSince(before)
    expect(mails.map((m) => [m.to_address, m.kind])).toEqual([[owner.email, 'signup-exists']])
    // Nothing changed: the owner's password still works, the attacker's does not.
    expect((await new Client().post('/api/auth/login', { email: owner.email, password: GOOD_PASSWORD })).status).toBe(200)
    expect((await new Client().post('/api/auth/login', { email: owner.email, password: 'the attackers password' })).status).toBe(401)
    expect((testDb().prepare('select count(*) as n from users where email = ?').get(owner.email) as { n: number }).n).toBe(1)
  })

  it('sends a verification link; the account can sign in before it is opened', async () => {
    const email = uniqueEmail('unverified')
    expect((await new Client().post('/api/auth/signup', signupBody(email))).status).toBe(202)
    const client = new Client()
    const login = await client.post('/api/auth/login', { email, password: GOOD_PASSWORD })
    expect(login.status).toBe(200)
    expect(login.body.emailVerifiedAt).toBeNull()
    const token = latestToken(email, 'verify-email', '/verify-email')
    const verified = await new Client().post(`/api/auth/verify-email/${token}`)
    expect(verified.status).toBe(200)
    expect((await client.get('/api/me')).body.emailVerifiedAt).toMatch(/^\d{4}-/)
    expect((await new Client().post('/api/auth/verify-email/not-a-real-token-at-all')).status).toBe(404)
  })
})

describe('pre-registration takeover', () => {
  it('an unverified account cannot accept an invitation; the real owner resets, verifies, and the squatter is out', async () => {
    const admin = await signUp('squat-admin')
    const email = uniqueEmail('newhire')
    // The attacker registers the address before the real person is invited, and stays signed in.
    await new Client().post('/api/auth/signup', signupBody(email, 'attacker chosen pw'))
    const attacker = new Client()
    expect((await attacker.post('/api/auth/login', { email, password: 'attacker chosen pw' })).status).toBe(200)
    expect((await admin.client.post(`/api/orgs/${admin.orgId}/invitations`, { email, role: 'engineer' })).status).toBe(201)
    // Even holding the invitation token, the unverified account is refused.
    const token = latestToken(email, 'invitation', '/invitations')
    const refused = await attacker.post(`/api/invitations/${token}/accept`)
    expect(refused.status).toBe(403)
    expect(refused.body.message).toMatch(/^email: confirm/)
    // The real owner resets the password by e-mail: verified, and every other session ends.
    await new Client().post('/api/auth/password-reset', { email })
    const owner = new Client()
    expect((await owner.post(`/api/auth/password-reset/${latestToken(email, 'password-reset', '/reset-password')}`, { password: 'the real owners pw' })).status).toBe(200)
    expect((await attacker.get('/api/me')).status).toBe(401)
    expect((await owner.post('/api/auth/login', { email, password: 'the real owners pw' })).body.emailVerifiedAt).toMatch(/^\d{4}-/)
    expect((await owner.post(`/api/invitations/${token}/accept`)).status).toBe(200)
    expect((await attacker.post('/api/auth/login', { email, password: 'attacker chosen pw' })).status).toBe(401)
  })
})

describe('invitation links', () => {
  it('work only for the invited address: any other signed-in account gets a 403 naming it', async () => {
    const admin = await signUp('inv-only-admin')
    const other = await signUp('inv-only-other')
    const email = uniqueEmail('inv-only-target')
    await admin.client.post(`/api/orgs/${admin.orgId}/invitations`, { email, role: 'viewer' })
    const token = latestToken(email, 'invitation', '/invitations')
    const res = await other.client.post(`/api/invitations/${token}/accept`)
    expect(res.status).toBe(403)
    expect(res.body.message).toContain(email)
    expect((await other.client.get('/api/me')).body.memberships.map((m: { orgId: number }) => m.orgId)).not.toContain(admin.orgId)
  })

  it('lead a signed-out person with an account to sign in first, and let a new address create a verified account', async () => {
    const admin = await signUp('inv-out-admin')
    const existing = await signUp('inv-out-existing')
    await admin.client.post(`/api/orgs/${admin.orgId}/invitations`, { email: existing.email, role: 'viewer' })
    const first = await new Client().post(`/api/invitations/${latestToken(existing.email, 'invitation', '/invitations')}/accept`, { password: GOOD_PASSWORD })
    expect(first.status).toBe(401)
    expect(first.body.message).toContain(existing.email)

    const email = uniqueEmail('inv-out-new')
    await admin.client.post(`/api/orgs/${admin.orgId}/invitations`, { email, role: 'engineer' })
    const newcomer = new Client()
    const made = await newcomer.post(`/api/invitations/${latestToken(email, 'invitation', '/invitations')}/accept`, { name: 'New Person', password: GOOD_PASSWORD })
    expect(made.status).toBe(200)
    const me = await newcomer.get('/api/me')
    expect(me.body.emailVerifiedAt).toMatch(/^\d{4}-/)
    expect(me.body.lastOrgId).toBe(admin.orgId)
  })
})

describe('membership', () => {
  it('is never granted without consent: the old add-member route is gone', async () => {
    const admin = await signUp('consent-admin')
    const victim = await signUp('consent-victim')
    const res = await admin.client.post(`/api/orgs/${admin.orgId}/members`, { email: victim.email, role: 'viewer' })
    expect(res.status).toBe(404)
    expect((await victim.client.get('/api/me')).body.memberships).toHaveLength(1)
  })

  it('an invitation answers the same whether or not the address has an account', async () => {
    const admin = await signUp('same-admin')
    const existing = await signUp('same-existing')
    const a = await admin.client.post(`/api/orgs/${admin.orgId}/invitations`, { email: existing.email, role: 'viewer' })
    const b = await admin.client.post(`/api/orgs/${admin.orgId}/invitations`, { email: uniqueEmail('same-none'), role: 'viewer' })
    expect(a.status).toBe(201)
    expect(b.status).toBe(201)
    expect(Object.keys(a.body).sort()).toEqual(Object.keys(b.body).sort())
  })

  it('admins remove members but never the last admin; a member can leave', async () => {
    const admin = await signUp('remove-admin')
    const viewer = await signUp('remove-viewer')
    const engineer = await signUp('remove-engineer')
    await addMember(admin.client, admin.orgId, viewer, 'viewer')
    await addMember(admin.client, admin.orgId, engineer, 'engineer')
    // Not an admin: may not remove someone else.
    expect((await viewer.client.delete(`/api/orgs/${admin.orgId}/members/${engineer.user.id}`)).status).toBe(403)
    // The admin removes the engineer, who loses access at once.
    expect((await admin.client.delete(`/api/orgs/${admin.orgId}/members/${engineer.user.id}`)).status).toBe(200)
    expect((await engineer.client.get(`/api/orgs/${admin.orgId}/sites`)).status).toBe(404)
    // The viewer leaves.
    expect((await viewer.client.delete(`/api/orgs/${admin.orgId}/members/${viewer.user.id}`)).status).toBe(200)
    expect((await viewer.client.get('/api/me')).body.memberships.map((m: { orgId: number }) => m.orgId)).not.toContain(admin.orgId)
    // The last admin can neither leave nor be removed.
    const last = await admin.client.delete(`/api/orgs/${admin.orgId}/members/${admin.user.id}`)
    expect(last.status).toBe(409)
    expect(last.body.message).toMatch(/^userId: the organisation must keep at least one admin/)
    expect((await admin.client.delete(`/api/orgs/${admin.orgId}/members/${engineer.user.id}`)).status).toBe(404)
  })

  it('the organisation opened by default is the one last chosen', async () => {
    const person = await signUp('choice-person')
    const other = await signUp('choice-other')
    await addMember(other.client, other.orgId, person, 'viewer')
    expect((await person.client.patch('/api/me', { lastOrgId: person.orgId })).status).toBe(200)
    expect((await person.client.get('/api/me')).body.lastOrgId).toBe(person.orgId)
    expect((await person.client.patch('/api/me', { lastOrgId: other.orgId })).body.lastOrgId).toBe(other.orgId)
    // Only an organisation of their own.
    const stranger = await signUp('choice-stranger')
    const refused = await person.client.patch('/api/me', { lastOrgId: stranger.orgId })
    expect(refused.status).toBe(404)
    expect(refused.body.message).toMatch(/^lastOrgId:/)
  })
})
