import type { H3Event } from 'h3'
import { roleIn } from '../domain/members'
import type { Role } from '../../shared/utils/roles'

/** The signed-in user, or a 401. The session middleware has already checked the session is live. */
export async function requireUser(event: H3Event) {
  const { user } = await getUserSession(event)
  if (!user || !currentSession(event)) throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'Sign in to continue' })
  return user
}

/**
 * Gate for every organisation-scoped route: 401 when signed out, 404 when the user is not a
 * member (so ids do not leak across organisations), 403 when their role is not in `roles`.
 * `notFound` is the 404's message: callers gating a record pass the message they give for a
 * missing record, so an outsider cannot tell an existing id from a missing one.
 */
export async function requireRole(event: H3Event, orgId: number, roles: readonly Role[], notFound = 'Organisation not found') {
  const user = await requireUser(event)
  const role = await roleIn(useDb(), user.id, orgId)
  if (!role) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: notFound })
  if (!roles.includes(role)) {
    throw createError({
      statusCode: 403,
      statusMessage: 'Forbidden',
      message: `This needs the ${roles.join(' or ')} role; you are ${role}`,
    })
  }
  return { user, role }
}
