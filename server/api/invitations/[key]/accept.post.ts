import { assertInvitationOpen } from '../../../domain/invitations'
import { InvitationAcceptSchema, InvitationTokenParamsSchema, type InvitationAcceptedDto } from '../../../../shared/schemas/invitation'

const unprocessable = (message: string) => createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message })

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
  const db = useDb()
  if (invitation.site_id !== null) {
    const site = await db.selectFrom('sites').select('id').where('id', '=', invitation.site_id).where('deleted_at', 'is', null).executeTakeFirst()
    if (!site) throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'The site this invitation was for has been removed. Ask the administrator who sent it.', data: { state: 'site-removed' } })
  }

  const session = currentSession(event)
  let person: { id: number; email: string; name: string }
  let created = false
  let passwordHash: string | null = null
  if (session) {
    const me = await db.selectFrom('users').select(['id', 'email', 'name', 'email_verified_at']).where('id', '=', session.userId).executeTakeFirstOrThrow()
    if (me.email !== invitation.email) {
      throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `invitation: this invitation is for ${invitation.email}, and you are signed in as ${me.email}. Sign out, then sign in or create an account with ${invitation.email}.`, data: { invitedEmail: invitation.email } })
    }
    if (!me.email_verified_at) {
      throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `email: confirm that ${me.email} is yours before you join: open the link we e-mailed to it, or ask for a new one.`, data: { needs: 'verification' } })
    }
    person = { id: me.id, email: me.email, name: me.name }
  } else {
    const existing = await db.selectFrom('users').select('id').where('email', '=', invitation.email).executeTakeFirst()
    if (existing) {
      throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: `Sign in as ${invitation.email} first, then accept the invitation.`, data: { needs: 'sign-in' } })
    }
    if (!input.name) throw unprocessable('name: is required to create your account')
    if (!input.password) throw unprocessable('password: is required to create your account')
    passwordHash = await hashPassword(input.password)
    person = { id: 0, email: invitation.email, name: input.name }
    created = true
  }

  const at = nowIso()
  const result = await db.transaction().execute(async (trx) => {
    if (created) {
      const taken = await trx.selectFrom('users').select('id').where('email', '=', person.email).executeTakeFirst()
      if (taken) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'email: an account with this e-mail was just created; sign in and open the link again' })
      person.id = (await trx.insertInto('users').values({ email: person.email, name: person.name, password_hash: passwordHash!, email_verified_at: at, last_org_id: invitation.org_id }).returning('id').executeTakeFirstOrThrow()).id
    }
    const member = await trx.selectFrom('memberships').select('role').where('user_id', '=', person.id).where('org_id', '=', invitation.org_id).executeTakeFirst()
    if (member && (invitation.site_id === null || member.role !== 'viewer')) {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `invitation: you are already a member of this organisation (${member.role})` })
    }
    // Single use: only the first acceptance finds the invitation still open.
    const claimed = await trx
      .updateTable('invitations')
      .set({ accepted_at: at, accepted_by: person.id })
      .where('id', '=', invitation.id)
      .where('accepted_at', 'is', null)
      .where('revoked_at', 'is', null)
      .where('expires_at', '>', at)
      .executeTakeFirst()
    if (Number(claimed.numUpdatedRows) !== 1) throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This invitation has already been used. Sign in to continue.', data: { state: 'accepted' } })
    if (invitation.site_id === null) {
      await trx.insertInto('memberships').values({ user_id: person.id, org_id: invitation.org_id, role: invitation.role }).execute()
    } else {
      await trx
        .insertInto('site_grants')
        .values({ user_id: person.id, site_id: invitation.site_id, org_id: invitation.org_id, role: 'reviewer', granted_by: invitation.invited_by })
        .onConflict((oc) => oc.columns(['user_id', 'site_id']).doNothing())
        .execute()
    }
    return { userId: person.id }
  })

  await audit({
    orgId: invitation.org_id,
    userId: result.userId,
    action: 'invitation.accepted',
    targetType: 'invitation',
    targetId: invitation.id,
    detail: { before: { state: 'pending' }, after: { state: 'accepted' }, email: invitation.email, acceptedAs: person.email, accountCreated: created },
  })
  await audit(
    invitation.site_id === null
      ? { orgId: invitation.org_id, userId: result.userId, action: 'member.added', targetType: 'user', targetId: result.userId, detail: { before: null, after: { role: invitation.role }, via: 'invitation', invitationId: invitation.id } }
      : { orgId: invitation.org_id, userId: result.userId, action: 'site-grant.created', targetType: 'site', targetId: invitation.site_id, detail: { before: null, after: { userId: result.userId, role: 'reviewer' }, via: 'invitation', invitationId: invitation.id } },
  )
  if (created) await startSession(event, person)
  else if (invitation.site_id === null) await db.updateTable('users').set({ last_org_id: invitation.org_id }).where('id', '=', person.id).execute()
  return { user: person, orgId: invitation.org_id, role: invitation.role, siteId: invitation.site_id, created }
})
