import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'
import { DomainError } from './errors'

// One throttle for every attempt a stranger can repeat to guess something: sign-in failures,
// sign-ups, password-reset requests, invitation and verification links. Each named bucket counts
// hits per key (an account and client address, or a client address alone) in one table, so counts
// survive restarts. Past a bucket's free allowance inside its window, every further attempt must
// wait a delay that doubles with each hit (up to a cap): 429 with the wait until then.
//
// Sign-in failures are keyed by account *and* client address: someone guessing a password from one
// place never locks the owner out from another. A second bucket per client address catches one
// place trying many accounts. server/utils/throttle.ts finds the keys of a request and sets Retry-After.

export interface ThrottleRule {
  /** How far back hits are counted, ms. */
  windowMs: number
  /** Hits allowed in the window before delays start. */
  free: number
  /** Delay after the first hit past the allowance, ms; doubles with each further hit. */
  firstDelayMs: number
  /** Longest delay, ms. */
  maxDelayMs: number
  /** What the 429 message says is being throttled. */
  what: string
  /** The field the message names first. */
  field: string
}

const MINUTE = 60 * 1000

export const THROTTLES = {
  /** Wrong passwords for one account from one client address. */
  'sign-in-account': { windowMs: 15 * MINUTE, free: 5, firstDelayMs: 30 * 1000, maxDelayMs: 15 * MINUTE, what: 'failed sign-ins for this e-mail from your address', field: 'email' },
  /** Wrong passwords from one client address, whatever the account. */
  'sign-in-address': { windowMs: 15 * MINUTE, free: 30, firstDelayMs: 30 * 1000, maxDelayMs: 30 * MINUTE, what: 'failed sign-ins from your address', field: 'email' },
  /** New accounts from one client address. */
  'sign-up-address': { windowMs: 60 * MINUTE, free: 10, firstDelayMs: 60 * 1000, maxDelayMs: 60 * MINUTE, what: 'sign-ups from your address', field: 'email' },
  /** Password-reset requests for one e-mail (counted whether or not an account uses it). */
  'password-reset-email': { windowMs: 15 * MINUTE, free: 5, firstDelayMs: 60 * 1000, maxDelayMs: 60 * MINUTE, what: 'reset requests for this e-mail', field: 'email' },
  /** Password-reset requests from one client address. */
  'password-reset-address': { windowMs: 15 * MINUTE, free: 20, firstDelayMs: 60 * 1000, maxDelayMs: 60 * MINUTE, what: 'reset requests from your address', field: 'email' },
  /** Link tokens (invitation, reset, verification) that match nothing, from one client address. */
  'link-address': { windowMs: 15 * MINUTE, free: 30, firstDelayMs: 30 * 1000, maxDelayMs: 30 * MINUTE, what: 'unknown links opened from your address', field: 'token' },
  /** Verification e-mails sent again for one account. */
  'verification-resend': { windowMs: 60 * MINUTE, free: 3, firstDelayMs: 5 * MINUTE, maxDelayMs: 60 * MINUTE, what: 'verification e-mails for this account', field: 'email' },
} satisfies Record<string, ThrottleRule>

export type ThrottleBucket = keyof typeof THROTTLES

/** A bucket and the key counted in it (`email|address`, or an address alone). */
export type ThrottleCheck = [ThrottleBucket, string]

/** A bucket's rule; `addressFactor` (≥ 1) multiplies the allowance of the per-address buckets. */
function ruleOf(bucket: ThrottleBucket, addressFactor: number): ThrottleRule {
  const rule = THROTTLES[bucket]
  return bucket.endsWith('-address') ? { ...rule, free: Math.round(rule.free * addressFactor) } : rule
}

/** The wait before the next attempt is allowed, ms (0: allowed now), for hits at `times` (newest first). */
export function waitFor(rule: ThrottleRule, times: number[], now: number): number {
  const inWindow = times.filter((t) => t > now - rule.windowMs)
  if (inWindow.length < rule.free) return 0
  const over = inWindow.length - rule.free
  const delay = Math.min(rule.maxDelayMs, rule.firstDelayMs * 2 ** Math.min(over, 30))
  return Math.max(0, inWindow[0]! + delay - now)
}

/**
 * 429 naming the bucket's field, with `data.retryAfter_s`, when any of the (bucket, key) pairs
 * must still wait; checks all and answers with the longest wait. Call before the attempt.
 */
export async function assertNotThrottledIn(db: Kysely<Database>, checks: readonly ThrottleCheck[], opts: { now: number; addressFactor: number }): Promise<void> {
  const { now } = opts
  let longest = 0
  let worst: ThrottleRule | undefined
  for (const [bucket, key] of checks) {
    const rule = ruleOf(bucket, opts.addressFactor)
    const rows = await db
      .selectFrom('throttle_hits')
      .select('at')
      .where('bucket', '=', bucket)
      .where('key', '=', key)
      .where('at', '>', now - rule.windowMs)
      .orderBy('at', 'desc')
      .limit(rule.free + 31)
      .execute()
    const wait = waitFor(rule, rows.map((r) => r.at), now)
    if (wait > longest) {
      longest = wait
      worst = rule
    }
  }
  if (!worst) return
  const retryAfter = Math.max(1, Math.ceil(longest / 1000))
  const wait = retryAfter < 90 ? `${retryAfter} seconds` : `${Math.ceil(retryAfter / 60)} minutes`
  throw new DomainError(429, `${worst.field}: too many ${worst.what}. Try again in ${wait}.`, { field: worst.field, data: { retryAfter_s: retryAfter } })
}

/** Counts one attempt in each bucket, and forgets hits older than every window. */
export async function recordThrottleHits(db: Kysely<Database>, checks: readonly ThrottleCheck[], now: number): Promise<void> {
  if (checks.length) await db.insertInto('throttle_hits').values(checks.map(([bucket, key]) => ({ bucket, key, at: now }))).execute()
  const longest = Math.max(...Object.values(THROTTLES).map((r) => r.windowMs))
  await db.deleteFrom('throttle_hits').where('at', '<=', now - longest).execute()
}

/** Forgets the hits of these (bucket, key) pairs (after a successful sign-in, say). */
export async function clearThrottleHits(db: Kysely<Database>, checks: readonly ThrottleCheck[]): Promise<void> {
  for (const [bucket, key] of checks) await db.deleteFrom('throttle_hits').where('bucket', '=', bucket).where('key', '=', key).execute()
}
