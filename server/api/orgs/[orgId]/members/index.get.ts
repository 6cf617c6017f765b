import { OrgParamsSchema } from '../../../../../shared/schemas/common'
import { READER_ROLES } from '../../../../../shared/utils/roles'

// Everyone in the organisation may see who else is in it and in what role.
export default defineEventHandler(async (event) => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, READER_ROLES)
  const members = await useDb()
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['users.id as userId', 'users.name', 'users.email', 'memberships.role', 'memberships.created_at as since'])
    .where('memberships.org_id', '=', orgId)
    .orderBy('users.name')
    .execute()
  return { members }
})
