import { z } from 'zod'
import { MemberRoleSchema } from '../../../../../shared/schemas/auth'
import { IdSchema } from '../../../../../shared/schemas/common'

const Params = z.object({ orgId: IdSchema, userId: IdSchema })

// Admins change a member's role; the last admin cannot step down (409), so no organisation is orphaned.
export default defineEventHandler(async (event) => {
  const { orgId, userId } = await getValidatedRouterParams(event, validator(Params, 'params'))
  const { user } = await requireRole(event, orgId, ['admin'])
  const { role } = await readValidatedJson(event, MemberRoleSchema, BODY_LIMITS.form)
  const db = useDb()
  const result = await db.transaction().execute(async (trx) => {
    const current = await memberRole(trx, orgId, userId)
    if (current === 'admin' && role !== 'admin') await assertAnotherAdmin(trx, orgId, 'role', '')
    await trx.updateTable('memberships').set({ role }).where('org_id', '=', orgId).where('user_id', '=', userId).execute()
    return { from: current, to: role }
  })
  await audit({ orgId, userId: user.id, action: 'member.role-changed', targetType: 'user', targetId: userId, detail: result })
  return { userId, role }
})
