import type { SessionDto } from '../../../../shared/schemas/account'

// The browsers signed in to the person's account, newest first. Signed-in only, own sessions only.
export default defineEventHandler(async (event): Promise<{ sessions: SessionDto[] }> => {
  const user = await requireUser(event)
  const current = currentSession(event)
  const rows = await useDb().selectFrom('sessions').select(['id', 'created_at', 'last_seen_at', 'user_agent']).where('user_id', '=', user.id).orderBy('last_seen_at', 'desc').orderBy('id', 'desc').execute()
  return { sessions: rows.map((r) => ({ id: r.id, createdAt: r.created_at, lastSeenAt: r.last_seen_at, userAgent: r.user_agent, current: r.id === current?.id })) }
})
