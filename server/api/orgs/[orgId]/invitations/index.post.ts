import { invitationMail } from '../../../../mail/templates/invitation'
import { OrgParamsSchema } from '../../../../../shared/schemas/common'
import { INVITATION_TTL_DAYS, InvitationInputSchema, invitationPath, type InvitationCreatedDto } from '../../../../../shared/schemas/invitation'
import { ROLE_LABELS } from '../../../../../shared/utils/roles'

const DAY_MS = 24 * 60 * 60 * 1000

// Admins invite a person by e-mail to the organisation with a role, or (with siteId) as reviewer
// of that one site only. The link goes out by e-mail; the database keeps only its hash.
export default defineEventHandler(async (event): Promise<InvitationCreatedDto> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  const { user } = await requireRole(event, orgId, ['admin'])
  rateLimit(event, 'invitations', user.id)
  const { email, role, siteId } = await readValidatedJson(event, InvitationInputSchema, BODY_LIMITS.form)
  const db = useDb()
  const site = siteId === undefined ? null : await db.selectFrom('sites').select(['id', 'name']).where('id', '=', siteId).where('org_id', '=', orgId).where('deleted_at', 'is', null).executeTakeFirst()
  if (siteId !== undefined && !site) {
    throw createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message: 'siteId: no such site in this organisation' })
  }
  const person = await db.selectFrom('users').select('id').where('email', '=', email).executeTakeFirst()
  if (person) {
    const member = await roleIn(person.id, orgId)
    if (member && (!site || member !== 'viewer')) {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `email: already a member of this organisation (${member}); change their role instead` })
    }
    if (site && (await db.selectFrom('site_grants').select('user_id').where('user_id', '=', person.id).where('site_id', '=', site.id).executeTakeFirst())) {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'email: already reviews this site' })
    }
  }
  let waiting = db.selectFrom('invitations').select(['id', 'created_at']).where('org_id', '=', orgId).where('email', '=', email).where(invitationStateCondition('pending'))
  waiting = site ? waiting.where('site_id', '=', site.id) : waiting.where('site_id', 'is', null)
  const open = await waiting.executeTakeFirst()
  if (open) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `email: an invitation is already waiting (sent ${open.created_at.slice(0, 10)}); revoke it to send another` })
  }

  const token = newLinkToken()
  const row = await db
    .insertInto('invitations')
    .values({ org_id: orgId, email, role, site_id: site?.id ?? null, token_hash: hashLinkToken(token), invited_by: user.id, expires_at: isoIn(INVITATION_TTL_DAYS * DAY_MS) })
    .returningAll()
    .executeTakeFirstOrThrow()
  await audit({
    orgId,
    userId: user.id,
    action: 'invitation.created',
    targetType: 'invitation',
    targetId: row.id,
    detail: { before: null, after: { email, role, siteId: row.site_id, expiresAt: row.expires_at } },
  })
  const org = await db.selectFrom('organisations').select('name').where('id', '=', orgId).executeTakeFirstOrThrow()
  await sendMail({
    to: email,
    ...invitationMail({ organisationName: org.name, inviterName: user.name, roleLabel: ROLE_LABELS[role], siteName: site?.name ?? null, link: appLink(invitationPath(token)), expiresAt: row.expires_at }),
    kind: 'invitation',
    orgId,
  })
  setResponseStatus(event, 201)
  return invitationDto({ ...row, site_name: site?.name ?? null, inviter_name: user.name })
})
