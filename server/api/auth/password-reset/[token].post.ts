import { PasswordResetParamsSchema, PasswordResetSchema } from '../../../../shared/schemas/invitation'

const unknown = () => createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This reset link is not known. Check that the whole link was copied, or ask for a new one.' })

// Sets a new password with a reset link: single use, one hour. Any other open reset links of the
// account stop working, and its sign-in failures are cleared.
export default defineEventHandler(async (event) => {
  setResponseHeaders(event, { 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer' })
  const { token } = await getValidatedRouterParams(event, validator(PasswordResetParamsSchema, 'params'))
  const { password } = await readValidatedBody(event, validator(PasswordResetSchema, 'body'))
  const db = useDb()
  const reset = await db.selectFrom('password_resets').selectAll().where('token_hash', '=', hashLinkToken(token)).executeTakeFirst()
  if (!reset || !linkTokenMatches(token, reset.token_hash)) throw unknown()
  const at = nowIso()
  if (reset.used_at) throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This reset link has already been used. Ask for a new one if you need it.', data: { state: 'used' } })
  if (reset.expires_at <= at) throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This reset link has expired (they work for one hour). Ask for a new one.', data: { state: 'expired' } })
  const passwordHash = await hashPassword(password)
  const user = await db.transaction().execute(async (trx) => {
    const claimed = await trx.updateTable('password_resets').set({ used_at: at }).where('id', '=', reset.id).where('used_at', 'is', null).executeTakeFirst()
    if (Number(claimed.numUpdatedRows) !== 1) throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This reset link has already been used. Ask for a new one if you need it.', data: { state: 'used' } })
    await trx.updateTable('users').set({ password_hash: passwordHash }).where('id', '=', reset.user_id).execute()
    await trx.updateTable('password_resets').set({ used_at: at }).where('user_id', '=', reset.user_id).where('used_at', 'is', null).execute()
    return trx.selectFrom('users').select(['id', 'email']).where('id', '=', reset.user_id).executeTakeFirstOrThrow()
  })
  await clearFailures(user.email)
  await audit({ orgId: null, userId: user.id, action: 'password-reset.completed', targetType: 'user', targetId: user.id, detail: { resetId: reset.id } })
  return { ok: true, email: user.email, message: 'Your password has been changed. Sign in with the new one.' }
})
