import { createHash, randomBytes, timingSafeEqual } from 'node:crypto'
import type { H3Event } from 'h3'

// Link tokens (invitations, password resets, summary links): 128 random bits, base64url (22
// characters). Only the SHA-256 hash is stored; a presented token is hashed, looked up by that hash
// and compared again in constant time.

/** A fresh 128-bit random token, URL-safe. */
export function newLinkToken(): string {
  return randomBytes(16).toString('base64url')
}

/** SHA-256 of a token, hex: what the database keeps. */
export function hashLinkToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex')
}

/** True when `token` hashes to `storedHash`, compared in constant time. */
export function linkTokenMatches(token: string, storedHash: string): boolean {
  const a = Buffer.from(hashLinkToken(token), 'hex')
  const b = Buffer.from(storedHash, 'hex')
  return a.length === b.length && timingSafeEqual(a, b)
}

/** The app's public base URL (NUXT_PUBLIC_APP_URL, default http://localhost:3000), no trailing slash. */
export function appBaseUrl(): string {
  const url = useRuntimeConfig().public.appUrl || 'http://localhost:3000'
  return String(url).replace(/\/+$/, '')
}

/** An absolute link into the app. */
export const appLink = (path: string) => `${appBaseUrl()}${path.startsWith('/') ? path : `/${path}`}`

/** ISO time `ms` milliseconds from now. */
export const isoIn = (ms: number, now = Date.now()) => new Date(now + ms).toISOString()

// Password-reset throttle: like the sign-in throttle, at most RESET_MAX_REQUESTS requests for one
// e-mail within RESET_WINDOW_MS, counted whether or not an account uses it (so a 429 reveals nothing).
export const RESET_MAX_REQUESTS = 5
export const RESET_WINDOW_MS = 15 * 60 * 1000

/** Throws 429 with Retry-After when this e-mail has asked for too many resets recently; else records the request. */
export async function recordResetRequest(event: H3Event, email: string, now = Date.now()): Promise<void> {
  const db = useDb()
  const recent = await db
    .selectFrom('password_reset_requests')
    .select('requested_at')
    .where('email', '=', email)
    .where('requested_at', '>', now - RESET_WINDOW_MS)
    .orderBy('requested_at', 'desc')
    .limit(RESET_MAX_REQUESTS)
    .execute()
  if (recent.length >= RESET_MAX_REQUESTS) {
    const oldest = recent.at(-1)!.requested_at
    const retryAfter = Math.max(1, Math.ceil((oldest + RESET_WINDOW_MS - now) / 1000))
    setResponseHeader(event, 'Retry-After', retryAfter)
    throw createError({
      statusCode: 429,
      statusMessage: 'Too Many Requests',
      message: `email: too many reset requests for this e-mail. Try again in ${Math.ceil(retryAfter / 60)} minute(s).`,
      data: { retryAfterSeconds: retryAfter },
    })
  }
  await db.insertInto('password_reset_requests').values({ email, requested_at: now }).execute()
  await db.deleteFrom('password_reset_requests').where('requested_at', '<=', now - RESET_WINDOW_MS).execute()
}
