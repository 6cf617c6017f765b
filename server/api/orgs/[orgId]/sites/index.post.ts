import { OrgParamsSchema } from '../../../../../shared/schemas/common'
import { SiteInputSchema } from '../../../../../shared/schemas/site'
import { EDITOR_ROLES } from '../../../../../shared/utils/roles'

// Engineers and admins add a site to their organisation; answers 201 with the stored site.
export default defineEventHandler(async (event) => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  const { user } = await requireRole(event, orgId, EDITOR_ROLES)
  const input = await readValidatedJson(event, SiteInputSchema, BODY_LIMITS.form)
  const cols = siteColumns(input)
  const site = await useDb()
    .insertInto('sites')
    .values({
      org_id: orgId,
      created_by: user.id,
      name: input.name,
      river_name: input.riverName,
      lat: input.location.lat,
      lng: input.location.lng,
      altitude_m: input.altitudeM,
      gross_head_m: input.weir.grossHeadM,
      target_oxygen_mgl: input.targetOxygenMgL,
      weir: cols.weir!,
      reserved_flow: cols.reserved_flow!,
      months: cols.months!,
      reach: cols.reach ?? null,
      catchment: cols.catchment ?? null,
      head_table: cols.head_table,
      fdc_points: cols.fdc_points,
      notes: cols.notes,
    })
    .returningAll()
    .executeTakeFirstOrThrow()
  await audit({ orgId, userId: user.id, action: 'site.created', targetType: 'site', targetId: site.id, detail: { name: site.name, riverName: site.river_name } })
  setResponseStatus(event, 201)
  return siteDto(site)
})
