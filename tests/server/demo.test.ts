import { execFileSync } from 'node:child_process'
import { describe, expect, inject, it } from 'vitest'
import { DEMO_ACCOUNTS, DEMO_CURRENCY, DEMO_ORGANISATION, DEMO_PASSWORD } from '../../db/demo-scenario'
import { Client } from './client'

const seed = () =>
  execFileSync(process.execPath, ['--import', 'tsx', 'db/cli.ts', 'seed'], {
    env: { ...process.env, DATABASE_PATH: inject('databasePath') },
    encoding: 'utf8',
  })

describe('demo scenario (npm run db:seed)', () => {
  it('loads, is safe to run twice, and every demo account signs in with its role', async () => {
    expect(seed()).toContain('Demo scenario')
    expect(seed()).toContain('already present')
    for (const account of DEMO_ACCOUNTS) {
      const client = new Client()
      const res = await client.post('/api/auth/login', { email: account.email, password: DEMO_PASSWORD })
      expect(res.status, account.email).toBe(200)
      expect(res.body.memberships).toEqual([{ orgId: expect.any(Number), orgName: DEMO_ORGANISATION, role: account.role, currency: DEMO_CURRENCY }])
    }
  })

  it('gives the demo viewer 403 on the admin-only audit trail, and the demo admin 200', async () => {
    const login = async (role: string) => {
      const account = DEMO_ACCOUNTS.find((a) => a.role === role)!
      const client = new Client()
      const res = await client.post('/api/auth/login', { email: account.email, password: DEMO_PASSWORD })
      return { client, orgId: res.body.memberships[0].orgId as number }
    }
    const viewer = await login('viewer')
    expect((await viewer.client.get(`/api/orgs/${viewer.orgId}/audit`)).status).toBe(403)
    const admin = await login('admin')
    expect((await admin.client.get(`/api/orgs/${admin.orgId}/audit`)).status).toBe(200)
  })
})
