import { OrgParamsSchema } from '../../../../../shared/schemas/common'
import { InvitationListQuerySchema, type InvitationListDto } from '../../../../../shared/schemas/invitation'

// The organisation's invitations with their state, newest first; admins only.
export default defineEventHandler(async (event): Promise<InvitationListDto> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, ['admin'])
  const { state, page, pageSize } = await getValidatedQuery(event, validator(InvitationListQuerySchema, 'query'))
  let q = invitationQuery().where('invitations.org_id', '=', orgId)
  if (state) q = q.where(invitationStateCondition(state))
  const [rows, total] = await Promise.all([
    q.orderBy('invitations.id', 'desc').limit(pageSize).offset((page - 1) * pageSize).execute(),
    q.clearSelect().select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
  ])
  return { page, pageSize, total: Number(total.n), invitations: rows.map(invitationDto) }
})
