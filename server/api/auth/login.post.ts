import { LoginSchema } from '../../../shared/schemas/auth'

// Signs a person in and starts a server-side session. A wrong e-mail or password answer the same
// 401 after the same work (an unknown e-mail is checked against a dummy hash); repeated failures for
// one account from one address, or from one address overall, get growing delays (429).
// Open to anyone: small body, throttled.
export default defineEventHandler(async (event) => {
  const { email, password } = await readValidatedJson(event, LoginSchema, BODY_LIMITS.public)
  const keys = signInKeys(event, email)
  await assertNotThrottled(event, keys)
  const row = await useDb().selectFrom('users').select(['id', 'email', 'name', 'password_hash']).where('email', '=', email).executeTakeFirst()
  const matches = await verifyPassword(row?.password_hash ?? (await dummyPasswordHash()), password)
  if (!row || !matches) {
    await recordHit(keys)
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'E-mail or password is wrong' })
  }
  await clearHits([keys[0]!])
  const user = { id: row.id, email: row.email, name: row.name }
  await startSession(event, user)
  return meOf(user.id)
})
