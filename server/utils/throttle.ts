import type { H3Event } from 'h3'

// Sign-in throttle: after MAX_FAILURES wrong passwords for one e-mail within WINDOW_MS, further
// attempts for that e-mail get 429 until the oldest failure in the window has aged out.
// Kept in SQLite so it survives restarts.

export const MAX_FAILURES = 5
export const WINDOW_MS = 15 * 60 * 1000

/** Throws 429 with Retry-After when this e-mail has failed too often recently. */
export async function assertNotThrottled(event: H3Event, email: string, now = Date.now()): Promise<void> {
  const failures = await useDb()
    .selectFrom('sign_in_failures')
    .select('failed_at')
    .where('email', '=', email)
    .where('failed_at', '>', now - WINDOW_MS)
    .orderBy('failed_at', 'desc')
    .limit(MAX_FAILURES)
    .execute()
  if (failures.length < MAX_FAILURES) return
  const oldest = failures.at(-1)!.failed_at
  const retryAfter = Math.max(1, Math.ceil((oldest + WINDOW_MS - now) / 1000))
  setResponseHeader(event, 'Retry-After', retryAfter)
  throw createError({
    statusCode: 429,
    statusMessage: 'Too Many Requests',
    message: `Too many failed sign-ins for this e-mail. Try again in ${Math.ceil(retryAfter / 60)} minute(s).`,
    data: { retryAfterSeconds: retryAfter },
  })
}

/** Records one failed attempt and forgets attempts older than the window. */
export async function recordFailure(email: string, now = Date.now()): Promise<void> {
  const db = useDb()
  await db.insertInto('sign_in_failures').values({ email, failed_at: now }).execute()
  await db.deleteFrom('sign_in_failures').where('failed_at', '<=', now - WINDOW_MS).execute()
}

/** Clears the failures of an e-mail after a successful sign-in. */
export async function clearFailures(email: string): Promise<void> {
  await useDb().deleteFrom('sign_in_failures').where('email', '=', email).execute()
}
