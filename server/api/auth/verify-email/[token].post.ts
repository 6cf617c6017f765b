import { hashLinkToken, linkTokenMatches } from '../../../domain/tokens'
import { PasswordResetParamsSchema } from '../../../../shared/schemas/invitation'

const unknown = () => createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This confirmation link is not known. Check that the whole link was copied, or ask for a new one from your account page.' })

// Confirms an e-mail address with the link sent to it: single use, for the address it was sent to.
// Open to anyone with the link (it proves the address, not who clicks): no body, unknown links
// throttled per client address.
export default defineEventHandler(async (event) => {
  setResponseHeaders(event, { 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer' })
  const { token } = await getValidatedRouterParams(event, validator(PasswordResetParamsSchema, 'params'))
  const linkKeys: [ThrottleBucket, string][] = [['link-address', clientAddress(event)]]
  await assertNotThrottled(event, linkKeys)
  const db = useDb()
  const row = await db.selectFrom('email_verifications').selectAll().where('token_hash', '=', hashLinkToken(token)).executeTakeFirst()
  if (!row || !linkTokenMatches(token, row.token_hash)) {
    await recordHit(linkKeys)
    throw unknown()
  }
  const user = await db.selectFrom('users').select(['id', 'email', 'email_verified_at']).where('id', '=', row.user_id).executeTakeFirst()
  if (!user || user.email !== row.email) throw unknown()
  if (user.email_verified_at) return { ok: true, email: user.email, message: 'Your e-mail address is already confirmed.' }
  const at = nowIso()
  if (row.used_at) throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This confirmation link has already been used.', data: { state: 'used' } })
  if (row.expires_at <= at) throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This confirmation link has expired. Sign in and ask for a new one from your account page.', data: { state: 'expired' } })
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('email_verifications').set({ used_at: at }).where('id', '=', row.id).execute()
    await trx.updateTable('users').set({ email_verified_at: at }).where('id', '=', user.id).where('email_verified_at', 'is', null).execute()
  })
  await audit({ orgId: null, userId: user.id, action: 'email.verified', targetType: 'user', targetId: user.id, detail: undefined })
  return { ok: true, email: user.email, message: 'Thank you: your e-mail address is confirmed.' }
})
