import { loadConsentList } from '~~/server/domain/consents'
import { ConsentListParamsSchema, type ConsentListDto } from '#shared/schemas/consent'
import { canEdit, READER_ROLES } from '#shared/utils/roles'

// A site's consents and constraints list: every permission (a kind never saved shows as not
// started), the nearest dwelling, the noise check, and the eel-screening and gauging-station checks.
// Every role of the organisation and a single-site reviewer read it. Cheap reads of stored rows, no
// engine run: no rate-limit bucket, like the site's own GET.
export default defineEventHandler(async (event): Promise<ConsentListDto> => {
  const { id } = await getValidatedRouterParams(event, validator(ConsentListParamsSchema, 'params'))
  const { site, role } = await requireSite(event, id, READER_ROLES)
  return loadConsentList(useDb(), site, canEdit(role))
})
