import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'
import type { Role } from '../../shared/utils/roles'
import { conflict, notFound } from './errors'
import { inTransaction } from './transaction'

// Who belongs to an organisation and in what role: the role a person holds (for the access checks),
// a single-site reviewer's grant, the member list, changing a role and removing a member, with the
// rule that every organisation keeps at least one admin.

/** A member as the member list shows them. */
export interface MemberDto {
  userId: number
  name: string
  email: string
  role: Role
  since: string
}

/** The role the user holds in the organisation, or null when not a member. */
export async function roleIn(db: Kysely<Database>, userId: number, orgId: number): Promise<Role | null> {
  const row = await db.selectFrom('memberships').select('role').where('user_id', '=', userId).where('org_id', '=', orgId).executeTakeFirst()
  return row?.role ?? null
}

/** The role a single-site grant gives the user on the site (reviewer), or null when there is none. */
export async function grantedSiteRole(db: Kysely<Database>, userId: number, siteId: number): Promise<Role | null> {
  const grant = await db.selectFrom('site_grants').select('role').where('user_id', '=', userId).where('site_id', '=', siteId).executeTakeFirst()
  return grant?.role ?? null
}

/** The member's role, or a 404 naming `userId` when they are not a member. */
async function memberRole(db: Kysely<Database>, orgId: number, userId: number): Promise<Role> {
  const role = await roleIn(db, userId, orgId)
  if (!role) throw notFound('userId: no such member in this organisation')
  return role
}

/** 409 naming `field` when the organisation has only one admin left, who is about to go or step down. */
async function assertAnotherAdmin(db: Kysely<Database>, orgId: number, field: string, hint: string): Promise<void> {
  const { admins } = await db
    .selectFrom('memberships')
    .select((eb) => eb.fn.countAll<number>().as('admins'))
    .where('org_id', '=', orgId)
    .where('role', '=', 'admin')
    .executeTakeFirstOrThrow()
  if (Number(admins) <= 1) throw conflict(`${field}: the organisation must keep at least one admin${hint ? `; ${hint}` : ''}`)
}

/** The organisation's members with their roles, by name. */
export async function listMembers(db: Kysely<Database>, orgId: number): Promise<MemberDto[]> {
  return db
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['users.id as userId', 'users.name', 'users.email', 'memberships.role', 'memberships.created_at as since'])
    .where('memberships.org_id', '=', orgId)
    .orderBy('users.name')
    .execute()
}

/** Gives a member a new role: 404 when not a member, 409 when the last admin would step down. Returns the roles before and after. */
export async function changeMemberRole(db: Kysely<Database>, args: { orgId: number; userId: number; role: Role }): Promise<{ from: Role; to: Role }> {
  const { orgId, userId, role } = args
  return inTransaction(db, async (trx) => {
    const current = await memberRole(trx, orgId, userId)
    if (current === 'admin' && role !== 'admin') await assertAnotherAdmin(trx, orgId, 'role', '')
    await trx.updateTable('memberships').set({ role }).where('org_id', '=', orgId).where('user_id', '=', userId).execute()
    return { from: current, to: role }
  })
}

/**
 * Takes a member out of the organisation (`leaving`: they asked themselves), with their single-site
 * grants in it: 404 when not a member, 409 for the last admin. Returns the role they had.
 */
export async function removeMember(db: Kysely<Database>, args: { orgId: number; userId: number; leaving: boolean }): Promise<Role> {
  const { orgId, userId, leaving } = args
  return inTransaction(db, async (trx) => {
    const current = await memberRole(trx, orgId, userId)
    if (current === 'admin') await assertAnotherAdmin(trx, orgId, 'userId', leaving ? 'make someone else admin before you leave' : 'this is the last one')
    await trx.deleteFrom('memberships').where('org_id', '=', orgId).where('user_id', '=', userId).execute()
    await trx.deleteFrom('site_grants').where('org_id', '=', orgId).where('user_id', '=', userId).execute()
    await trx.updateTable('users').set({ last_org_id: null }).where('id', '=', userId).where('last_org_id', '=', orgId).execute()
    return current
  })
}
