import { createOptionFromInput, optionDto } from '~~/server/domain/options'
import { OptionInputSchema } from '#shared/schemas/option'
import { SiteParamsSchema } from '#shared/schemas/site'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins add a design option to a site; answers 201 with the stored option.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  const input = await readValidatedJson(event, OptionInputSchema, BODY_LIMITS.form)
  const row = await createOptionFromInput(useDb(), site, user.id, input)
  await audit({ orgId: site.org_id, userId: user.id, action: 'option.created', targetType: 'option', targetId: row.id, detail: { siteId: site.id, name: row.name } })
  setResponseStatus(event, 201)
  return optionDto(row, user.name, null)
})
