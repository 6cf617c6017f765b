import { isVerified, resendVerification } from '~~/server/domain/verification'

// Sends the signed-in person a new link to confirm their address. Signed-in only, no body,
// throttled per account.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  if (await isVerified(useDb(), user.id)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'email: your address is already confirmed' })
  const keys: [ThrottleBucket, string][] = [['verification-resend', String(user.id)]]
  await assertNotThrottled(event, keys)
  await recordHit(keys)
  const email = await resendVerification(useDb(), { userId: user.id, now: Date.now(), mailer: useMailer() })
  setResponseStatus(event, 202)
  return { message: `We have sent a new confirmation link to ${email}.` }
})
