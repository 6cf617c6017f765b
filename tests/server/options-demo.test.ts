import { execFileSync } from 'node:child_process'
import { describe, expect, inject, it } from 'vitest'
import { DEMO_ACCOUNTS, DEMO_OPTIONS, DEMO_PASSWORD } from '../../db/demo-scenario'
import { Client } from './client'

const seed = () =>
  execFileSync(process.execPath, ['--import', 'tsx', 'db/cli.ts', 'seed'], {
    env: { ...process.env, DATABASE_PATH: inject('databasePath') },
    encoding: 'utf8',
  })

const signIn = async (role: 'viewer' | 'engineer') => {
  const account = DEMO_ACCOUNTS.find((a) => a.role === role)!
  const client = new Client()
  const login = await client.post('/api/auth/login', { email: account.email, password: DEMO_PASSWORD })
  expect(login.status).toBe(200)
  return { client, orgId: login.body.memberships[0].orgId as number }
}

describe('demo options and assessments (npm run db:seed)', () => {
  it('gives every demo site an assessed option, three at Hollin Mill weir, and adds none twice', async () => {
    seed()
    seed()
    const { client, orgId } = await signIn('viewer')
    const portfolio = await client.get(`/api/orgs/${orgId}/portfolio?sort=name`)
    expect(portfolio.status).toBe(200)
    expect(portfolio.body.rows.map((r: { name: string }) => r.name)).toEqual(['Cragg Foot drop', 'Hollin Mill weir', 'Skelby gauging weir'])
    for (const row of portfolio.body.rows) {
      expect(row.latest, row.name).not.toBeNull()
      expect(row.latest.stale).toBe(false)
      const options = await client.get(`/api/sites/${row.siteId}/options`)
      const expected = DEMO_OPTIONS.filter((o) => o.siteName === row.name).map((o) => o.option.name)
      expect(options.body.options.map((o: { name: string }) => o.name)).toEqual(expected)
      for (const o of options.body.options) {
        const list = await client.get(`/api/options/${o.id}/assessments`)
        expect(list.body.total, o.name).toBe(1)
      }
    }
    expect(DEMO_OPTIONS.filter((o) => o.siteName === 'Hollin Mill weir')).toHaveLength(3)
  })

  it('stores what the server itself would compute: a fresh assessment of each demo option has the same input and figures', async () => {
    const { client, orgId } = await signIn('engineer')
    const portfolio = await client.get(`/api/orgs/${orgId}/portfolio`)
    for (const row of portfolio.body.rows) {
      const options = await client.get(`/api/sites/${row.siteId}/options`)
      for (const o of options.body.options) {
        const seeded = await client.get(`/api/assessments/${o.latestAssessment.id}`)
        // The Hollin Mill input holds its daily record (a decade of days), not FDC points.
        expect(seeded.body.input.hydrology.kind).toBe(row.name === 'Hollin Mill weir' ? 'record' : 'fdc')
        const fresh = await client.post(`/api/options/${o.id}/assessments`, { rerunOf: o.latestAssessment.id })
        expect(fresh.status).toBe(201)
        expect(fresh.body.input).toEqual(seeded.body.input)
        expect(fresh.body.result.summary).toEqual(seeded.body.result.summary)
      }
    }
  })
})
