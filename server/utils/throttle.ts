import type { H3Event } from 'h3'
import { assertNotThrottledIn, clearThrottleHits, recordThrottleHits, type ThrottleBucket as Bucket } from '../domain/throttle'
import { isDomainError } from '../domain/errors'

// The request side of the throttle (server/domain/throttle.ts): the client's address, the sign-in
// keys of a request, the per-address allowance from runtime config, and Retry-After on a 429.

/** A bucket of THROTTLES (server/domain/throttle.ts). */
export type ThrottleBucket = Bucket

/** Settings: NUXT_THROTTLE_ADDRESS_FACTOR multiplies the allowance of the per-address buckets (1 by default). */
function addressFactor(): number {
  const factor = Number(useRuntimeConfig().throttle?.addressFactor ?? 1)
  return Number.isFinite(factor) && factor >= 1 ? factor : 1
}

/** The client's address: the socket's, or the proxy's X-Forwarded-For when NUXT_TRUST_PROXY is set. */
export function clientAddress(event: H3Event): string {
  const trust = Boolean(useRuntimeConfig().trustProxy)
  return getRequestIP(event, { xForwardedFor: trust }) ?? 'unknown'
}

/**
 * 429 with Retry-After when any of the (bucket, key) pairs must still wait; checks all, answers
 * with the longest wait. Call before the attempt.
 */
export async function assertNotThrottled(event: H3Event, checks: [ThrottleBucket, string][], now = Date.now()): Promise<void> {
  try {
    await assertNotThrottledIn(useDb(), checks, { now, addressFactor: addressFactor() })
  } catch (error) {
    if (isDomainError(error) && error.status === 429) setResponseHeader(event, 'Retry-After', Number(error.data?.retryAfter_s))
    throw error
  }
}

/** Counts one attempt in each bucket, and forgets hits older than every window. */
export async function recordHit(checks: [ThrottleBucket, string][], now = Date.now()): Promise<void> {
  await recordThrottleHits(useDb(), checks, now)
}

/** Forgets the hits of these (bucket, key) pairs (after a successful sign-in, say). */
export async function clearHits(checks: [ThrottleBucket, string][]): Promise<void> {
  await clearThrottleHits(useDb(), checks)
}

/** The sign-in buckets for an e-mail from this request's address. */
export function signInKeys(event: H3Event, email: string): [ThrottleBucket, string][] {
  const address = clientAddress(event)
  return [
    ['sign-in-account', `${email}|${address}`],
    ['sign-in-address', address],
  ]
}
