import { SignupSchema } from '../../../shared/schemas/auth'

// Creates a person and their first organisation; they become its admin and are signed in.
export default defineEventHandler(async (event) => {
  const input = await readValidatedBody(event, validator(SignupSchema, 'body'))
  const db = useDb()
  const taken = await db.selectFrom('users').select('id').where('email', '=', input.email).executeTakeFirst()
  if (taken) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'email: an account with this e-mail already exists' })
  }
  const passwordHash = await hashPassword(input.password)
  const { user, orgId } = await db.transaction().execute(async (trx) => {
    const user = await trx
      .insertInto('users')
      .values({ email: input.email, name: input.name, password_hash: passwordHash })
      .returning(['id', 'email', 'name'])
      .executeTakeFirstOrThrow()
    const org = await trx.insertInto('organisations').values({ name: input.organisationName }).returning('id').executeTakeFirstOrThrow()
    await trx.insertInto('memberships').values({ user_id: user.id, org_id: org.id, role: 'admin' }).execute()
    return { user, orgId: org.id }
  })
  await audit({ orgId, userId: user.id, action: 'organisation.created', targetType: 'organisation', targetId: orgId, detail: { name: input.organisationName } })
  await setUserSession(event, { user, loggedInAt: new Date().toISOString() })
  setResponseStatus(event, 201)
  return { user, memberships: await membershipsOf(user.id) }
})
