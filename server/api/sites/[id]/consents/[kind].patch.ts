import { updateConsent } from '~~/server/domain/consents'
import { ConsentParamsSchema, ConsentPatchSchema, type ConsentDto } from '#shared/schemas/consent'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins change one permission of a site: status, dates, reference, conditions,
// notes. The body carries the version last read (0 for a kind never saved): when someone else has
// saved since, 409 with the current version and nothing is changed. A form's body (BODY_LIMITS.form);
// a single small write like the site's PATCH, so no rate-limit bucket.
export default defineEventHandler(async (event): Promise<ConsentDto> => {
  const { id, kind } = await getValidatedRouterParams(event, validator(ConsentParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  const patch = await readValidatedJson(event, ConsentPatchSchema, BODY_LIMITS.form)
  const { consent, changed } = await updateConsent(useDb(), { site, kind, patch, userId: user.id, now: nowIso() })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'consent.updated',
    targetType: 'site',
    targetId: site.id,
    detail: { kind, fields: changed, status: consent.status, version: consent.version },
  })
  return consent
})
