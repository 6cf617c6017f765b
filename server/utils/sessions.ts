import { createHash, randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'

// Server-side sessions. The sealed cookie (nuxt-auth-utils) carries the signed-in person and a random
// session key; the `sessions` table keeps the key's SHA-256 with when it started, when it was last
// seen and the browser's user agent. server/middleware/02.session.ts checks the row on every
// request, so deleting it ends the session at once: sign-out, "sign out everywhere else", a password
// change or reset. A cookie copied before then is worth nothing afterwards.

export const hashSessionKey = (key: string) => createHash('sha256').update(key, 'utf8').digest('hex')

/** How often a session's last-seen time is written, at most, ms. */
const TOUCH_EVERY_MS = 60 * 1000

export interface SessionPerson {
  id: number
  email: string
  name: string
}

/** What the session middleware found for this request. */
export interface CurrentSession {
  id: number
  userId: number
}

/** Starts a new session for `user` in this browser, replacing whatever the cookie held. */
export async function startSession(event: H3Event, user: SessionPerson): Promise<void> {
  const key = randomBytes(32).toString('base64url')
  const agent = String(getRequestHeader(event, 'user-agent') ?? '').slice(0, 300)
  const row = await useDb().insertInto('sessions').values({ user_id: user.id, key_hash: hashSessionKey(key), user_agent: agent }).returning('id').executeTakeFirstOrThrow()
  await replaceUserSession(event, { user: { id: user.id, email: user.email, name: user.name }, loggedInAt: new Date().toISOString(), secure: { sessionKey: key } })
  event.context.gillwattSession = { id: row.id, userId: user.id } satisfies CurrentSession
}

/** The session this request was made in, as checked by the session middleware; null when signed out. */
export function currentSession(event: H3Event): CurrentSession | null {
  return (event.context.gillwattSession as CurrentSession | undefined) ?? null
}

/** Ends this request's session (its row and its cookie); harmless when signed out. */
export async function endCurrentSession(event: H3Event): Promise<void> {
  const session = currentSession(event)
  if (session) await useDb().deleteFrom('sessions').where('id', '=', session.id).execute()
  event.context.gillwattSession = undefined
  await clearUserSession(event)
}

/** Ends every session of a person, except `keepId` when given. Returns how many ended. */
export async function endSessionsOf(userId: number, keepId?: number): Promise<number> {
  let query = useDb().deleteFrom('sessions').where('user_id', '=', userId)
  if (keepId !== undefined) query = query.where('id', '!=', keepId)
  const result = await query.executeTakeFirst()
  return Number(result.numDeletedRows)
}

/**
 * Looks up the session a sealed cookie names. Null when the key is missing, unknown (ended), or
 * belongs to someone else than the cookie says. Refreshes last-seen at most once a minute.
 */
export async function findSession(userId: number, key: string | undefined, now = Date.now()): Promise<CurrentSession | null> {
  if (!key) return null
  const db = useDb()
  const row = await db.selectFrom('sessions').select(['id', 'user_id', 'last_seen_at']).where('key_hash', '=', hashSessionKey(key)).executeTakeFirst()
  if (!row || row.user_id !== userId) return null
  if (now - Date.parse(row.last_seen_at) > TOUCH_EVERY_MS) {
    await db.updateTable('sessions').set({ last_seen_at: new Date(now).toISOString() }).where('id', '=', row.id).execute()
  }
  return { id: row.id, userId: row.user_id }
}
