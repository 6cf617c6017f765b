import { confirmEmail, verificationByToken } from '~~/server/domain/verification'
import { PasswordResetParamsSchema } from '#shared/schemas/invitation'

const unknown = () => createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This confirmation link is not known. Check that the whole link was copied, or ask for a new one from your account page.' })

// Confirms an e-mail address with the link sent to it: single use, for the address it was sent to.
// Open to anyone with the link (it proves the address, not who clicks): no body, unknown links
// throttled per client address.
export default defineEventHandler(async (event) => {
  setResponseHeaders(event, { 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer' })
  const { token } = await getValidatedRouterParams(event, validator(PasswordResetParamsSchema, 'params'))
  const linkKeys: [ThrottleBucket, string][] = [['link-address', clientAddress(event)]]
  await assertNotThrottled(event, linkKeys)
  const verification = await verificationByToken(useDb(), token)
  if (!verification) {
    await recordHit(linkKeys)
    throw unknown()
  }
  const confirmed = await confirmEmail(useDb(), verification, nowIso())
  if (!confirmed) throw unknown()
  const { user } = confirmed
  if (confirmed.alreadyConfirmed) return { ok: true, email: user.email, message: 'Your e-mail address is already confirmed.' }
  await audit({ orgId: null, userId: user.id, action: 'email.verified', targetType: 'user', targetId: user.id, detail: undefined })
  return { ok: true, email: user.email, message: 'Thank you: your e-mail address is confirmed.' }
})
