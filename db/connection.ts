import { mkdirSync } from 'node:fs'
import { dirname } from 'node:path'
import SQLite from 'better-sqlite3'
import { Kysely, Migrator, sql, SqliteDialect } from 'kysely'
import type { Database } from './schema'
import { migrationProvider } from './migrations'

/** Opens one SQLite connection with the pragmas Gillwatt relies on (WAL, foreign keys, busy wait). */
export function openDatabase(path: string): Kysely<Database> {
  if (path !== ':memory:') mkdirSync(dirname(path), { recursive: true })
  const sqlite = new SQLite(path)
  sqlite.pragma('journal_mode = WAL')
  sqlite.pragma('foreign_keys = ON')
  sqlite.pragma('busy_timeout = 5000')
  sqlite.pragma('synchronous = NORMAL')
  return new Kysely<Database>({ dialect: new SqliteDialect({ database: sqlite }) })
}

/** Brings the schema to the newest migration; throws with the failing migration's name. */
export async function migrateToLatest(db: Kysely<Database>): Promise<string | null> {
  const migrator = new Migrator({ db, provider: migrationProvider })
  const { error, results } = await migrator.migrateToLatest()
  const failed = results?.find((r) => r.status === 'Error')
  if (error) {
    throw new Error(`Migration ${failed?.migrationName ?? '(unknown)'} failed: ${String(error)}`)
  }
  return currentMigration(db)
}

/** Name of the newest migration applied to this database, or null on an empty one. */
export async function currentMigration(db: Kysely<Database>): Promise<string | null> {
  const migrator = new Migrator({ db, provider: migrationProvider })
  const all = await migrator.getMigrations()
  return all.filter((m) => m.executedAt).at(-1)?.name ?? null
}

/** Resolves when the database answers a trivial query (the health check); throws why not. */
export async function pingDatabase(db: Kysely<Database>): Promise<void> {
  await sql`select 1`.execute(db)
}
