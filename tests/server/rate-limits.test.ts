import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startBuiltServer, type BuiltServer } from '../../scripts/builtServer.mjs'
import { signUp, uniqueEmail } from './client'
import { createSite } from './sites-helpers'

// Per-person rate limits on the routes that send e-mail to addresses the caller chooses, and on
// uploads: past the allowance, 429 with Retry-After, for that person only. On a server of its own
// with the default limits (the shared test server raises them for its property tests).

let server: BuiltServer
beforeAll(async () => {
  server = await startBuiltServer({ prefix: 'gillwatt-rates-' })
})
afterAll(async () => {
  await server?.close()
})

describe('per-person rate limits', () => {
  it('stop a person sending more than 30 invitations an hour, and no one else', async () => {
    const admin = await signUp('rate-inviter', { verify: false, baseURL: server.baseURL })
    const statuses: number[] = []
    for (let i = 0; i < 31; i++) statuses.push((await admin.client.post(`/api/orgs/${admin.orgId}/invitations`, { email: uniqueEmail('rate-invited'), role: 'viewer' })).status)
    expect(statuses.slice(0, 30).every((s) => s === 201)).toBe(true)
    const refused = await admin.client.post(`/api/orgs/${admin.orgId}/invitations`, { email: uniqueEmail('rate-invited'), role: 'viewer' })
    expect(refused.status).toBe(429)
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(refused.body.message).toMatch(/^Too many invitations: at most 30 an hour for each person/)
    const other = await signUp('rate-other-inviter', { verify: false, baseURL: server.baseURL })
    expect((await other.client.post(`/api/orgs/${other.orgId}/invitations`, { email: uniqueEmail('rate-invited'), role: 'viewer' })).status).toBe(201)
  })

  it('stop a person uploading more than 30 files a minute', async () => {
    const engineer = await signUp('rate-uploader', { verify: false, baseURL: server.baseURL })
    const site = await createSite(engineer.client, engineer.orgId)
    const csv = { file: { name: 'flows.csv', type: 'text/csv', data: 'date,flow\n2024-01-01,1.5\n2024-01-02,1.6\n' } }
    const statuses: number[] = []
    for (let i = 0; i < 31; i++) statuses.push((await engineer.client.upload(`/api/sites/${site.id}/flow-record`, csv)).status)
    expect(statuses.slice(0, 30).every((s) => s === 201)).toBe(true)
    expect(statuses[30]).toBe(429)
  })
})
