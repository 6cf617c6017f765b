import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import { createSession, endSession, findSession, type StoredSession } from '../domain/sessions'

// Server-side sessions, the request side. The sealed cookie (nuxt-auth-utils) carries the signed-in
// person and a random session key; server/domain/sessions.ts keeps the key's hash in the `sessions`
// table. server/middleware/02.session.ts checks the row on every request, so deleting it ends the
// session at once: sign-out, "sign out everywhere else", a password change or reset. A cookie copied
// before then is worth nothing afterwards.

export interface SessionPerson {
  id: number
  email: string
  name: string
}

/** What the session middleware found for this request. */
export type CurrentSession = StoredSession

/** Starts a new session for `user` in this browser, replacing whatever the cookie held. */
export async function startSession(event: H3Event, user: SessionPerson): Promise<void> {
  const key = randomBytes(32).toString('base64url')
  const userAgent = String(getRequestHeader(event, 'user-agent') ?? '').slice(0, 300)
  const id = await createSession(useDb(), { userId: user.id, key, userAgent })
  await replaceUserSession(event, { user: { id: user.id, email: user.email, name: user.name }, loggedInAt: new Date().toISOString(), secure: { sessionKey: key } })
  event.context.gillwattSession = { id, userId: user.id } satisfies CurrentSession
}

/** The session this request was made in, as checked by the session middleware; null when signed out. */
export function currentSession(event: H3Event): CurrentSession | null {
  return (event.context.gillwattSession as CurrentSession | undefined) ?? null
}

/** Ends this request's session (its row and its cookie); harmless when signed out. */
export async function endCurrentSession(event: H3Event): Promise<void> {
  const session = currentSession(event)
  if (session) await endSession(useDb(), session.id)
  event.context.gillwattSession = undefined
  await clearUserSession(event)
}

/** The live session the cookie's key names (server/domain/sessions.ts findSession), or null. */
export function sessionOfCookie(userId: number, key: string | undefined): Promise<CurrentSession | null> {
  return findSession(useDb(), userId, key, Date.now())
}
