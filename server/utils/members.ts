import type { Kysely, Transaction } from 'kysely'
import type { Database } from '../../db/schema'
import type { Role } from '../../shared/utils/roles'

// A member's place in an organisation, for the routes that change or end it: who they are there,
// and the rule that every organisation keeps at least one admin.

/** The member's role, or a 404 naming `userId` when they are not a member. */
export async function memberRole(db: Kysely<Database> | Transaction<Database>, orgId: number, userId: number): Promise<Role> {
  const row = await db.selectFrom('memberships').select('role').where('org_id', '=', orgId).where('user_id', '=', userId).executeTakeFirst()
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'userId: no such member in this organisation' })
  return row.role
}

/** 409 naming `field` when the organisation has only one admin left, who is about to go or step down. */
export async function assertAnotherAdmin(db: Kysely<Database> | Transaction<Database>, orgId: number, field: string, hint: string): Promise<void> {
  const { admins } = await db
    .selectFrom('memberships')
    .select((eb) => eb.fn.countAll<number>().as('admins'))
    .where('org_id', '=', orgId)
    .where('role', '=', 'admin')
    .executeTakeFirstOrThrow()
  if (Number(admins) <= 1) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `${field}: the organisation must keep at least one admin${hint ? `; ${hint}` : ''}` })
}
