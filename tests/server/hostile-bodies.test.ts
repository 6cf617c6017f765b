import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import { Client, signUp } from './client'

// Whatever JSON arrives, the foundation routes answer with a 4xx and a message, never a 5xx.
let admin: Client
let orgId: number
let userId: number

beforeAll(async () => {
  const owner = await signUp('hostile')
  admin = owner.client
  orgId = owner.orgId
  userId = owner.user.id
})

const anyBody = fc.oneof(
  fc.jsonValue(),
  fc.record({ email: fc.jsonValue(), password: fc.jsonValue(), name: fc.jsonValue(), organisationName: fc.jsonValue(), role: fc.jsonValue() }, { requiredKeys: [] }),
  fc.record({ email: fc.string({ maxLength: 400 }), password: fc.string({ maxLength: 400 }) }),
)

describe('hostile request bodies', () => {
  it('never make a route answer 5xx', async () => {
    const routes: [string, string][] = [
      ['POST', '/api/auth/signup'],
      ['POST', '/api/auth/login'],
      ['POST', '/api/orgs'],
      ['POST', `/api/orgs/${orgId}/invitations`],
      ['PATCH', '/api/me'],
      ['POST', '/api/account/password'],
      ['PATCH', `/api/orgs/${orgId}/members/${userId}`],
    ]
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...routes), anyBody, async ([method, path], body) => {
        const res = await admin.request(method, path, JSON.stringify(body))
        expect(res.status, `${method} ${path} ${JSON.stringify(body)}`).toBeLessThan(500)
        if (res.status >= 400) expect(typeof res.body?.message).toBe('string')
      }),
      { numRuns: 150 },
    )
    // The admin is still the admin afterwards.
    const me = await admin.get('/api/me')
    expect(me.body.memberships.find((m: { orgId: number }) => m.orgId === orgId).role).toBe('admin')
  })
})

describe('bodies that are not JSON at all', () => {
  it('are refused with a 400 naming the body, before any route reads them', async () => {
    const client = new Client()
    for (const text of ['{"email": ', '{"__proto__": {"admin": true}, "email": "a@b.example"}', '{"constructor": {"prototype": {}}}']) {
      const res = await client.request('POST', '/api/auth/login', text)
      expect(res.status, text).toBe(400)
      expect(res.body.message, text).toMatch(/^body: is not valid JSON/)
    }
    // Valid JSON of the wrong shape is the schema's to refuse, naming the body.
    const number = await client.request('POST', '/api/auth/login', '12345678901234567890')
    expect(number.status).toBe(400)
    expect(number.body.message).toMatch(/^body: /)
    // A good body still reaches the route, whose own checks answer.
    const good = await client.request('POST', '/api/auth/login', JSON.stringify({ email: 'nobody@nowhere.example', password: 'wrong-password-123' }))
    expect(good.status).toBe(401)
  })
})
