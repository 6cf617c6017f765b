import { LoginSchema } from '../../../shared/schemas/auth'

// Signs a person in; wrong e-mail or password answer the same 401, repeated failures 429.
export default defineEventHandler(async (event) => {
  const { email, password } = await readValidatedBody(event, validator(LoginSchema, 'body'))
  await assertNotThrottled(event, email)
  const row = await useDb().selectFrom('users').select(['id', 'email', 'name', 'password_hash']).where('email', '=', email).executeTakeFirst()
  const ok = row ? await verifyPassword(row.password_hash, password) : false
  if (!row || !ok) {
    await recordFailure(email)
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'E-mail or password is wrong' })
  }
  await clearFailures(email)
  const user = { id: row.id, email: row.email, name: row.name }
  await setUserSession(event, { user, loggedInAt: new Date().toISOString() })
  return { user, memberships: await membershipsOf(user.id) }
})
