import { passwordResetMail } from '../../domain/mail/templates/passwordReset'
import { hashLinkToken, newLinkToken } from '../../domain/tokens'
import { PASSWORD_RESET_TTL_MINUTES, PasswordResetRequestSchema, passwordResetPath } from '../../../shared/schemas/invitation'

const MESSAGE = `If an account uses that e-mail, we have sent it a link to choose a new password. The link works once, for ${PASSWORD_RESET_TTL_MINUTES} minutes.`

// Asks for a password-reset link. Always 202 with the same words, whether or not the account
// exists. Open to anyone: small body, throttled per e-mail and per client address (429, again the
// same for every e-mail).
export default defineEventHandler(async (event) => {
  const { email } = await readValidatedJson(event, PasswordResetRequestSchema, BODY_LIMITS.public)
  const keys: [ThrottleBucket, string][] = [
    ['password-reset-email', email],
    ['password-reset-address', clientAddress(event)],
  ]
  await assertNotThrottled(event, keys)
  await recordHit(keys)
  const db = useDb()
  const user = await db.selectFrom('users').select(['id', 'name', 'email']).where('email', '=', email).executeTakeFirst()
  if (user) {
    const token = newLinkToken()
    const row = await db
      .insertInto('password_resets')
      .values({ user_id: user.id, token_hash: hashLinkToken(token), expires_at: isoIn(PASSWORD_RESET_TTL_MINUTES * 60 * 1000) })
      .returning('id')
      .executeTakeFirstOrThrow()
    await audit({ orgId: null, userId: user.id, action: 'password-reset.requested', targetType: 'user', targetId: user.id, detail: { resetId: row.id } })
    // Delivery (when SMTP is set) runs after the answer, so the answer takes as long either way.
    const { delivery } = await queueMail({
      to: user.email,
      ...passwordResetMail({ name: user.name, link: appLink(passwordResetPath(token)), minutes: PASSWORD_RESET_TTL_MINUTES }),
      kind: 'password-reset',
      orgId: null,
    })
    void delivery.catch((error: unknown) => console.error('password-reset mail: recording the delivery failed', error))
  }
  setResponseStatus(event, 202)
  return { message: MESSAGE }
})
