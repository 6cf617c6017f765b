import type { Kysely } from 'kysely'
import { migrateToLatest, openDatabase } from '../../db/connection'
import type { Database } from '../../db/schema'

let db: Kysely<Database> | undefined
let ready: Promise<string | null> | undefined

/** Where the SQLite file lives: env DATABASE_PATH, else runtime config, else .data/gillwatt.sqlite. */
export function databasePath(): string {
  return process.env.DATABASE_PATH || useRuntimeConfig().databasePath || '.data/gillwatt.sqlite'
}

/** The one Kysely instance of this server process, opened on first use. */
export function useDb(): Kysely<Database> {
  db ??= openDatabase(databasePath())
  return db
}

/** Resolves once migrations have run; the first caller starts them. */
export function databaseReady(): Promise<string | null> {
  ready ??= migrateToLatest(useDb())
  return ready
}
