import type { H3Event } from 'h3'
import { sql } from 'kysely'
import type { InvitationRow } from '../../db/schema'
import type { InvitationDto, InvitationState } from '../../shared/schemas/invitation'

// Invitation rows as admins see them, their derived state, and the answers a used, withdrawn or
// expired link gets.

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
export function invitationQuery() {
  return useDb()
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

/** The same neutral 404 for every token nobody issued. */
export const unknownInvitation = () => createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This invitation link is not known. Check that the whole link was copied.' })

/**
 * The invitation a token stands for, whatever its state; a neutral 404 when none. Unknown tokens
 * count towards the per-address link throttle (429 once someone is guessing).
 */
export async function invitationByToken(event: H3Event, token: string): Promise<InvitationRow> {
  const keys: [ThrottleBucket, string][] = [['link-address', clientAddress(event)]]
  await assertNotThrottled(event, keys)
  const row = await useDb().selectFrom('invitations').selectAll().where('token_hash', '=', hashLinkToken(token)).executeTakeFirst()
  if (!row || !linkTokenMatches(token, row.token_hash)) {
    await recordHit(keys)
    throw unknownInvitation()
  }
  return row
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
  throw createError({ statusCode: 410, statusMessage: 'Gone', message, data: { state } })
}
