import { SessionParamsSchema } from '../../../../shared/schemas/account'

// Signs one of the person's browsers out. Signed-in only; someone else's session answers 404.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SessionParamsSchema, 'params'))
  const user = await requireUser(event)
  if (currentSession(event)?.id === id) {
    await endCurrentSession(event)
    return { ended: 1 }
  }
  const result = await useDb().deleteFrom('sessions').where('id', '=', id).where('user_id', '=', user.id).executeTakeFirst()
  if (Number(result.numDeletedRows) !== 1) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'id: no such session of yours' })
  await audit({ orgId: null, userId: user.id, action: 'session.ended', targetType: 'user', targetId: user.id, detail: { sessionId: id } })
  return { ended: 1 }
})
