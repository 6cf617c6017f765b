import { createHash } from 'node:crypto'
import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'
import type { SessionDto } from '../../shared/schemas/account'
import { notFound } from './errors'

// Server-side sessions as stored: the `sessions` table keeps the SHA-256 of each session's random key
// with when it started, when it was last seen and the browser's user agent. Deleting a row ends that
// session at once. The sealed cookie that carries the key is server/utils/sessions.ts.

/** SHA-256 of a session key, hex: what the database keeps. */
export const hashSessionKey = (key: string) => createHash('sha256').update(key, 'utf8').digest('hex')

/** How often a session's last-seen time is written, at most, ms. */
const TOUCH_EVERY_MS = 60 * 1000

/** A live session and whose it is. */
export interface StoredSession {
  id: number
  userId: number
}

/** Stores a new session of `userId` for the key the cookie will carry; returns its id. */
export async function createSession(db: Kysely<Database>, args: { userId: number; key: string; userAgent: string }): Promise<number> {
  const row = await db.insertInto('sessions').values({ user_id: args.userId, key_hash: hashSessionKey(args.key), user_agent: args.userAgent }).returning('id').executeTakeFirstOrThrow()
  return row.id
}

/**
 * The session a cookie's key names. Null when the key is missing, unknown (ended), or belongs to
 * someone else than the cookie says. Refreshes last-seen at most once a minute.
 */
export async function findSession(db: Kysely<Database>, userId: number, key: string | undefined, now: number): Promise<StoredSession | null> {
  if (!key) return null
  const row = await db.selectFrom('sessions').select(['id', 'user_id', 'last_seen_at']).where('key_hash', '=', hashSessionKey(key)).executeTakeFirst()
  if (!row || row.user_id !== userId) return null
  if (now - Date.parse(row.last_seen_at) > TOUCH_EVERY_MS) {
    await db.updateTable('sessions').set({ last_seen_at: new Date(now).toISOString() }).where('id', '=', row.id).execute()
  }
  return { id: row.id, userId: row.user_id }
}

/** Ends one session by its id; harmless when it has already ended. */
export async function endSession(db: Kysely<Database>, sessionId: number): Promise<void> {
  await db.deleteFrom('sessions').where('id', '=', sessionId).execute()
}

/** Ends one of the person's sessions: 404 naming `id` when it is not theirs or has ended. */
export async function endSessionOf(db: Kysely<Database>, userId: number, sessionId: number): Promise<void> {
  const result = await db.deleteFrom('sessions').where('id', '=', sessionId).where('user_id', '=', userId).executeTakeFirst()
  if (Number(result.numDeletedRows) !== 1) throw notFound('id: no such session of yours')
}

/** Ends every session of a person, except `keepId` when given. Returns how many ended. */
export async function endSessionsOf(db: Kysely<Database>, userId: number, keepId?: number): Promise<number> {
  let query = db.deleteFrom('sessions').where('user_id', '=', userId)
  if (keepId !== undefined) query = query.where('id', '!=', keepId)
  const result = await query.executeTakeFirst()
  return Number(result.numDeletedRows)
}

/** The person's sessions, last seen first; `currentId` marks the one asking. */
export async function listSessions(db: Kysely<Database>, userId: number, currentId: number | undefined): Promise<SessionDto[]> {
  const rows = await db.selectFrom('sessions').select(['id', 'created_at', 'last_seen_at', 'user_agent']).where('user_id', '=', userId).orderBy('last_seen_at', 'desc').orderBy('id', 'desc').execute()
  return rows.map((r) => ({ id: r.id, createdAt: r.created_at, lastSeenAt: r.last_seen_at, userAgent: r.user_agent, current: r.id === currentId }))
}
