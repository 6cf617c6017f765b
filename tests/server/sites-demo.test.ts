import { execFileSync } from 'node:child_process'
import { describe, expect, inject, it } from 'vitest'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../db/demo-scenario'
import { Client } from './client'

const seed = () =>
  execFileSync(process.execPath, ['--import', 'tsx', 'db/cli.ts', 'seed'], {
    env: { ...process.env, DATABASE_PATH: inject('databasePath') },
    encoding: 'utf8',
  })

describe('demo sites (npm run db:seed)', () => {
  it('shows the demo viewer three sites on the Brackwin Water, one with a decade of daily flows, and adds none twice', async () => {
    seed()
    seed()
    const viewer = DEMO_ACCOUNTS.find((a) => a.role === 'viewer')!
    const client = new Client()
    const login = await client.post('/api/auth/login', { email: viewer.email, password: DEMO_PASSWORD })
    const orgId = login.body.memberships[0].orgId as number
    const list = await client.get(`/api/orgs/${orgId}/sites?sort=name`)
    expect(list.status).toBe(200)
    expect(list.body.sites.map((s: { name: string }) => s.name)).toEqual(['Cragg Foot drop', 'Hollin Mill weir', 'Skelby gauging weir'])
    expect(list.body.sites.every((s: { riverName: string }) => s.riverName === 'Brackwin Water')).toBe(true)
    expect(list.body.sites.map((s: { hydrologySource: string }) => s.hydrologySource)).toEqual(['points', 'record', 'points'])

    const hollin = list.body.sites[1]
    const record = await client.get(`/api/sites/${hollin.id}/flow-record`)
    expect(record.body.record.years).toBeGreaterThanOrEqual(10)
    expect(record.body.record.gapDays).toBeGreaterThan(0)
    const hyd = await client.get(`/api/sites/${hollin.id}/hydrology`)
    expect(hyd.body.source).toBe('record')
    expect(hyd.body.stats.mean).toBeGreaterThanOrEqual(2)
    expect(hyd.body.stats.mean).toBeLessThanOrEqual(12)

    const cragg = await client.get(`/api/sites/${list.body.sites[0].id}`)
    expect(cragg.body.headTable.length).toBeGreaterThan(0)
    const craggHyd = await client.get(`/api/sites/${list.body.sites[0].id}/hydrology`)
    expect(craggHyd.body.scale.factor).toBeCloseTo(148 / 121, 12)

    // the gauging weir takes its heads from the weir's hydraulics, with a Manning tail
    const skelby = await client.get(`/api/sites/${list.body.sites[2].id}`)
    expect(skelby.body.weir.hydraulics).toMatchObject({ crestHeight_m: 1.9, tail: { kind: 'manning', channelWidth_m: 14 } })
  })
})
