import { InvitationIdParamsSchema, type InvitationDto } from '../../../../shared/schemas/invitation'

// DELETE /api/invitations/[id]: an admin of the invitation's organisation withdraws a pending
// invitation; its link then answers 410. One that is no longer pending answers 409 naming its state.
export default defineEventHandler(async (event): Promise<InvitationDto> => {
  const { id } = await getValidatedRouterParams(event, validator(InvitationIdParamsSchema, 'params'))
  await requireUser(event)
  const row = await useDb().selectFrom('invitations').selectAll().where('id', '=', id).executeTakeFirst()
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Invitation not found' })
  const { user } = await requireRole(event, row.org_id, ['admin'], 'Invitation not found')
  const at = nowIso()
  const before = invitationState(row, at)
  if (before !== 'pending') {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `invitation: cannot revoke, it is ${before}`, data: { state: before } })
  }
  await useDb().updateTable('invitations').set({ revoked_at: at, revoked_by: user.id }).where('id', '=', id).where('accepted_at', 'is', null).where('revoked_at', 'is', null).execute()
  await audit({ orgId: row.org_id, userId: user.id, action: 'invitation.revoked', targetType: 'invitation', targetId: id, detail: { before: { state: before }, after: { state: 'revoked' }, email: row.email } })
  const updated = await invitationQuery().where('invitations.id', '=', id).executeTakeFirstOrThrow()
  return invitationDto(updated)
})
