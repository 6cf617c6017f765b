import { endSessionOf } from '~~/server/domain/sessions'
import { SessionParamsSchema } from '#shared/schemas/account'

// Signs one of the person's browsers out. Signed-in only; someone else's session answers 404.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SessionParamsSchema, 'params'))
  const user = await requireUser(event)
  if (currentSession(event)?.id === id) {
    await endCurrentSession(event)
    return { ended: 1 }
  }
  await endSessionOf(useDb(), user.id, id)
  await audit({ orgId: null, userId: user.id, action: 'session.ended', targetType: 'user', targetId: user.id, detail: { sessionId: id } })
  return { ended: 1 }
})
