import { deleteFlowRecord } from '~~/server/domain/flowRecords'
import { SiteParamsSchema } from '#shared/schemas/site'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins remove a site's flow record (all its days) in one transaction; 404 when there is none.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  const removed = await deleteFlowRecord(useDb(), id)
  await audit({ orgId: site.org_id, userId: user.id, action: 'flow-record.deleted', targetType: 'site', targetId: id, detail: removed })
  return { id, deleted: true }
})
