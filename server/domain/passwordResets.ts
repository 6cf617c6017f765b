import type { Kysely, Selectable } from 'kysely'
import type { Database } from '../../db/schema'
import { PASSWORD_RESET_TTL_MINUTES, passwordResetPath } from '../../shared/schemas/invitation'
import { DomainError } from './errors'
import { queueInBackground, type Mailer } from './mail/outbox'
import { passwordResetMail } from './mail/templates/passwordReset'
import { endSessionsOf } from './sessions'
import { hashLinkToken, linkTokenMatches, newLinkToken } from './tokens'
import { inTransaction } from './transaction'

// Password resets: a single-use link, good for an hour, e-mailed to an account's address; using it
// sets a new password, ends every session of the account, and confirms the address (the link came to it).

type PasswordResetRow = Selectable<Database['password_resets']>

const MINUTE_MS = 60 * 1000

const used = () => new DomainError(410, 'This reset link has already been used. Ask for a new one if you need it.', { data: { state: 'used' } })

/**
 * Stores a reset link for the account using `email` and e-mails it (delivery runs after the caller
 * has answered); nothing when no account uses it. Returns the account and the reset's id, or null.
 */
export async function requestPasswordReset(db: Kysely<Database>, args: { email: string; now: number; mailer: Mailer }): Promise<{ userId: number; resetId: number } | null> {
  const { mailer } = args
  const user = await db.selectFrom('users').select(['id', 'name', 'email']).where('email', '=', args.email).executeTakeFirst()
  if (!user) return null
  const token = newLinkToken()
  const row = await db
    .insertInto('password_resets')
    .values({ user_id: user.id, token_hash: hashLinkToken(token), expires_at: new Date(args.now + PASSWORD_RESET_TTL_MINUTES * MINUTE_MS).toISOString() })
    .returning('id')
    .executeTakeFirstOrThrow()
  const mail = passwordResetMail({ name: user.name, link: mailer.link(passwordResetPath(token)), minutes: PASSWORD_RESET_TTL_MINUTES })
  await queueInBackground(mailer, { to: user.email, ...mail, kind: 'password-reset', orgId: null }, 'password-reset')
  return { userId: user.id, resetId: row.id }
}

/** The reset a presented token stands for, whatever its state, or null when nobody issued it. */
export async function passwordResetByToken(db: Kysely<Database>, token: string): Promise<PasswordResetRow | null> {
  const row = await db.selectFrom('password_resets').selectAll().where('token_hash', '=', hashLinkToken(token)).executeTakeFirst()
  return row && linkTokenMatches(token, row.token_hash) ? row : null
}

/** 410 for a reset link that was used or has expired at `now`, saying which. */
export function assertPasswordResetOpen(reset: PasswordResetRow, now: string): void {
  if (reset.used_at) throw used()
  if (reset.expires_at <= now) throw new DomainError(410, 'This reset link has expired (they work for one hour). Ask for a new one.', { data: { state: 'expired' } })
}

/**
 * Uses a reset link at `now` (410 when someone used it first): sets the new password hash, confirms
 * the address, stops the account's other open reset links and ends every session of the account.
 * Returns the account and how many sessions ended.
 */
export async function completePasswordReset(
  db: Kysely<Database>,
  args: { reset: PasswordResetRow; passwordHash: string; now: string },
): Promise<{ user: { id: number; email: string }; sessionsEnded: number }> {
  const { reset, now: at } = args
  return inTransaction(db, async (trx) => {
    const claimed = await trx.updateTable('password_resets').set({ used_at: at }).where('id', '=', reset.id).where('used_at', 'is', null).executeTakeFirst()
    if (Number(claimed.numUpdatedRows) !== 1) throw used()
    await trx.updateTable('users').set({ password_hash: args.passwordHash }).where('id', '=', reset.user_id).execute()
    await trx.updateTable('users').set({ email_verified_at: at }).where('id', '=', reset.user_id).where('email_verified_at', 'is', null).execute()
    await trx.updateTable('password_resets').set({ used_at: at }).where('user_id', '=', reset.user_id).where('used_at', 'is', null).execute()
    const sessionsEnded = await endSessionsOf(trx, reset.user_id)
    const user = await trx.selectFrom('users').select(['id', 'email']).where('id', '=', reset.user_id).executeTakeFirstOrThrow()
    return { user, sessionsEnded }
  })
}
