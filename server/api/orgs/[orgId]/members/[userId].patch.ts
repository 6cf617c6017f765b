import { z } from 'zod'
import { changeMemberRole } from '~~/server/domain/members'
import { MemberRoleSchema } from '#shared/schemas/auth'
import { IdSchema } from '#shared/schemas/common'

const Params = z.object({ orgId: IdSchema, userId: IdSchema })

// Admins change a member's role; the last admin cannot step down (409), so no organisation is orphaned.
export default defineEventHandler(async (event) => {
  const { orgId, userId } = await getValidatedRouterParams(event, validator(Params, 'params'))
  const { user } = await requireRole(event, orgId, ['admin'])
  const { role } = await readValidatedJson(event, MemberRoleSchema, BODY_LIMITS.form)
  const change = await changeMemberRole(useDb(), { orgId, userId, role })
  await audit({ orgId, userId: user.id, action: 'member.role-changed', targetType: 'user', targetId: userId, detail: change })
  return { userId, role }
})
