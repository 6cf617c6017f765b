import { InvitationAcceptSchema, InvitationTokenParamsSchema, type InvitationAcceptedDto } from '../../../../shared/schemas/invitation'

const unprocessable = (message: string) => createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message })

// POST /api/invitations/[token]/accept. Signed in: links the signed-in account. Signed out: for an
// e-mail with an account, its password signs in (throttled like sign-in); for a new e-mail, a name
// and password create the account. Joins the organisation, or for a single-site invitation grants
// that site. Single use; a used, withdrawn or expired invitation answers 410.
export default defineEventHandler(async (event): Promise<InvitationAcceptedDto> => {
  const { token } = await getValidatedRouterParams(event, validator(InvitationTokenParamsSchema, 'params'))
  const input = await readValidatedBody(event, validator(InvitationAcceptSchema, 'body'))
  const invitation = await invitationByToken(token)
  assertInvitationOpen(invitation)
  const db = useDb()
  if (invitation.site_id !== null) {
    const site = await db.selectFrom('sites').select('id').where('id', '=', invitation.site_id).where('deleted_at', 'is', null).executeTakeFirst()
    if (!site) throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'The site this invitation was for has been removed. Ask the administrator who sent it.', data: { state: 'site-removed' } })
  }

  const session = await getUserSession(event)
  let person: { id: number; email: string; name: string }
  let created = false
  let passwordHash: string | null = null
  if (session.user) {
    person = { id: session.user.id, email: session.user.email, name: session.user.name }
  } else {
    const existing = await db.selectFrom('users').select(['id', 'email', 'name', 'password_hash']).where('email', '=', invitation.email).executeTakeFirst()
    if (existing) {
      if (!input.password) throw unprocessable(`password: an account already uses ${invitation.email}; sign in first, or give its password`)
      await assertNotThrottled(event, existing.email)
      if (!(await verifyPassword(existing.password_hash, input.password))) {
        await recordFailure(existing.email)
        throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'password: is wrong for this account' })
      }
      await clearFailures(existing.email)
      person = { id: existing.id, email: existing.email, name: existing.name }
    } else {
      if (!input.name) throw unprocessable('name: is required to create your account')
      if (!input.password) throw unprocessable('password: is required to create your account')
      passwordHash = await hashPassword(input.password)
      person = { id: 0, email: invitation.email, name: input.name }
      created = true
    }
  }

  const at = nowIso()
  const result = await db.transaction().execute(async (trx) => {
    if (created) {
      const taken = await trx.selectFrom('users').select('id').where('email', '=', person.email).executeTakeFirst()
      if (taken) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'email: an account with this e-mail was just created; sign in and open the link again' })
      person.id = (await trx.insertInto('users').values({ email: person.email, name: person.name, password_hash: passwordHash! }).returning('id').executeTakeFirstOrThrow()).id
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
  if (!session.user) await setUserSession(event, { user: person, loggedInAt: new Date().toISOString() })
  return { user: person, orgId: invitation.org_id, role: invitation.role, siteId: invitation.site_id, created }
})
