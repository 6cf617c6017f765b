import { loadOptionDto, updateOption } from '~~/server/domain/options'
import { OptionParamsSchema, OptionPatchSchema } from '#shared/schemas/option'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins change an option. The body carries the version they last read: when someone
// else has saved since, 409 with the current version and nothing is changed. Stored assessments keep
// the input they ran; the next assessment uses the changed design.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(OptionParamsSchema, 'params'))
  const { user, site } = await requireOption(event, id, EDITOR_ROLES)
  const patch = await readValidatedJson(event, OptionPatchSchema, BODY_LIMITS.form)
  const { option, changed } = await updateOption(useDb(), id, patch, nowIso())
  await audit({ orgId: site.org_id, userId: user.id, action: 'option.updated', targetType: 'option', targetId: id, detail: { siteId: site.id, fields: changed, version: option.version } })
  return loadOptionDto(useDb(), option)
})
