import { organisationSettings } from '~~/server/domain/organisations'
import { OrgParamsSchema } from '#shared/schemas/common'
import { READER_ROLES } from '#shared/utils/roles'

// The organisation's settings (the currency its money figures are shown in); every member may read them.
export default defineEventHandler(async (event) => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, READER_ROLES)
  return organisationSettings(useDb(), orgId)
})
