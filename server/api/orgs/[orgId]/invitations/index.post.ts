import { createInvitation } from '~~/server/domain/invitations'
import { OrgParamsSchema } from '#shared/schemas/common'
import { InvitationInputSchema, type InvitationCreatedDto } from '#shared/schemas/invitation'

// Admins invite a person by e-mail to the organisation with a role, or (with siteId) as reviewer
// of that one site only. The link goes out by e-mail; the database keeps only its hash.
export default defineEventHandler(async (event): Promise<InvitationCreatedDto> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  const { user } = await requireRole(event, orgId, ['admin'])
  rateLimit(event, 'invitations', user.id)
  const input = await readValidatedJson(event, InvitationInputSchema, BODY_LIMITS.form)
  const invitation = await createInvitation(useDb(), { orgId, inviter: user, input, mailer: useMailer() })
  await audit({
    orgId,
    userId: user.id,
    action: 'invitation.created',
    targetType: 'invitation',
    targetId: invitation.id,
    detail: { before: null, after: { email: input.email, role: input.role, siteId: invitation.site?.id ?? null, expiresAt: invitation.expiresAt } },
  })
  setResponseStatus(event, 201)
  return invitation
})
