import { verifyEmailMail } from '../domain/mail/templates/verifyEmail'
import { hashLinkToken, newLinkToken } from '../domain/tokens'
import { VERIFICATION_TTL_HOURS, verifyEmailPath } from '../../shared/schemas/account'

// E-mail verification: a new account gets a single-use link by e-mail; opening it marks the
// address as the person's. A password reset or an invitation link (both e-mailed to the address)
// verify it too. Unverified accounts can sign in, but cannot accept invitations or join organisations.

/** Stores a fresh verification link for the user's current address and e-mails it (outbox without SMTP). */
export async function sendVerification(user: { id: number; email: string; name: string }): Promise<void> {
  const token = newLinkToken()
  await useDb()
    .insertInto('email_verifications')
    .values({ user_id: user.id, email: user.email, token_hash: hashLinkToken(token), expires_at: isoIn(VERIFICATION_TTL_HOURS * 60 * 60 * 1000) })
    .execute()
  const { delivery } = await queueMail({
    to: user.email,
    ...verifyEmailMail({ name: user.name, link: appLink(verifyEmailPath(token)), hours: VERIFICATION_TTL_HOURS }),
    kind: 'verify-email',
    orgId: null,
  })
  // Delivery (when SMTP is set) runs after the answer, so the answer takes as long either way.
  void delivery.catch((error: unknown) => console.error('verification mail: recording the delivery failed', error))
}

/** Whether the user's address is verified. */
export async function isVerified(userId: number): Promise<boolean> {
  const row = await useDb().selectFrom('users').select('email_verified_at').where('id', '=', userId).executeTakeFirst()
  return Boolean(row?.email_verified_at)
}
