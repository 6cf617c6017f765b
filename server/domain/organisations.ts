import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'
import { inTransaction } from './transaction'

// Organisations: starting one, with the person who starts it as its first admin.

/** Stores a new organisation with `adminId` as its admin; returns its id and name. */
export async function createOrganisation(db: Kysely<Database>, args: { name: string; adminId: number }): Promise<{ id: number; name: string }> {
  return inTransaction(db, async (trx) => {
    const org = await trx.insertInto('organisations').values({ name: args.name }).returning(['id', 'name']).executeTakeFirstOrThrow()
    await trx.insertInto('memberships').values({ user_id: args.adminId, org_id: org.id, role: 'admin' }).execute()
    return org
  })
}
