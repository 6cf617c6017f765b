import { sql } from 'kysely'
import { afterEach, describe, expect, it } from 'vitest'
import { currentMigration, migrateToLatest, openDatabase } from '../../../db/connection'
import { DEMO_ACCOUNTS, DEMO_ORGANISATION } from '../../../db/demo-scenario'
import { LATEST_MIGRATION, migrations } from '../../../db/migrations'
import { seedDemo } from '../../../db/seed'

const fakeHash = async (pw: string) => `fake:${pw}`
let db: ReturnType<typeof openDatabase> | undefined
afterEach(async () => {
  await db?.destroy()
  db = undefined
})

describe('migrations', () => {
  it('bring an empty database to the newest level, and can be undone', async () => {
    db = openDatabase(':memory:')
    expect(await currentMigration(db)).toBeNull()
    expect(await migrateToLatest(db)).toBe(LATEST_MIGRATION)
    const tables = await sql<{ name: string }>`select name from sqlite_master where type = 'table' and name not like 'kysely%' and name not like 'sqlite%' order by name`.execute(db)
    expect(tables.rows.map((r) => r.name)).toEqual(expect.arrayContaining(['audit_log', 'memberships', 'organisations', 'sessions', 'throttle_hits', 'users']))
    for (const name of Object.keys(migrations).reverse()) await migrations[name]!.down!(db as never)
    const left = await sql<{ name: string }>`select name from sqlite_master where type = 'table' and name not like 'kysely%' and name not like 'sqlite%'`.execute(db)
    expect(left.rows).toEqual([])
  })

  it('enforce foreign keys and the role list', async () => {
    db = openDatabase(':memory:')
    await migrateToLatest(db)
    await expect(db.insertInto('memberships').values({ user_id: 999, org_id: 999, role: 'admin' }).execute()).rejects.toThrow(/FOREIGN KEY/)
    const user = await db.insertInto('users').values({ email: 'a@b.example', name: 'A', password_hash: 'x' }).returning('id').executeTakeFirstOrThrow()
    const org = await db.insertInto('organisations').values({ name: 'O' }).returning('id').executeTakeFirstOrThrow()
    await expect(db.insertInto('memberships').values({ user_id: user.id, org_id: org.id, role: 'owner' as never }).execute()).rejects.toThrow(/CHECK/)
  })
})

describe('demo scenario', () => {
  it('loads one organisation with an account per role, and is safe to run twice', async () => {
    db = openDatabase(':memory:')
    await migrateToLatest(db)
    const first = await seedDemo(db, fakeHash)
    expect(first.created).toBeGreaterThanOrEqual(1 + DEMO_ACCOUNTS.length)
    const second = await seedDemo(db, fakeHash)
    expect(second).toEqual({ orgId: first.orgId, created: 0 })
    const rows = await db
      .selectFrom('memberships')
      .innerJoin('users', 'users.id', 'memberships.user_id')
      .innerJoin('organisations', 'organisations.id', 'memberships.org_id')
      .select(['users.email', 'memberships.role', 'organisations.name'])
      .orderBy('users.email')
      .execute()
    expect(rows).toHaveLength(DEMO_ACCOUNTS.length)
    expect(new Set(rows.map((r) => r.role))).toEqual(new Set(['admin', 'engineer', 'reviewer', 'viewer']))
    expect(rows.every((r) => r.name === DEMO_ORGANISATION && r.email.endsWith('.example'))).toBe(true)
  }, 60_000) // the demo stores a real assessment, Monte Carlo included, for each of its options
})
