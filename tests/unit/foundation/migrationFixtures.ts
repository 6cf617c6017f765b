// A database stopped at one migration, holding one organisation and one site as the server stored
// them then: the start of every migration test that rewrites stored rows.
import { Migrator } from 'kysely'
import { openDatabase } from '../../../db/connection'
import { migrationProvider } from '../../../db/migrations'

/** An in-memory database migrated up to `migration` (inclusive), with one organisation and one site; their ids. */
export async function databaseAt(migration: string, site: { gross_head_m?: number } = {}) {
  const db = openDatabase(':memory:')
  const { error } = await new Migrator({ db, provider: migrationProvider }).migrateTo(migration)
  if (error) throw error
  const org = await db.insertInto('organisations').values({ name: 'O' }).returning('id').executeTakeFirstOrThrow()
  const row = await db.insertInto('sites').values({
    org_id: org.id, name: 'S', river_name: 'R', lat: 54, lng: -2, altitude_m: 100, gross_head_m: site.gross_head_m ?? 2.4, target_oxygen_mgl: 6, reach: null,
    weir: '{}', reserved_flow: JSON.stringify({ kind: 'percentile', exceedance: 95 }), months: '[]',
    catchment: null, created_by: null, deleted_at: null, deleted_by: null,
  }).returning('id').executeTakeFirstOrThrow()
  return { db, orgId: org.id, siteId: row.id }
}
