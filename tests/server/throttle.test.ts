import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startBuiltServer, type BuiltServer } from '../../scripts/builtServer.mjs'
import { Client, GOOD_PASSWORD, uniqueEmail } from './client'

// The sign-in throttle counts failures per account and client address and per client address, with
// growing delays: someone guessing from one place never locks the owner out from another. Runs on
// a server of its own with the default allowances (the shared test server raises the per-address
// ones), trusting X-Forwarded-For so one test can stand for several addresses.

let server: BuiltServer
beforeAll(async () => {
  server = await startBuiltServer({ prefix: 'gillwatt-throttle-', env: { NUXT_TRUST_PROXY: 'true' } })
})
afterAll(async () => {
  await server?.close()
})

const from = (address: string) => ({ headers: { 'x-forwarded-for': address } })

async function newAccount(client: Client, address: string) {
  const email = uniqueEmail('throttled')
  const res = await client.request('POST', '/api/auth/signup', { name: 'Owner', email, password: GOOD_PASSWORD, organisationName: 'Owner org' }, from(address))
  expect(res.status).toBe(202)
  return email
}

describe('sign-in throttle', () => {
  it('locks one account from one address with growing delays, never the owner elsewhere', async () => {
    const client = new Client(server.baseURL)
    const email = await newAccount(client, '198.51.100.1')
    for (let i = 0; i < 5; i++) {
      expect((await client.request('POST', '/api/auth/login', { email, password: `wrong password ${i}` }, from('203.0.113.9'))).status).toBe(401)
    }
    const locked = await client.request('POST', '/api/auth/login', { email, password: 'wrong again' }, from('203.0.113.9'))
    expect(locked.status).toBe(429)
    expect(Number(locked.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(locked.body.message).toMatch(/^email: too many failed sign-ins for this e-mail from your address/)
    // Even the right password waits, from the guessing address...
    expect((await client.request('POST', '/api/auth/login', { email, password: GOOD_PASSWORD }, from('203.0.113.9'))).status).toBe(429)
    // ...but the owner, elsewhere, signs in.
    expect((await new Client(server.baseURL).request('POST', '/api/auth/login', { email, password: GOOD_PASSWORD }, from('198.51.100.1'))).status).toBe(200)
  })

  it('slows one address trying many accounts', async () => {
    const client = new Client(server.baseURL)
    let last = 0
    for (let i = 0; i < 31; i++) {
      last = (await client.request('POST', '/api/auth/login', { email: `nobody-${i}@spray.example`, password: 'guess guess guess' }, from('203.0.113.77'))).status
    }
    expect(last).toBe(429)
    // Another address is unaffected.
    expect((await client.request('POST', '/api/auth/login', { email: 'nobody@spray.example', password: 'guess guess guess' }, from('203.0.113.78'))).status).toBe(401)
  })

  it('answers an unknown and a known e-mail with the same words', async () => {
    const client = new Client(server.baseURL)
    const email = await newAccount(client, '198.51.100.2')
    const known = await client.request('POST', '/api/auth/login', { email, password: 'not the password' }, from('198.51.100.3'))
    const unknown = await client.request('POST', '/api/auth/login', { email: uniqueEmail('nobody'), password: 'not the password' }, from('198.51.100.3'))
    expect(known.status).toBe(401)
    expect(unknown.body).toEqual(known.body)
  })

  it('limits password-reset requests per e-mail and sign-ups per address', async () => {
    const client = new Client(server.baseURL)
    const email = uniqueEmail('reset-flood')
    const statuses: number[] = []
    for (let i = 0; i < 6; i++) statuses.push((await client.request('POST', '/api/auth/password-reset', { email }, from(`192.0.2.${i + 1}`))).status)
    expect(statuses.slice(0, 5)).toEqual([202, 202, 202, 202, 202])
    expect(statuses[5]).toBe(429)
    const signups: number[] = []
    for (let i = 0; i < 11; i++) signups.push((await client.request('POST', '/api/auth/signup', { name: 'Flood', email: uniqueEmail('flood'), password: GOOD_PASSWORD, organisationName: 'Flood' }, from('192.0.2.200'))).status)
    expect(signups.slice(0, 10).every((s) => s === 202)).toBe(true)
    expect(signups[10]).toBe(429)
  })

  it('slows one address opening many unknown links', async () => {
    const client = new Client(server.baseURL)
    let last = 0
    for (let i = 0; i < 31; i++) last = (await client.request('GET', `/api/invitations/guess-${i}-aaaaaaaaaaaa`, undefined, from('203.0.113.50'))).status
    expect(last).toBe(429)
    // One bucket for every kind of link: summary links and reset links are slowed for that address too.
    expect((await client.request('GET', '/api/public/summary/guess-summary-aaaaaaaa', undefined, from('203.0.113.50'))).status).toBe(429)
    expect((await client.request('POST', '/api/auth/password-reset/guess-reset-aaaaaaa', { password: 'whatever long enough' }, from('203.0.113.50'))).status).toBe(429)
    expect((await client.request('GET', '/api/invitations/guess-x-aaaaaaaaaaaa', undefined, from('203.0.113.51'))).status).toBe(404)
    expect((await client.request('GET', '/api/public/summary/guess-summary-aaaaaaaa', undefined, from('203.0.113.51'))).status).toBe(404)
  })
})
