import { deleteCommissioningRecord } from '~~/server/domain/commissioning'
import { CommissioningParamsSchema } from '#shared/schemas/commissioning'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins remove a commissioning record (the page asks to confirm). The row stays,
// marked deleted (404 from then on), as the record of what was measured and by whom.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(CommissioningParamsSchema, 'params'))
  const { user, site, record } = await requireCommissioningRecord(event, id, EDITOR_ROLES)
  await deleteCommissioningRecord(useDb(), id, user.id, nowIso())
  await audit({ orgId: site.org_id, userId: user.id, action: 'commissioning.deleted', targetType: 'commissioning', targetId: id, detail: { siteId: site.id, measuredAt: record.measured_at, measuredBy: record.measured_by } })
  return { id, deleted: true }
})
