import { updateConstraints } from '~~/server/domain/consents'
import { ConsentListParamsSchema, ConstraintsPatchSchema, type ConstraintsDto } from '#shared/schemas/consent'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins change what a site's consent checks need: the distance to the nearest
// dwelling, the noise limit there (null for the default) and whether the weir is a gauging station.
// Version check as for a permission (0 before the first save): 409 when someone else saved since.
// A form's body (BODY_LIMITS.form); a single small write, so no rate-limit bucket.
export default defineEventHandler(async (event): Promise<ConstraintsDto> => {
  const { id } = await getValidatedRouterParams(event, validator(ConsentListParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  const patch = await readValidatedJson(event, ConstraintsPatchSchema, BODY_LIMITS.form)
  const { constraints, changed } = await updateConstraints(useDb(), { site, patch, userId: user.id, now: nowIso() })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'site-constraints.updated',
    targetType: 'site',
    targetId: site.id,
    detail: { fields: changed, version: constraints.version },
  })
  return constraints
})
