import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'
import type { Me } from '../../shared/schemas/auth'
import { notFound } from './errors'
import { queueInBackground, type Mailer } from './mail/outbox'
import { signupExistsMail } from './mail/templates/verifyEmail'
import { roleIn } from './members'
import { createOrganisation } from './organisations'
import { endSessionsOf } from './sessions'
import { inTransaction } from './transaction'

// People's accounts: finding one to sign in, what GET /api/me answers, signing up (a person and
// their first organisation), changing a password, and the organisation the app opens by default.
// Passwords arrive here already hashed: hashing is the server's (nuxt-auth-utils), done by the caller.

/** An account with its password hash, for checking a password. */
export interface AccountWithPassword {
  id: number
  email: string
  name: string
  password_hash: string
}

/** The account using this e-mail, with its password hash; undefined when none does. */
export async function accountByEmail(db: Kysely<Database>, email: string): Promise<AccountWithPassword | undefined> {
  return db.selectFrom('users').select(['id', 'email', 'name', 'password_hash']).where('email', '=', email).executeTakeFirst()
}

/** The account with this id, with its password hash (it must exist). */
export async function accountById(db: Kysely<Database>, userId: number): Promise<AccountWithPassword> {
  return db.selectFrom('users').select(['id', 'email', 'name', 'password_hash']).where('id', '=', userId).executeTakeFirstOrThrow()
}

/** The user's organisations, roles and each organisation's currency, by organisation name. */
export async function membershipsOf(db: Kysely<Database>, userId: number): Promise<Me['memberships']> {
  const rows = await db
    .selectFrom('memberships')
    .innerJoin('organisations', 'organisations.id', 'memberships.org_id')
    .select(['organisations.id as orgId', 'organisations.name as orgName', 'memberships.role as role', 'organisations.currency_code', 'organisations.currency_symbol'])
    .where('memberships.user_id', '=', userId)
    .orderBy('organisations.name')
    .execute()
  return rows.map((r) => ({ orgId: r.orgId, orgName: r.orgName, role: r.role, currency: { code: r.currency_code, symbol: r.currency_symbol } }))
}

/** What GET /api/me answers: the person, whether their address is confirmed, their organisations; null when the account is gone. */
export async function loadMe(db: Kysely<Database>, userId: number): Promise<Me | null> {
  const row = await db.selectFrom('users').select(['id', 'email', 'name', 'email_verified_at', 'last_org_id']).where('id', '=', userId).executeTakeFirst()
  if (!row) return null
  return {
    user: { id: row.id, email: row.email, name: row.name },
    emailVerifiedAt: row.email_verified_at,
    lastOrgId: row.last_org_id,
    memberships: await membershipsOf(db, userId),
  }
}

/** Remembers the organisation the person chose, so the app opens it next time; 404 naming `lastOrgId` when they are not a member. */
export async function rememberLastOrganisation(db: Kysely<Database>, userId: number, orgId: number): Promise<void> {
  if (!(await roleIn(db, userId, orgId))) throw notFound('lastOrgId: Organisation not found')
  await db.updateTable('users').set({ last_org_id: orgId }).where('id', '=', userId).execute()
}

/** What a sign-up did: made the account (and its organisation), found the address taken, or lost a race for it. */
export type SignUpOutcome =
  | { kind: 'created'; user: { id: number; email: string; name: string }; orgId: number }
  | { kind: 'taken'; userId: number }
  | { kind: 'raced' }

/**
 * Creates a person with their first organisation, of which they are the admin (unconfirmed until
 * they open the link of sendVerification). An address that already has an account changes nothing:
 * its owner is told by e-mail instead. Two sign-ups racing for one address: the loser's insert breaks
 * the unique e-mail and nothing more happens.
 */
export async function signUp(
  db: Kysely<Database>,
  args: { email: string; name: string; organisationName: string; passwordHash: string; mailer: Mailer },
): Promise<SignUpOutcome> {
  const taken = await db.selectFrom('users').select(['id', 'name', 'email']).where('email', '=', args.email).executeTakeFirst()
  if (taken) {
    await queueInBackground(args.mailer, { to: taken.email, ...signupExistsMail({ name: taken.name, resetLink: args.mailer.link('/reset-password') }), kind: 'signup-exists', orgId: null }, 'sign-up')
    return { kind: 'taken', userId: taken.id }
  }
  const created = await inTransaction(db, async (trx) => {
    const user = await trx.insertInto('users').values({ email: args.email, name: args.name, password_hash: args.passwordHash }).returning(['id', 'email', 'name']).executeTakeFirstOrThrow()
    const org = await createOrganisation(trx, { name: args.organisationName, adminId: user.id })
    await trx.updateTable('users').set({ last_org_id: org.id }).where('id', '=', user.id).execute()
    return { user, orgId: org.id }
  }).catch((error: unknown) => {
    if (String((error as { code?: unknown }).code ?? '').startsWith('SQLITE_CONSTRAINT')) return null
    throw error
  })
  return created ? { kind: 'created', ...created } : { kind: 'raced' }
}

/** Sets a new password hash and ends every session of the account (a cookie copied earlier is worth nothing); returns how many ended. */
export async function changePassword(db: Kysely<Database>, userId: number, passwordHash: string): Promise<number> {
  return inTransaction(db, async (trx) => {
    await trx.updateTable('users').set({ password_hash: passwordHash }).where('id', '=', userId).execute()
    return endSessionsOf(trx, userId)
  })
}

/** Names of the given user ids. */
export async function peopleById(db: Kysely<Database>, ids: readonly (number | null)[]): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))]
  if (!wanted.length) return new Map()
  const rows = await db.selectFrom('users').select(['id', 'name']).where('id', 'in', wanted).execute()
  return new Map(rows.map((r) => [r.id, r.name]))
}
