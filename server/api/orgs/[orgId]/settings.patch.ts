import { updateOrganisationSettings } from '~~/server/domain/organisations'
import { OrgParamsSchema } from '#shared/schemas/common'
import { OrganisationSettingsSchema } from '#shared/schemas/organisation'

// Admins set the organisation's currency (an ISO 4217 code and its symbol). Amounts are not
// converted: every money figure is shown in the new currency as it stands.
export default defineEventHandler(async (event) => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  const { user } = await requireRole(event, orgId, ['admin'])
  const body = await readValidatedJson(event, OrganisationSettingsSchema, BODY_LIMITS.form)
  const { before, after } = await updateOrganisationSettings(useDb(), orgId, body)
  await audit({ orgId, userId: user.id, action: 'organisation.settings-changed', targetType: 'organisation', targetId: orgId, detail: { currency: { from: before.currency, to: after.currency } } })
  return after
})
