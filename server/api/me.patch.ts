import { rememberLastOrganisation } from '~~/server/domain/accounts'
import { MePatchSchema } from '#shared/schemas/account'

// Remembers the organisation the person chose, so the app opens it next time (on any browser).
// Signed-in only; only an organisation they belong to (404 otherwise, naming nothing).
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { lastOrgId } = await readValidatedJson(event, MePatchSchema, BODY_LIMITS.public)
  await rememberLastOrganisation(useDb(), user.id, lastOrgId)
  return meOf(user.id)
})
