import { requestPasswordReset } from '~~/server/domain/passwordResets'
import { PASSWORD_RESET_TTL_MINUTES, PasswordResetRequestSchema } from '#shared/schemas/invitation'

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
  const reset = await requestPasswordReset(useDb(), { email, now: Date.now(), mailer: useMailer() })
  if (reset) {
    await audit({ orgId: null, userId: reset.userId, action: 'password-reset.requested', targetType: 'user', targetId: reset.userId, detail: { resetId: reset.resetId } })
  }
  setResponseStatus(event, 202)
  return { message: MESSAGE }
})
