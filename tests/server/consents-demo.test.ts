import { execFileSync } from 'node:child_process'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_SUMMARY_TOKEN } from '../../db/demo-scenario'
import { Client } from './client'

// The consents part of the demo scenario, as `npm run db:seed` loads it: Hollin Mill weir's list in
// mixed states with a noise figure, Skelby gauging weir's warning, the decision requiring permissions,
// and the landowner's permissions line.

const seed = () =>
  execFileSync(process.execPath, ['--import', 'tsx', 'db/cli.ts', 'seed'], { env: { ...process.env, DATABASE_PATH: inject('databasePath') }, encoding: 'utf8' })

let client: Client
let sites: { id: number; name: string }[]

beforeAll(async () => {
  seed()
  const account = DEMO_ACCOUNTS.find((a) => a.role === 'viewer')!
  client = new Client()
  const res = await client.post('/api/auth/login', { email: account.email, password: DEMO_PASSWORD })
  expect(res.status).toBe(200)
  sites = (await client.get(`/api/orgs/${res.body.memberships[0].orgId}/sites?q=weir`)).body.sites
})

const siteNamed = (name: string) => sites.find((s) => s.name === name)!.id

describe('the demo consents lists', () => {
  it('shows Hollin Mill weir part-way: granted, applied, refused, not needed and not started, and a noise figure above the default limit', async () => {
    const list = (await client.get(`/api/sites/${siteNamed('Hollin Mill weir')}/consents`)).body
    expect(list.counts).toMatchObject({ granted: 2, 'granted-with-conditions': 1, applied: 2, refused: 1, 'not-needed': 1, 'not-started': 4 })
    expect(list.consents.find((c: { kind: string }) => c.kind === 'grid-connection')).toMatchObject({ status: 'refused', reference: 'NW-CQ-558213' })
    // two 92 dB(A) turbines at 120 m: 92 + 10·lg 2 − (20·lg 120 + 11) ≈ 42.4 dB(A) (ISO 9613-2:1996, 7.1)
    expect(list.noise.check.atDwelling_dBA).toBeCloseTo(42.43, 1)
    expect(list.noise.check.aboveLimit).toBe(true)
    expect(list.eelScreening.triggered).toBe(true)
    expect(list.gaugingWarning).toBeNull()
  })

  it('warns at Skelby gauging weir that the scheme alters the rating', async () => {
    const list = (await client.get(`/api/sites/${siteNamed('Skelby gauging weir')}/consents`)).body
    expect(list.gaugingWarning).toMatch(/alters its rating/)
  })

  it('shows the decision requiring permissions, and the landowner the permissions line', async () => {
    const review = (await client.get(`/api/sites/${siteNamed('Hollin Mill weir')}/review`)).body
    expect(review.decision.requiredConsents).toEqual(['abstraction-licence', 'fish-passage'])
    const summary = await new Client().get(`/api/public/summary/${DEMO_SUMMARY_TOKEN}`)
    expect(summary.body.permissions.line).toBe('Permissions: 3 of 10 granted, 2 applied for, 1 refused (grid connection)')
  })
})
