import { describe, expect, it } from 'vitest'
import { Client, GOOD_PASSWORD, signUp } from './client'
import { latestToken, testDb } from './mailbox'

// Sessions live on the server: a cookie copied before sign-out, a password change or a reset is
// worth nothing afterwards, and a person can see and end their other sessions.

describe('server-side sessions', () => {
  it('end at sign-out, also for a copy of the cookie taken before', async () => {
    const { client } = await signUp('sess-logout')
    const copy = client.copy()
    expect((await copy.get('/api/me')).status).toBe(200)
    expect((await client.post('/api/auth/logout')).status).toBe(200)
    const after = await copy.get('/api/me')
    expect(after.status).toBe(401)
    expect(after.body.statusMessage).toBe('Unauthorized')
    expect(after.body.message).toBe('Sign in to continue')
  })

  it('all end after a password reset', async () => {
    const { client, email } = await signUp('sess-reset')
    const second = new Client()
    expect((await second.post('/api/auth/login', { email, password: GOOD_PASSWORD })).status).toBe(200)
    expect((await new Client().post('/api/auth/password-reset', { email })).status).toBe(202)
    const reset = await new Client().post(`/api/auth/password-reset/${latestToken(email, 'password-reset', '/reset-password')}`, { password: 'a brand new password' })
    expect(reset.status).toBe(200)
    expect((await client.get('/api/me')).status).toBe(401)
    expect((await second.get('/api/me')).status).toBe(401)
    expect((await new Client().post('/api/auth/login', { email, password: 'a brand new password' })).status).toBe(200)
  })

  it('end elsewhere on a password change, while this browser stays signed in', async () => {
    const { client, email } = await signUp('sess-change')
    const other = new Client()
    await other.post('/api/auth/login', { email, password: GOOD_PASSWORD })
    const copy = client.copy()
    const wrong = await client.post('/api/account/password', { currentPassword: 'not it at all', newPassword: 'another good password' })
    expect(wrong.status).toBe(400)
    expect(wrong.body.message).toMatch(/^currentPassword:/)
    const changed = await client.post('/api/account/password', { currentPassword: GOOD_PASSWORD, newPassword: 'another good password' })
    expect(changed.status).toBe(200)
    expect((await client.get('/api/me')).status).toBe(200)
    expect((await other.get('/api/me')).status).toBe(401)
    expect((await copy.get('/api/me')).status).toBe(401)
  })

  it('are listed for their owner, who can sign out everywhere else', async () => {
    const { client, email, user } = await signUp('sess-list')
    const laptop = new Client()
    await laptop.request('POST', '/api/auth/login', { email, password: GOOD_PASSWORD }, { headers: { 'user-agent': 'Laptop browser 1.0' } })
    const list = await client.get('/api/account/sessions')
    expect(list.status).toBe(200)
    expect(list.body.sessions).toHaveLength(2)
    expect(list.body.sessions.filter((s: { current: boolean }) => s.current)).toHaveLength(1)
    expect(list.body.sessions.map((s: { userAgent: string }) => s.userAgent)).toContain('Laptop browser 1.0')
    expect(JSON.stringify(list.body)).not.toMatch(/key/i)
    // Nobody else's sessions, and no key stored in the clear.
    const stranger = await signUp('sess-stranger')
    const others = await stranger.client.get('/api/account/sessions')
    expect(others.body.sessions).toHaveLength(1)
    const laptopId = list.body.sessions.find((s: { current: boolean }) => !s.current).id
    expect((await stranger.client.delete(`/api/account/sessions/${laptopId}`)).status).toBe(404)
    const rows = testDb().prepare('select key_hash from sessions where user_id = ?').all(user.id) as { key_hash: string }[]
    expect(rows.every((r) => /^[0-9a-f]{64}$/.test(r.key_hash))).toBe(true)

    const ended = await client.post('/api/account/sessions/end-others')
    expect(ended.status).toBe(200)
    expect(ended.body.ended).toBe(1)
    expect((await laptop.get('/api/me')).status).toBe(401)
    expect((await client.get('/api/me')).status).toBe(200)
    expect((await client.get('/api/account/sessions')).body.sessions).toHaveLength(1)
  })

  it('can end one other session by id', async () => {
    const { client, email } = await signUp('sess-one')
    const phone = new Client()
    await phone.post('/api/auth/login', { email, password: GOOD_PASSWORD })
    const { sessions } = (await client.get('/api/account/sessions')).body
    const phoneId = sessions.find((s: { current: boolean }) => !s.current).id
    expect((await client.delete(`/api/account/sessions/${phoneId}`)).status).toBe(200)
    expect((await phone.get('/api/me')).status).toBe(401)
    expect((await client.get('/api/me')).status).toBe(200)
  })

  it('signed-out callers of the account routes get 401', async () => {
    const nobody = new Client()
    expect((await nobody.get('/api/account/sessions')).status).toBe(401)
    expect((await nobody.post('/api/account/sessions/end-others')).status).toBe(401)
    expect((await nobody.post('/api/account/password', { currentPassword: 'x', newPassword: 'yyyyyyyyyyyy' })).status).toBe(401)
  })
})
