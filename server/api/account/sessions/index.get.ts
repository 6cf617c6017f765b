import { listSessions } from '~~/server/domain/sessions'
import type { SessionDto } from '#shared/schemas/account'

// The browsers signed in to the person's account, newest first. Signed-in only, own sessions only.
export default defineEventHandler(async (event): Promise<{ sessions: SessionDto[] }> => {
  const user = await requireUser(event)
  return { sessions: await listSessions(useDb(), user.id, currentSession(event)?.id) }
})
