import { invitationById, revokeInvitation } from '~~/server/domain/invitations'
import { InvitationIdParamsSchema, type InvitationDto } from '#shared/schemas/invitation'

// DELETE /api/invitations/[id]: an admin of the invitation's organisation withdraws a pending
// invitation; its link then answers 410. One that is no longer pending answers 409 naming its state.
export default defineEventHandler(async (event): Promise<InvitationDto> => {
  const { id } = await getValidatedRouterParams(event, validator(InvitationIdParamsSchema, 'params'))
  await requireUser(event)
  const row = await invitationById(useDb(), id)
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Invitation not found' })
  const { user } = await requireRole(event, row.org_id, ['admin'], 'Invitation not found')
  const revoked = await revokeInvitation(useDb(), row, user.id, nowIso())
  await audit({ orgId: row.org_id, userId: user.id, action: 'invitation.revoked', targetType: 'invitation', targetId: id, detail: { before: { state: 'pending' }, after: { state: 'revoked' }, email: row.email } })
  return revoked
})
