import { describe, expect, it } from 'vitest'
import { Client, GOOD_PASSWORD, signUp, uniqueEmail } from './client'

describe('sign-up', () => {
  it('creates a person and their organisation as admin, who can then sign in', async () => {
    const client = new Client()
    const email = uniqueEmail('signup')
    const res = await client.post('/api/auth/signup', { name: 'Ann Ford', email: `  ${email.toUpperCase()} `, password: GOOD_PASSWORD, organisationName: 'Ford Hydro' })
    expect(res.status).toBe(202)
    expect(res.body.message).toMatch(/Check your e-mail/)
    const login = await client.post('/api/auth/login', { email, password: GOOD_PASSWORD })
    expect(login.body.user.email).toBe(email)
    expect(login.body.memberships).toEqual([{ orgId: expect.any(Number), orgName: 'Ford Hydro', role: 'admin', currency: { code: 'GBP', symbol: '£' } }])
    expect(login.body.lastOrgId).toBe(login.body.memberships[0].orgId)
    const me = await client.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe(email)
    expect(JSON.stringify(me.body)).not.toContain('password')
  })

  it('makes no second account on the same e-mail, answering as for a new one', async () => {
    const { email } = await signUp('dupe')
    const res = await new Client().post('/api/auth/signup', { name: 'Other', email, password: 'another password entirely', organisationName: 'X' })
    expect(res.status).toBe(202)
    expect((await new Client().post('/api/auth/login', { email, password: 'another password entirely' })).status).toBe(401)
  })

  it('answers 400 naming the field for a malformed body', async () => {
    const client = new Client()
    const short = await client.post('/api/auth/signup', { name: 'A', email: uniqueEmail('short'), password: 'short', organisationName: 'X' })
    expect(short.status).toBe(400)
    expect(short.body.message).toMatch(/^password:/)
    expect(short.body.data.issues[0]).toMatchObject({ path: 'password' })

    const badEmail = await client.post('/api/auth/signup', { name: 'A', email: 'not-an-address', password: GOOD_PASSWORD, organisationName: 'X' })
    expect(badEmail.status).toBe(400)
    expect(badEmail.body.message).toMatch(/^email:/)

    const wrongType = await client.post('/api/auth/signup', { name: 42, email: uniqueEmail('t'), password: GOOD_PASSWORD, organisationName: 'X' })
    expect(wrongType.status).toBe(400)
    expect(wrongType.body.message).toMatch(/^name:/)
  })

  it('answers 400, not 500, for bodies that are not JSON objects', async () => {
    const client = new Client()
    for (const raw of ['{"email":', '[]', 'null', '"text"', '12']) {
      const res = await client.request('POST', '/api/auth/signup', raw)
      expect(res.status, raw).toBe(400)
      expect(res.body.message, raw).toBeTruthy()
    }
  })
})

describe('sign-in and sign-out', () => {
  it('signs in with the right password and out again', async () => {
    const { email } = await signUp('login')
    const client = new Client()
    expect((await client.get('/api/me')).status).toBe(401)
    const res = await client.post('/api/auth/login', { email, password: GOOD_PASSWORD })
    expect(res.status).toBe(200)
    expect(res.body.memberships).toHaveLength(1)
    expect((await client.get('/api/me')).status).toBe(200)
    expect((await client.post('/api/auth/logout')).status).toBe(200)
    expect((await client.get('/api/me')).status).toBe(401)
  })

  it('answers 401 for a wrong password and for an unknown e-mail, alike', async () => {
    const { email } = await signUp('wrongpw')
    const wrong = await new Client().post('/api/auth/login', { email, password: 'not the password' })
    expect(wrong.status).toBe(401)
    const unknown = await new Client().post('/api/auth/login', { email: uniqueEmail('nobody'), password: 'whatever it is' })
    expect(unknown.status).toBe(401)
    expect(unknown.body.message).toBe(wrong.body.message)
  })

  it('throttles repeated failures for one e-mail with 429 and a retry time, even with the right password', async () => {
    const { email } = await signUp('throttle')
    const client = new Client()
    for (let i = 0; i < 5; i++) {
      expect((await client.post('/api/auth/login', { email, password: `wrong-${i}` })).status).toBe(401)
    }
    const blocked = await client.post('/api/auth/login', { email, password: GOOD_PASSWORD })
    expect(blocked.status).toBe(429)
    const retry = Number(blocked.headers.get('retry-after'))
    expect(retry).toBeGreaterThan(0)
    expect(retry).toBeLessThanOrEqual(15 * 60)
    expect(blocked.body.data.retryAfter_s).toBe(retry)
    expect(blocked.body.message).toMatch(/try again/i)
    // Another e-mail is not affected.
    const other = await signUp('unthrottled')
    expect((await new Client().post('/api/auth/login', { email: other.email, password: GOOD_PASSWORD })).status).toBe(200)
  })

  it('answers 400 naming the field when the e-mail is missing', async () => {
    const res = await new Client().post('/api/auth/login', { password: 'x' })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^email:/)
  })
})

describe('health', () => {
  it('reports the database, its migration level and the engine version', async () => {
    const res = await new Client().get('/api/health')
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ ok: true, database: 'ok', migration: res.body.latestMigration })
    expect(res.body.engineVersion).toMatch(/^\d+\.\d+\.\d+$/)
  })
})
