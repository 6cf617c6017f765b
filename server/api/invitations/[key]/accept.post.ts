import { acceptInvitation, assertInvitationOpen } from '~~/server/domain/invitations'
import { InvitationAcceptSchema, InvitationTokenParamsSchema, type InvitationAcceptedDto } from '#shared/schemas/invitation'

// POST /api/invitations/[token]/accept. Signed in: the signed-in account joins, only when its
// address is the invited one and confirmed (403 naming the invited address otherwise). Signed out:
// for an e-mail with an account, sign in first (401); for a new e-mail, a name and password create
// the account, confirmed by the invitation itself (it was e-mailed to that address). Joins the
// organisation, or for a single-site invitation grants that site. Single use; a used, withdrawn or
// expired invitation answers 410. Open to anyone with the link: small body, unknown links throttled.
export default defineEventHandler(async (event): Promise<InvitationAcceptedDto> => {
  const { token } = await getValidatedRouterParams(event, validator(InvitationTokenParamsSchema, 'params'))
  const invitation = await invitationByToken(event, token)
  const input = await readValidatedJson(event, InvitationAcceptSchema, BODY_LIMITS.public)
  assertInvitationOpen(invitation)
  const { person, created } = await acceptInvitation(useDb(), {
    invitation,
    userId: currentSession(event)?.userId ?? null,
    input,
    hashPassword: (password) => hashPassword(password),
    now: nowIso(),
  })
  await audit({
    orgId: invitation.org_id,
    userId: person.id,
    action: 'invitation.accepted',
    targetType: 'invitation',
    targetId: invitation.id,
    detail: { before: { state: 'pending' }, after: { state: 'accepted' }, email: invitation.email, acceptedAs: person.email, accountCreated: created },
  })
  await audit(
    invitation.site_id === null
      ? { orgId: invitation.org_id, userId: person.id, action: 'member.added', targetType: 'user', targetId: person.id, detail: { before: null, after: { role: invitation.role }, via: 'invitation', invitationId: invitation.id } }
      : { orgId: invitation.org_id, userId: person.id, action: 'site-grant.created', targetType: 'site', targetId: invitation.site_id, detail: { before: null, after: { userId: person.id, role: 'reviewer' }, via: 'invitation', invitationId: invitation.id } },
  )
  if (created) await startSession(event, person)
  return { user: person, orgId: invitation.org_id, role: invitation.role, siteId: invitation.site_id, created }
})
