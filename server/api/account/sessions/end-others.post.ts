import { endSessionsOf } from '~~/server/domain/sessions'

// "Sign out everywhere else": ends every session of the person but this one. Signed-in only, no body.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const ended = await endSessionsOf(useDb(), user.id, currentSession(event)!.id)
  await audit({ orgId: null, userId: user.id, action: 'session.ended-others', targetType: 'user', targetId: user.id, detail: { ended } })
  return { ended }
})
