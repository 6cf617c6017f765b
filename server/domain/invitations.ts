import { sql, type Kysely } from 'kysely'
import type { Database, InvitationRow } from '../../db/schema'
import { INVITATION_TTL_DAYS, invitationPath, type InvitationAcceptInput, type InvitationDto, type InvitationInput, type InvitationPublicDto, type InvitationState } from '../../shared/schemas/invitation'
import { ROLE_LABELS } from '../../shared/utils/roles'
import { conflict, DomainError, unprocessable } from './errors'
import { sendAll, type Mailer } from './mail/outbox'
import { invitationMail } from './mail/templates/invitation'
import { hashLinkToken, linkTokenMatches, newLinkToken } from './tokens'
import { inTransaction } from './transaction'

// Invitations: sending, withdrawing and accepting them, their rows as admins see them, what the
// link shows its holder, their derived state, and the answers a used, withdrawn or expired link gets.

/** The state of an invitation at `now`: accepted and revoked win over expired. */
export function invitationState(row: Pick<InvitationRow, 'accepted_at' | 'revoked_at' | 'expires_at'>, now = new Date().toISOString()): InvitationState {
  if (row.accepted_at) return 'accepted'
  if (row.revoked_at) return 'revoked'
  return row.expires_at <= now ? 'expired' : 'pending'
}

/** SQL condition for an invitation state (for list filters). */
export function invitationStateCondition(state: InvitationState, now = new Date().toISOString()) {
  if (state === 'accepted') return sql<boolean>`invitations.accepted_at is not null`
  if (state === 'revoked') return sql<boolean>`invitations.accepted_at is null and invitations.revoked_at is not null`
  if (state === 'expired') return sql<boolean>`invitations.accepted_at is null and invitations.revoked_at is null and invitations.expires_at <= ${now}`
  return sql<boolean>`invitations.accepted_at is null and invitations.revoked_at is null and invitations.expires_at > ${now}`
}

/** Invitation rows with their site's and inviter's names, for list routes to filter and page. */
export function invitationQuery(db: Kysely<Database>) {
  return db
    .selectFrom('invitations')
    .leftJoin('sites', 'sites.id', 'invitations.site_id')
    .leftJoin('users', 'users.id', 'invitations.invited_by')
    .selectAll('invitations')
    .select(['sites.name as site_name', 'users.name as inviter_name'])
}

/** An invitation row as admins see it (never its token). */
export function invitationDto(row: InvitationRow & { site_name: string | null; inviter_name: string | null }): InvitationDto {
  return {
    id: row.id,
    email: row.email,
    role: row.role,
    site: row.site_id !== null ? { id: row.site_id, name: row.site_name ?? '' } : null,
    state: invitationState(row),
    invitedBy: row.invited_by !== null && row.inviter_name ? { id: row.invited_by, name: row.inviter_name } : null,
    createdAt: row.created_at,
    expiresAt: row.expires_at,
    acceptedAt: row.accepted_at,
    revokedAt: row.revoked_at,
  }
}

/** The invitation a presented token stands for, whatever its state, or null when nobody issued it. */
export async function invitationByTokenIn(db: Kysely<Database>, token: string): Promise<InvitationRow | null> {
  const row = await db.selectFrom('invitations').selectAll().where('token_hash', '=', hashLinkToken(token)).executeTakeFirst()
  return row && linkTokenMatches(token, row.token_hash) ? row : null
}

/** The invitation with this id, whatever its state; undefined when there is none. */
export async function invitationById(db: Kysely<Database>, invitationId: number): Promise<InvitationRow | undefined> {
  return db.selectFrom('invitations').selectAll().where('id', '=', invitationId).executeTakeFirst()
}

/** What an invitation's link shows its holder before they accept: what it is for, who sent it, and whether to sign in or make an account. */
export async function publicInvitation(db: Kysely<Database>, row: InvitationRow): Promise<InvitationPublicDto> {
  const [org, site, inviter, account] = await Promise.all([
    db.selectFrom('organisations').select('name').where('id', '=', row.org_id).executeTakeFirstOrThrow(),
    row.site_id === null ? undefined : db.selectFrom('sites').select('name').where('id', '=', row.site_id).executeTakeFirst(),
    row.invited_by === null ? undefined : db.selectFrom('users').select('name').where('id', '=', row.invited_by).executeTakeFirst(),
    db.selectFrom('users').select('id').where('email', '=', row.email).executeTakeFirst(),
  ])
  return {
    organisationName: org.name,
    role: row.role,
    roleLabel: ROLE_LABELS[row.role],
    siteName: site?.name ?? null,
    email: row.email,
    invitedByName: inviter?.name ?? null,
    expiresAt: row.expires_at,
    needs: account ? 'sign-in' : 'new-account',
  }
}

/** 410 for an invitation that can no longer be used, with a message saying why and what to do. */
export function assertInvitationOpen(row: InvitationRow, now = new Date().toISOString()): void {
  const state = invitationState(row, now)
  if (state === 'pending') return
  const message = {
    accepted: 'This invitation has already been used. Sign in to continue.',
    revoked: 'This invitation was withdrawn by an administrator. Ask them for a new one if you still need access.',
    expired: `This invitation expired on ${row.expires_at.slice(0, 10)}. Ask the administrator who sent it for a new one.`,
  }[state]
  throw new DomainError(410, message, { data: { state } })
}

const DAY_MS = 24 * 60 * 60 * 1000

/** One page of an organisation's invitations with their state, newest first, with the total. */
export async function listInvitations(db: Kysely<Database>, orgId: number, query: { state?: InvitationState; page: number; pageSize: number }): Promise<{ total: number; invitations: InvitationDto[] }> {
  let q = invitationQuery(db).where('invitations.org_id', '=', orgId)
  if (query.state) q = q.where(invitationStateCondition(query.state))
  const [rows, total] = await Promise.all([
    q.orderBy('invitations.id', 'desc').limit(query.pageSize).offset((query.page - 1) * query.pageSize).execute(),
    q.clearSelect().select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
  ])
  return { total: Number(total.n), invitations: rows.map(invitationDto) }
}

/**
 * Invites a person by e-mail to the organisation with a role, or (with siteId) as reviewer of that
 * one live site only, and e-mails them the link (the database keeps only its hash). 422 for a site
 * not in the organisation; 409 when they are already a member (or already review that site), or an
 * invitation is already waiting.
 */
export async function createInvitation(
  db: Kysely<Database>,
  args: { orgId: number; inviter: { id: number; name: string }; input: InvitationInput; now?: number; mailer: Mailer },
): Promise<InvitationDto> {
  const { orgId, inviter } = args
  const { email, role, siteId } = args.input
  const site = siteId === undefined ? null : await db.selectFrom('sites').select(['id', 'name']).where('id', '=', siteId).where('org_id', '=', orgId).where('deleted_at', 'is', null).executeTakeFirst()
  if (siteId !== undefined && !site) throw unprocessable('siteId', 'no such site in this organisation')
  const person = await db.selectFrom('users').select('id').where('email', '=', email).executeTakeFirst()
  if (person) {
    const member = (await db.selectFrom('memberships').select('role').where('user_id', '=', person.id).where('org_id', '=', orgId).executeTakeFirst())?.role
    if (member && (!site || member !== 'viewer')) throw conflict(`email: already a member of this organisation (${member}); change their role instead`)
    if (site && (await db.selectFrom('site_grants').select('user_id').where('user_id', '=', person.id).where('site_id', '=', site.id).executeTakeFirst())) {
      throw conflict('email: already reviews this site')
    }
  }
  let waiting = db.selectFrom('invitations').select(['id', 'created_at']).where('org_id', '=', orgId).where('email', '=', email).where(invitationStateCondition('pending'))
  waiting = site ? waiting.where('site_id', '=', site.id) : waiting.where('site_id', 'is', null)
  const open = await waiting.executeTakeFirst()
  if (open) throw conflict(`email: an invitation is already waiting (sent ${open.created_at.slice(0, 10)}); revoke it to send another`)

  const token = newLinkToken()
  const row = await db
    .insertInto('invitations')
    .values({ org_id: orgId, email, role, site_id: site?.id ?? null, token_hash: hashLinkToken(token), invited_by: inviter.id, expires_at: new Date((args.now ?? Date.now()) + INVITATION_TTL_DAYS * DAY_MS).toISOString() })
    .returningAll()
    .executeTakeFirstOrThrow()
  const org = await db.selectFrom('organisations').select('name').where('id', '=', orgId).executeTakeFirstOrThrow()
  const mail = invitationMail({
    organisationName: org.name,
    inviterName: inviter.name,
    roleLabel: ROLE_LABELS[role],
    siteName: site?.name ?? null,
    link: args.mailer.link(invitationPath(token)),
    expiresAt: row.expires_at,
  })
  await sendAll(args.mailer, [{ to: email, ...mail, kind: 'invitation', orgId }])
  return invitationDto({ ...row, site_name: site?.name ?? null, inviter_name: inviter.name })
}

/** Withdraws a pending invitation (409 naming its state otherwise); its link then answers 410. */
export async function revokeInvitation(db: Kysely<Database>, row: InvitationRow, userId: number, now: string): Promise<InvitationDto> {
  const before = invitationState(row, now)
  if (before !== 'pending') throw conflict(`invitation: cannot revoke, it is ${before}`, { state: before })
  await db.updateTable('invitations').set({ revoked_at: now, revoked_by: userId }).where('id', '=', row.id).where('accepted_at', 'is', null).where('revoked_at', 'is', null).execute()
  return invitationDto(await invitationQuery(db).where('invitations.id', '=', row.id).executeTakeFirstOrThrow())
}

/** The person who accepted an invitation. */
export interface InvitedPerson {
  id: number
  email: string
  name: string
}

/**
 * Accepts an open invitation at `now` (the caller has checked it is open) for the signed-in account
 * `userId`, or for a new account made from `input` when nobody is signed in. The signed-in account
 * must be the invited, confirmed address (403 otherwise); signed out, an address that already has an
 * account must sign in first (401), and a new account needs a name and password (422); it is
 * confirmed by the invitation itself, which was e-mailed to it. Joins the organisation, or for a
 * single-site invitation grants that site, and makes the organisation the one the app opens. Single
 * use: 410 when someone accepted it first or its site is gone; 409 for someone already a member.
 */
export async function acceptInvitation(
  db: Kysely<Database>,
  args: { invitation: InvitationRow; userId: number | null; input: InvitationAcceptInput; hashPassword: (password: string) => Promise<string>; now: string },
): Promise<{ person: InvitedPerson; created: boolean }> {
  const { invitation, input, now: at } = args
  if (invitation.site_id !== null) {
    const site = await db.selectFrom('sites').select('id').where('id', '=', invitation.site_id).where('deleted_at', 'is', null).executeTakeFirst()
    if (!site) throw new DomainError(410, 'The site this invitation was for has been removed. Ask the administrator who sent it.', { data: { state: 'site-removed' } })
  }

  let person: InvitedPerson
  let passwordHash: string | null = null
  if (args.userId !== null) {
    const me = await db.selectFrom('users').select(['id', 'email', 'name', 'email_verified_at']).where('id', '=', args.userId).executeTakeFirstOrThrow()
    if (me.email !== invitation.email) {
      throw new DomainError(403, `invitation: this invitation is for ${invitation.email}, and you are signed in as ${me.email}. Sign out, then sign in or create an account with ${invitation.email}.`, {
        field: 'invitation',
        data: { invitedEmail: invitation.email },
      })
    }
    if (!me.email_verified_at) {
      throw new DomainError(403, `email: confirm that ${me.email} is yours before you join: open the link we e-mailed to it, or ask for a new one.`, { field: 'email', data: { needs: 'verification' } })
    }
    person = { id: me.id, email: me.email, name: me.name }
  } else {
    const existing = await db.selectFrom('users').select('id').where('email', '=', invitation.email).executeTakeFirst()
    if (existing) throw new DomainError(401, `Sign in as ${invitation.email} first, then accept the invitation.`, { data: { needs: 'sign-in' } })
    if (!input.name) throw new DomainError(422, 'name: is required to create your account', { field: 'name' })
    if (!input.password) throw new DomainError(422, 'password: is required to create your account', { field: 'password' })
    passwordHash = await args.hashPassword(input.password)
    person = { id: 0, email: invitation.email, name: input.name }
  }
  const created = passwordHash !== null

  await inTransaction(db, async (trx) => {
    if (passwordHash !== null) {
      const taken = await trx.selectFrom('users').select('id').where('email', '=', person.email).executeTakeFirst()
      if (taken) throw conflict('email: an account with this e-mail was just created; sign in and open the link again')
      person.id = (await trx.insertInto('users').values({ email: person.email, name: person.name, password_hash: passwordHash, email_verified_at: at, last_org_id: invitation.org_id }).returning('id').executeTakeFirstOrThrow()).id
    }
    const member = await trx.selectFrom('memberships').select('role').where('user_id', '=', person.id).where('org_id', '=', invitation.org_id).executeTakeFirst()
    if (member && (invitation.site_id === null || member.role !== 'viewer')) {
      throw conflict(`invitation: you are already a member of this organisation (${member.role})`)
    }
    // Single use: only the first acceptance finds the invitation still open.
    const claimed = await trx
      .updateTable('invitations')
      .set({ accepted_at: at, accepted_by: person.id })
      .where('id', '=', invitation.id)
      .where('accepted_at', 'is', null)
      .where('revoked_at', 'is', null)
      .where('expires_at', '>', at)
      .executeTakeFirst()
    if (Number(claimed.numUpdatedRows) !== 1) throw new DomainError(410, 'This invitation has already been used. Sign in to continue.', { data: { state: 'accepted' } })
    if (invitation.site_id === null) {
      await trx.insertInto('memberships').values({ user_id: person.id, org_id: invitation.org_id, role: invitation.role }).execute()
      if (!created) await trx.updateTable('users').set({ last_org_id: invitation.org_id }).where('id', '=', person.id).execute()
    } else {
      await trx
        .insertInto('site_grants')
        .values({ user_id: person.id, site_id: invitation.site_id, org_id: invitation.org_id, role: 'reviewer', granted_by: invitation.invited_by })
        .onConflict((oc) => oc.columns(['user_id', 'site_id']).doNothing())
        .execute()
    }
  })
  return { person, created }
}
