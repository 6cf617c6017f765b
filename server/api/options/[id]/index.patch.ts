import { sql } from 'kysely'
import { OptionParamsSchema, OptionPatchSchema } from '../../../../shared/schemas/option'
import { EDITOR_ROLES } from '../../../../shared/utils/roles'

// Engineers and admins change an option. The body carries the version they last read: when someone
// else has saved since, 409 with the current version and nothing is changed. Stored assessments keep
// the input they ran; the next assessment uses the changed design.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(OptionParamsSchema, 'params'))
  const { user, site } = await requireOption(event, id, EDITOR_ROLES)
  const { version, ...patch } = await readValidatedJson(event, OptionPatchSchema, BODY_LIMITS.form)
  const changed = Object.keys(patch).filter((k) => patch[k as keyof typeof patch] !== undefined)
  const updated = await useDb()
    .updateTable('options')
    .set({ ...optionColumns(patch), version: sql<number>`version + 1`, updated_at: new Date().toISOString() })
    .where('id', '=', id)
    .where('version', '=', version)
    .where('deleted_at', 'is', null)
    .returningAll()
    .executeTakeFirst()
  if (!updated) throw await staleVersionError('options', id, version, 'option')
  await audit({ orgId: site.org_id, userId: user.id, action: 'option.updated', targetType: 'option', targetId: id, detail: { siteId: site.id, fields: changed, version: updated.version } })
  return loadOptionDto(updated)
})
