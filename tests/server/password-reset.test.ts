import { createHash } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { Client, GOOD_PASSWORD, signUp, uniqueEmail } from './client'
import { lastOutboxId, outboxSince, testDb, tokenFromMail } from './review-helpers'

// Password reset: the request always answers 202 with the same words and mails a link only when
// the account exists; the link is stored hashed, works once and for an hour; requests are throttled.

const NEW_PASSWORD = 'a brand new passphrase'
const sha256 = (s: string) => createHash('sha256').update(s).digest('hex')
const request = (email: string) => new Client().post('/api/auth/password-reset', { email })

async function resetLink(email: string) {
  const before = lastOutboxId()
  const res = await request(email)
  expect(res.status).toBe(202)
  const mails = outboxSince(before)
  expect(mails).toHaveLength(1)
  return { mail: mails[0]!, token: tokenFromMail(mails[0]!.text, '/reset-password') }
}

describe('asking for a reset', () => {
  it('answers 202 with the same words whether or not the account exists, mailing only a real one', async () => {
    const person = await signUp('forgetful')
    const before = lastOutboxId()
    const known = await request(person.email)
    const unknown = await request(uniqueEmail('nobody'))
    expect(known.status).toBe(202)
    expect(unknown.status).toBe(202)
    expect(unknown.body).toEqual(known.body)
    const mails = outboxSince(before)
    expect(mails.map((m) => [m.to_address, m.kind, m.org_id])).toEqual([[person.email, 'password-reset', null]])
    expect(mails[0]!.subject).toBe('Reset your Gillwatt password')
    const token = tokenFromMail(mails[0]!.text, '/reset-password')
    const row = testDb().prepare('select token_hash, expires_at, created_at from password_resets where token_hash = ?').get(sha256(token)) as { expires_at: string; created_at: string }
    expect(row).toBeDefined()
    const minutes = (Date.parse(row.expires_at) - Date.parse(row.created_at)) / 60_000
    expect(Math.round(minutes)).toBe(60)
  })

  it('names a bad e-mail with 400', async () => {
    const res = await request('not-an-address')
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^email:/)
  })

  it('is throttled per e-mail like sign-in, for known and unknown e-mails alike', async () => {
    for (const email of [(await signUp('throttled')).email, uniqueEmail('ghost')]) {
      for (let i = 0; i < 5; i++) expect((await request(email)).status).toBe(202)
      const sixth = await request(email)
      expect(sixth.status, email).toBe(429)
      expect(sixth.body.message).toMatch(/^email: too many/)
      expect(Number(sixth.headers.get('retry-after'))).toBeGreaterThan(0)
    }
  })
})

describe('using a reset link', () => {
  it('sets the new password once; the old one stops working', async () => {
    const person = await signUp('resetter')
    const { token } = await resetLink(person.email)
    const short = await new Client().post(`/api/auth/password-reset/${token}`, { password: 'short' })
    expect(short.status).toBe(400)
    expect(short.body.message).toMatch(/^password:/)
    const res = await new Client().post(`/api/auth/password-reset/${token}`, { password: NEW_PASSWORD })
    expect(res.status).toBe(200)
    expect(res.body.email).toBe(person.email)
    expect((await new Client().post('/api/auth/login', { email: person.email, password: GOOD_PASSWORD })).status).toBe(401)
    expect((await new Client().post('/api/auth/login', { email: person.email, password: NEW_PASSWORD })).status).toBe(200)
    const again = await new Client().post(`/api/auth/password-reset/${token}`, { password: 'yet another passphrase' })
    expect(again.status).toBe(410)
    expect(again.body.message).toMatch(/already been used/)
  })

  it('closes the other open links of the account when one is used', async () => {
    const person = await signUp('two-links')
    const first = await resetLink(person.email)
    const second = await resetLink(person.email)
    expect((await new Client().post(`/api/auth/password-reset/${second.token}`, { password: NEW_PASSWORD })).status).toBe(200)
    expect((await new Client().post(`/api/auth/password-reset/${first.token}`, { password: 'other passphrase 1' })).status).toBe(410)
  })

  it('expires after an hour with 410, and an unknown token is 404', async () => {
    const person = await signUp('late')
    const { token } = await resetLink(person.email)
    testDb().prepare('update password_resets set expires_at = ? where token_hash = ?').run(new Date(Date.now() - 60_000).toISOString(), sha256(token))
    const res = await new Client().post(`/api/auth/password-reset/${token}`, { password: NEW_PASSWORD })
    expect(res.status).toBe(410)
    expect(res.body.message).toMatch(/expired/)
    expect((await new Client().post('/api/auth/login', { email: person.email, password: GOOD_PASSWORD })).status).toBe(200)
    const unknown = await new Client().post('/api/auth/password-reset/AAAAAAAAAAAAAAAAAAAAAA', { password: NEW_PASSWORD })
    expect(unknown.status).toBe(404)
  })
})
