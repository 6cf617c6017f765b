import { accountByEmail } from '~~/server/domain/accounts'
import { LoginSchema } from '#shared/schemas/auth'

// Signs a person in and starts a server-side session. A wrong e-mail or password answer the same
// 401 after the same work (an unknown e-mail is checked against a dummy hash); repeated failures for
// one account from one address, or from one address overall, get growing delays (429).
// Open to anyone: small body, throttled.
export default defineEventHandler(async (event) => {
  const { email, password } = await readValidatedJson(event, LoginSchema, BODY_LIMITS.public)
  const keys = signInKeys(event, email)
  await assertNotThrottled(event, keys)
  const account = await accountByEmail(useDb(), email)
  const matches = await verifyPassword(account?.password_hash ?? (await dummyPasswordHash()), password)
  if (!account || !matches) {
    await recordHit(keys)
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'E-mail or password is wrong' })
  }
  await clearHits([keys[0]!])
  const user = { id: account.id, email: account.email, name: account.name }
  await startSession(event, user)
  return meOf(user.id)
})
