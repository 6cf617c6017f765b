import { assertInvitationOpen, publicInvitation } from '~~/server/domain/invitations'
import { InvitationTokenParamsSchema, type InvitationPublicDto } from '#shared/schemas/invitation'

// GET /api/invitations/[token], no sign-in: what a pending invitation is for (organisation, role,
// the one site if any, who sent it), and nothing else. Unknown: 404; used, withdrawn or expired: 410.
export default defineEventHandler(async (event): Promise<InvitationPublicDto> => {
  setResponseHeaders(event, { 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer' })
  const { token } = await getValidatedRouterParams(event, validator(InvitationTokenParamsSchema, 'params'))
  const row = await invitationByToken(event, token)
  assertInvitationOpen(row)
  return publicInvitation(useDb(), row)
})
