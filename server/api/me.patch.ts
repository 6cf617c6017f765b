import { roleIn } from '../domain/members'
import { MePatchSchema } from '../../shared/schemas/account'

// Remembers the organisation the person chose, so the app opens it next time (on any browser).
// Signed-in only; only an organisation they belong to (404 otherwise, naming nothing).
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { lastOrgId } = await readValidatedJson(event, MePatchSchema, BODY_LIMITS.public)
  if (!(await roleIn(useDb(), user.id, lastOrgId))) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'lastOrgId: Organisation not found' })
  await useDb().updateTable('users').set({ last_org_id: lastOrgId }).where('id', '=', user.id).execute()
  return meOf(user.id)
})
