import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'

/**
 * Runs `work` in one transaction: its own, or the caller's when `db` already is one (Kysely cannot
 * nest them), so the seed can run several operations inside its single transaction.
 */
export function inTransaction<T>(db: Kysely<Database>, work: (trx: Kysely<Database>) => Promise<T>): Promise<T> {
  return db.isTransaction ? work(db) : db.transaction().execute(work)
}
