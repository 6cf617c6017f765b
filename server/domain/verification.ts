import type { Kysely, Selectable } from 'kysely'
import type { Database } from '../../db/schema'
import { VERIFICATION_TTL_HOURS, verifyEmailPath } from '../../shared/schemas/account'
import { DomainError } from './errors'
import { queueInBackground, type Mailer } from './mail/outbox'
import { verifyEmailMail } from './mail/templates/verifyEmail'
import { hashLinkToken, linkTokenMatches, newLinkToken } from './tokens'
import { inTransaction } from './transaction'

// E-mail verification: a new account gets a single-use link by e-mail; opening it marks the
// address as the person's. A password reset or an invitation link (both e-mailed to the address)
// verify it too. Unverified accounts can sign in, but cannot accept invitations or join organisations.

type EmailVerificationRow = Selectable<Database['email_verifications']>

const HOUR_MS = 60 * 60 * 1000

/**
 * Stores a fresh verification link for the user's current address and e-mails it (kept in the
 * outbox without SMTP; delivery runs after the caller has answered).
 */
export async function sendVerification(db: Kysely<Database>, args: { user: { id: number; email: string; name: string }; now: number; mailer: Mailer }): Promise<void> {
  const { user, mailer } = args
  const token = newLinkToken()
  await db
    .insertInto('email_verifications')
    .values({ user_id: user.id, email: user.email, token_hash: hashLinkToken(token), expires_at: new Date(args.now + VERIFICATION_TTL_HOURS * HOUR_MS).toISOString() })
    .execute()
  const mail = verifyEmailMail({ name: user.name, link: mailer.link(verifyEmailPath(token)), hours: VERIFICATION_TTL_HOURS })
  await queueInBackground(mailer, { to: user.email, ...mail, kind: 'verify-email', orgId: null }, 'verification')
}

/** Whether the user's address is verified. */
export async function isVerified(db: Kysely<Database>, userId: number): Promise<boolean> {
  const row = await db.selectFrom('users').select('email_verified_at').where('id', '=', userId).executeTakeFirst()
  return Boolean(row?.email_verified_at)
}

/** Sends the user a new link for their current address (as sendVerification); returns the address. */
export async function resendVerification(db: Kysely<Database>, args: { userId: number; now: number; mailer: Mailer }): Promise<string> {
  const user = await db.selectFrom('users').select(['id', 'email', 'name']).where('id', '=', args.userId).executeTakeFirstOrThrow()
  await sendVerification(db, { user, now: args.now, mailer: args.mailer })
  return user.email
}

/** The verification a presented token stands for, whatever its state, or null when nobody issued it. */
export async function verificationByToken(db: Kysely<Database>, token: string): Promise<EmailVerificationRow | null> {
  const row = await db.selectFrom('email_verifications').selectAll().where('token_hash', '=', hashLinkToken(token)).executeTakeFirst()
  return row && linkTokenMatches(token, row.token_hash) ? row : null
}

/**
 * Confirms the address a verification link was sent to, at `now`: null when the account is gone or
 * no longer has that address (the link then means nothing), `alreadyConfirmed` when it was; 410 for
 * a used or expired link. Marks the link used.
 */
export async function confirmEmail(db: Kysely<Database>, verification: EmailVerificationRow, now: string): Promise<{ user: { id: number; email: string }; alreadyConfirmed: boolean } | null> {
  const user = await db.selectFrom('users').select(['id', 'email', 'email_verified_at']).where('id', '=', verification.user_id).executeTakeFirst()
  if (!user || user.email !== verification.email) return null
  if (user.email_verified_at) return { user: { id: user.id, email: user.email }, alreadyConfirmed: true }
  if (verification.used_at) throw new DomainError(410, 'This confirmation link has already been used.', { data: { state: 'used' } })
  if (verification.expires_at <= now) throw new DomainError(410, 'This confirmation link has expired. Sign in and ask for a new one from your account page.', { data: { state: 'expired' } })
  await inTransaction(db, async (trx) => {
    await trx.updateTable('email_verifications').set({ used_at: now }).where('id', '=', verification.id).execute()
    await trx.updateTable('users').set({ email_verified_at: now }).where('id', '=', user.id).where('email_verified_at', 'is', null).execute()
  })
  return { user: { id: user.id, email: user.email }, alreadyConfirmed: false }
}
