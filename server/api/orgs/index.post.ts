import { createOrganisation } from '~~/server/domain/organisations'
import { NewOrganisationSchema } from '#shared/schemas/auth'

// A signed-in person starts a further organisation and becomes its admin.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { name } = await readValidatedJson(event, NewOrganisationSchema, BODY_LIMITS.form)
  const org = await createOrganisation(useDb(), { name, adminId: user.id })
  await audit({ orgId: org.id, userId: user.id, action: 'organisation.created', targetType: 'organisation', targetId: org.id, detail: { name } })
  setResponseStatus(event, 201)
  return { orgId: org.id, orgName: org.name, role: 'admin' as const }
})
