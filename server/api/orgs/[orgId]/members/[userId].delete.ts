import { z } from 'zod'
import { removeMember } from '~~/server/domain/members'
import { IdSchema } from '#shared/schemas/common'
import { READER_ROLES } from '#shared/utils/roles'

const Params = z.object({ orgId: IdSchema, userId: IdSchema })

// An admin removes a member, or any member leaves (their own id). The last admin can do neither
// (409), so no organisation is orphaned. Their single-site review grants in the organisation go
// with them. Members only (404 for others); no body.
export default defineEventHandler(async (event) => {
  const { orgId, userId } = await getValidatedRouterParams(event, validator(Params, 'params'))
  const { user, role } = await requireRole(event, orgId, READER_ROLES)
  const leaving = userId === user.id
  if (!leaving && role !== 'admin') {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `This needs the admin role; you are ${role}` })
  }
  const removed = await removeMember(useDb(), { orgId, userId, leaving })
  await audit({ orgId, userId: user.id, action: leaving ? 'member.left' : 'member.removed', targetType: 'user', targetId: userId, detail: { before: { role: removed }, after: null } })
  return { userId, removed: true }
})
