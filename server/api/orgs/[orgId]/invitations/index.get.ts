import { listInvitations } from '~~/server/domain/invitations'
import { OrgParamsSchema } from '#shared/schemas/common'
import { InvitationListQuerySchema, type InvitationListDto } from '#shared/schemas/invitation'

// The organisation's invitations with their state, newest first; admins only.
export default defineEventHandler(async (event): Promise<InvitationListDto> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, ['admin'])
  const query = await getValidatedQuery(event, validator(InvitationListQuerySchema, 'query'))
  return { page: query.page, pageSize: query.pageSize, ...(await listInvitations(useDb(), orgId, query)) }
})
