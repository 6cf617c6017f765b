import { hashLinkToken, linkTokenMatches } from '../../../domain/tokens'
import { PasswordResetParamsSchema, PasswordResetSchema } from '../../../../shared/schemas/invitation'

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
  const db = useDb()
  const reset = await db.selectFrom('password_resets').selectAll().where('token_hash', '=', hashLinkToken(token)).executeTakeFirst()
  if (!reset || !linkTokenMatches(token, reset.token_hash)) {
    await recordHit(linkKeys)
    throw unknown()
  }
  const at = nowIso()
  if (reset.used_at) throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This reset link has already been used. Ask for a new one if you need it.', data: { state: 'used' } })
  if (reset.expires_at <= at) throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This reset link has expired (they work for one hour). Ask for a new one.', data: { state: 'expired' } })
  const passwordHash = await hashPassword(password)
  const { user, ended } = await db.transaction().execute(async (trx) => {
    const claimed = await trx.updateTable('password_resets').set({ used_at: at }).where('id', '=', reset.id).where('used_at', 'is', null).executeTakeFirst()
    if (Number(claimed.numUpdatedRows) !== 1) throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This reset link has already been used. Ask for a new one if you need it.', data: { state: 'used' } })
    await trx.updateTable('users').set({ password_hash: passwordHash }).where('id', '=', reset.user_id).execute()
    await trx.updateTable('users').set({ email_verified_at: at }).where('id', '=', reset.user_id).where('email_verified_at', 'is', null).execute()
    await trx.updateTable('password_resets').set({ used_at: at }).where('user_id', '=', reset.user_id).where('used_at', 'is', null).execute()
    const ended = await trx.deleteFrom('sessions').where('user_id', '=', reset.user_id).executeTakeFirst()
    const user = await trx.selectFrom('users').select(['id', 'email']).where('id', '=', reset.user_id).executeTakeFirstOrThrow()
    return { user, ended: Number(ended.numDeletedRows) }
  })
  // A reset from a browser signed in as someone ends that browser's session too when it was theirs.
  if (currentSession(event)?.userId === user.id) await clearUserSession(event)
  await clearHits([['sign-in-account', `${user.email}|${clientAddress(event)}`]])
  await audit({ orgId: null, userId: user.id, action: 'password-reset.completed', targetType: 'user', targetId: user.id, detail: { resetId: reset.id, sessionsEnded: ended } })
  return { ok: true, email: user.email, message: 'Your password has been changed and every signed-in browser of the account has been signed out. Sign in with the new password.' }
})
