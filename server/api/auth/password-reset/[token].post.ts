import { assertPasswordResetOpen, completePasswordReset, passwordResetByToken } from '~~/server/domain/passwordResets'
import { PasswordResetParamsSchema, PasswordResetSchema } from '#shared/schemas/invitation'

const unknown = () => createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This reset link is not known. Check that the whole link was copied, or ask for a new one.' })

// Sets a new password with a reset link: single use, one hour. Any other open reset links of the
// account stop working, every session of the account ends (a cookie copied before the reset is
// worth nothing), the address counts as verified (the link came to it), and the account's sign-in
// throttle is cleared. Open to anyone with the link: small body, unknown links throttled per address.
export default defineEventHandler(async (event) => {
  setResponseHeaders(event, { 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer' })
  const { token } = await getValidatedRouterParams(event, validator(PasswordResetParamsSchema, 'params'))
  const linkKeys: [ThrottleBucket, string][] = [['link-address', clientAddress(event)]]
  await assertNotThrottled(event, linkKeys)
  const { password } = await readValidatedJson(event, PasswordResetSchema, BODY_LIMITS.public)
  const reset = await passwordResetByToken(useDb(), token)
  if (!reset) {
    await recordHit(linkKeys)
    throw unknown()
  }
  const at = nowIso()
  assertPasswordResetOpen(reset, at)
  const passwordHash = await hashPassword(password)
  const { user, sessionsEnded } = await completePasswordReset(useDb(), { reset, passwordHash, now: at })
  // A reset from a browser signed in as someone ends that browser's session too when it was theirs.
  if (currentSession(event)?.userId === user.id) await clearUserSession(event)
  await clearHits([['sign-in-account', `${user.email}|${clientAddress(event)}`]])
  await audit({ orgId: null, userId: user.id, action: 'password-reset.completed', targetType: 'user', targetId: user.id, detail: { resetId: reset.id, sessionsEnded } })
  return { ok: true, email: user.email, message: 'Your password has been changed and every signed-in browser of the account has been signed out. Sign in with the new password.' }
})
