import { deleteOption } from '~~/server/domain/options'
import { OptionParamsSchema } from '#shared/schemas/option'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins delete an option softly: it and its assessments answer 404 from then on and
// leave the portfolio, but nothing is erased.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(OptionParamsSchema, 'params'))
  const { user, site, option } = await requireOption(event, id, EDITOR_ROLES)
  const deletedAt = nowIso()
  await deleteOption(useDb(), id, user.id, deletedAt)
  await audit({ orgId: site.org_id, userId: user.id, action: 'option.deleted', targetType: 'option', targetId: id, detail: { siteId: site.id, name: option.name } })
  return { id, deletedAt }
})
