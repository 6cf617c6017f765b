import { listMembers } from '~~/server/domain/members'
import { OrgParamsSchema } from '#shared/schemas/common'
import { READER_ROLES } from '#shared/utils/roles'

// Everyone in the organisation may see who else is in it and in what role.
export default defineEventHandler(async (event) => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, READER_ROLES)
  return { members: await listMembers(useDb(), orgId) }
})
