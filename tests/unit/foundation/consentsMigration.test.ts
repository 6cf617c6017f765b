import { Migrator } from 'kysely'
import { afterEach, describe, expect, it } from 'vitest'
import { migrateToLatest, type openDatabase } from '../../../db/connection'
import { migrationProvider } from '../../../db/migrations'
import { loadConsentList, updateConsent, updateConstraints } from '../../../server/domain/consents'
import { isDomainError } from '../../../server/domain/errors'
import { databaseAt } from './migrationFixtures'

// Migration 0015 (the consents list, the site's constraints, and the permissions a review decision
// requires) on a database stored before it, and the domain operations over its tables.

let db: ReturnType<typeof openDatabase> | undefined
afterEach(async () => {
  await db?.destroy()
  db = undefined
})

const NOW = '2026-10-01T10:00:00.000Z'

async function before() {
  const at = await databaseAt('0013_assessment_baseline')
  db = at.db
  await at.db.insertInto('site_reviews').values({ site_id: at.siteId, org_id: at.orgId, state: 'submitted', assessment_id: null, submitted_by: null, submitted_at: NOW, decided_by: null, decided_at: null, reason: null, conditions: null }).execute()
  await at.db.insertInto('review_events').values({ site_id: at.siteId, org_id: at.orgId, kind: 'submitted', from_state: 'draft', to_state: 'submitted', user_id: null, assessment_id: null, note: null, reason: null, conditions: null }).execute()
  await migrateToLatest(at.db)
  return at
}

describe('migration 0015_consents', () => {
  it('gives stored reviews and their history no required permissions, and lists every kind of a site as not started', async () => {
    const { db: d, siteId } = await before()
    expect((await d.selectFrom('site_reviews').select('required_consents').executeTakeFirstOrThrow()).required_consents).toBe('[]')
    expect((await d.selectFrom('review_events').select('required_consents').executeTakeFirstOrThrow()).required_consents).toBe('[]')
    const list = await loadConsentList(d, { id: siteId }, true)
    expect(list.consents.every((c) => c.status === 'not-started' && c.version === 0)).toBe(true)
    expect(list.constraints).toEqual({ nearestDwelling_m: null, noiseLimit_dBA: null, isGaugingStation: false, version: 0 })
    expect(list.scheme).toBeNull()
    expect(list.noise.missing).toBe('add an option to the site')
  })

  it('keeps one row per site and kind, and only the known statuses', async () => {
    const { db: d, siteId, orgId } = await before()
    const row = { site_id: siteId, org_id: orgId, kind: 'noise', status: 'applied', reference: '', applied_on: null, decided_on: null, conditions: '', notes: '', created_by: null, updated_by: null }
    await d.insertInto('site_consents').values(row).execute()
    await expect(d.insertInto('site_consents').values(row).execute()).rejects.toThrow(/UNIQUE/)
    await expect(d.insertInto('site_consents').values({ ...row, kind: 'heritage', status: 'pending' }).execute()).rejects.toThrow(/CHECK/)
  })

  it('goes down again to 0013', async () => {
    const { db: d } = await before()
    const { error } = await new Migrator({ db: d, provider: migrationProvider }).migrateTo('0013_assessment_baseline')
    expect(error).toBeUndefined()
    const tables = (await d.introspection.getTables()).map((t) => t.name)
    expect(tables).not.toContain('site_consents')
    expect(tables).not.toContain('site_constraints')
  })
})

describe('consent operations', () => {
  it('saves a permission at version 0, then refuses a stale version with 409 and a decision before the stored application with 422', async () => {
    const { db: d, siteId, orgId } = await before()
    const site = { id: siteId, org_id: orgId }
    const userId = (await d.insertInto('users').values({ email: 'e@test.example', name: 'E', password_hash: 'x' }).returning('id').executeTakeFirstOrThrow()).id
    const first = await updateConsent(d, { site, kind: 'flood-risk-permit', patch: { version: 0, status: 'applied', appliedOn: '2026-03-02' }, userId, now: NOW })
    expect(first.consent).toMatchObject({ status: 'applied', appliedOn: '2026-03-02', version: 1 })
    expect(first.changed).toEqual(['status', 'appliedOn'])
    const stale = await updateConsent(d, { site, kind: 'flood-risk-permit', patch: { version: 0, status: 'granted' }, userId, now: NOW }).catch((e: unknown) => e)
    expect(isDomainError(stale) && stale.status).toBe(409)
    const early = await updateConsent(d, { site, kind: 'flood-risk-permit', patch: { version: 1, decidedOn: '2026-01-01' }, userId, now: NOW }).catch((e: unknown) => e)
    expect(isDomainError(early) && early.status).toBe(422)
    expect(isDomainError(early) && early.field).toBe('decidedOn')
    const c = await updateConstraints(d, { site, patch: { version: 0, isGaugingStation: true }, userId, now: NOW })
    expect(c.constraints).toMatchObject({ isGaugingStation: true, version: 1 })
    expect((await loadConsentList(d, site, false)).gaugingWarning).toMatch(/gauging station/)
  })
})
