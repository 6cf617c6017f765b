import { assertInvitationOpen } from '../../../domain/invitations'
import { InvitationTokenParamsSchema, type InvitationPublicDto } from '../../../../shared/schemas/invitation'
import { ROLE_LABELS } from '../../../../shared/utils/roles'

// GET /api/invitations/[token], no sign-in: what a pending invitation is for (organisation, role,
// the one site if any, who sent it), and nothing else. Unknown: 404; used, withdrawn or expired: 410.
export default defineEventHandler(async (event): Promise<InvitationPublicDto> => {
  setResponseHeaders(event, { 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer' })
  const { token } = await getValidatedRouterParams(event, validator(InvitationTokenParamsSchema, 'params'))
  const row = await invitationByToken(event, token)
  assertInvitationOpen(row)
  const db = useDb()
  const [org, site, inviter, account] = await Promise.all([
    db.selectFrom('organisations').select('name').where('id', '=', row.org_id).executeTakeFirstOrThrow(),
    row.site_id === null ? undefined : db.selectFrom('sites').select('name').where('id', '=', row.site_id).executeTakeFirst(),
    row.invited_by === null ? undefined : db.selectFrom('users').select('name').where('id', '=', row.invited_by).executeTakeFirst(),
    db.selectFrom('users').select('id').where('email', '=', row.email).executeTakeFirst(),
  ])
  return {
    organisationName: org.name,
    role: row.role,
    roleLabel: ROLE_LABELS[row.role],
    siteName: site?.name ?? null,
    email: row.email,
    invitedByName: inviter?.name ?? null,
    expiresAt: row.expires_at,
    needs: account ? 'sign-in' : 'new-account',
  }
})
