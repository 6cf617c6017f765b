import { AddMemberSchema } from '../../../../../shared/schemas/auth'
import { OrgParamsSchema } from '../../../../../shared/schemas/common'

// Admins add a person who already has a Gillwatt account, with a role.
export default defineEventHandler(async (event) => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  const { user } = await requireRole(event, orgId, ['admin'])
  const { email, role } = await readValidatedBody(event, validator(AddMemberSchema, 'body'))
  const db = useDb()
  const person = await db.selectFrom('users').select(['id', 'name', 'email']).where('email', '=', email).executeTakeFirst()
  if (!person) {
    throw createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message: 'email: no account uses this e-mail; ask them to create one first' })
  }
  const inserted = await db
    .insertInto('memberships')
    .values({ user_id: person.id, org_id: orgId, role })
    .onConflict((oc) => oc.columns(['user_id', 'org_id']).doNothing())
    .returning('user_id')
    .executeTakeFirst()
  if (!inserted) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'email: this person is already a member' })
  await audit({ orgId, userId: user.id, action: 'member.added', targetType: 'user', targetId: person.id, detail: { email, role } })
  setResponseStatus(event, 201)
  return { userId: person.id, name: person.name, email: person.email, role }
})
