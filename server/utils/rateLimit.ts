import type { H3Event } from 'h3'

// Per-caller rate limits, in memory: each named bucket allows `limit` calls per `windowSeconds` to
// one key (a user id), counted in fixed windows starting at the key's first call. A route declares
// its bucket where it checks it: `rateLimit(event, 'engine-sweep', user.id)` after authorising and
// before reading the body. To add a bucket, add a line to RATE_LIMITS. Any bucket's numbers can be
// changed without a build through runtimeConfig.rateLimits, e.g.
// NUXT_RATE_LIMITS='{"engine-sweep":{"limit":60}}'. Counts live in this process only: a restart
// forgets them, and several server processes each count their own.

/** One bucket's allowance; `what` names the calls in the 429 message ("Too many sweeps: …"). */
export interface RateLimitRule {
  limit: number
  windowSeconds: number
  what: string
}

/** The named limits, per key (user id). */
export const RATE_LIMITS = {
  /** POST /api/engine/sweep and POST /api/options/{id}/sweep (up to 400 engine runs each). */
  'engine-sweep': { limit: 20, windowSeconds: 60, what: 'sweeps' },
  /** POST /api/engine/sensitivity (27 engine runs each: the base and 13 inputs at two ends). */
  'engine-sensitivity': { limit: 30, windowSeconds: 60, what: 'sensitivity runs' },
  /** POST /api/engine/assess and POST /api/options/{id}/assessments (one engine run each). */
  'engine-assess': { limit: 60, windowSeconds: 60, what: 'assessments' },
  /** POST /api/sites/{id}/flow-record and POST /api/sites/{id}/attachments (up to 10 and 20 MB each). */
  uploads: { limit: 30, windowSeconds: 60, what: 'uploads' },
  /** POST /api/orgs/{orgId}/invitations: each sends an e-mail to an address the caller chose. */
  invitations: { limit: 30, windowSeconds: 3600, what: 'invitations' },
  /** POST /api/sites/{id}/comments: each may e-mail the people it mentions. */
  comments: { limit: 60, windowSeconds: 60, what: 'comments' },
} as const satisfies Record<string, RateLimitRule>

/** A bucket name from RATE_LIMITS. */
export type RateLimitBucket = keyof typeof RATE_LIMITS

/** Most keys held at once; past it, ended windows are dropped first, then the oldest windows. */
const MAX_KEYS = 50_000

/** Fixed-window counters keyed by bucket and key, holding at most `maxKeys` of them. */
export class RateLimiter {
  private readonly windows = new Map<string, { count: number; resetAt: number }>()
  constructor(private readonly maxKeys = MAX_KEYS) {}

  /** Counts one call; answers whether it is allowed and, if not, in how many ms the window ends. */
  hit(bucket: string, key: string | number, rule: Pick<RateLimitRule, 'limit' | 'windowSeconds'>, now = Date.now()): { allowed: boolean; retryAfterMs: number } {
    const id = `${bucket}\u0000${key}`
    let window = this.windows.get(id)
    if (!window || window.resetAt <= now) {
      // A new window goes to the end of the map, so the oldest windows are always first.
      if (window) this.windows.delete(id)
      else this.makeRoom(now)
      window = { count: 0, resetAt: now + rule.windowSeconds * 1000 }
      this.windows.set(id, window)
    }
    if (window.count >= rule.limit) return { allowed: false, retryAfterMs: window.resetAt - now }
    window.count++
    return { allowed: true, retryAfterMs: 0 }
  }

  /** How many keys are held. */
  get size(): number {
    return this.windows.size
  }

  private makeRoom(now: number): void {
    if (this.windows.size < this.maxKeys) return
    for (const [id, w] of this.windows) if (w.resetAt <= now) this.windows.delete(id)
    // Still full of live windows: forget the oldest (their keys start afresh).
    for (const id of this.windows.keys()) {
      if (this.windows.size < this.maxKeys) break
      this.windows.delete(id)
    }
  }
}

/** A bucket's rule: RATE_LIMITS, with any numbers given in runtimeConfig.rateLimits over it. */
export function rateLimitRule(bucket: RateLimitBucket, overrides: unknown = useRuntimeConfig().rateLimits): RateLimitRule {
  const base: RateLimitRule = RATE_LIMITS[bucket]
  const given = (overrides as Record<string, { limit?: unknown; windowSeconds?: unknown } | undefined> | undefined)?.[bucket]
  const positive = (v: unknown, fallback: number) => (typeof v === 'number' && Number.isFinite(v) && v > 0 ? v : fallback)
  return { ...base, limit: Math.floor(positive(given?.limit, base.limit)), windowSeconds: positive(given?.windowSeconds, base.windowSeconds) }
}

const limiter = new RateLimiter()

const spell = (seconds: number) =>
  seconds === 60 ? 'a minute' : seconds === 3600 ? 'an hour' : seconds % 3600 === 0 ? `per ${seconds / 3600} hours` : seconds % 60 === 0 ? `per ${seconds / 60} minutes` : `per ${seconds} s`

/** Counts one call of `key` (a user id) in `bucket`; 429 with Retry-After and a plain message past its limit. */
export function rateLimit(event: H3Event, bucket: RateLimitBucket, key: string | number): void {
  const rule = rateLimitRule(bucket)
  const { allowed, retryAfterMs } = limiter.hit(bucket, key, rule)
  if (allowed) return
  const retryAfter = Math.max(1, Math.ceil(retryAfterMs / 1000))
  setResponseHeader(event, 'Retry-After', retryAfter)
  throw createError({
    statusCode: 429,
    statusMessage: 'Too Many Requests',
    message: `Too many ${rule.what}: at most ${rule.limit} ${spell(rule.windowSeconds)} for each person. Try again in ${retryAfter} s.`,
    data: { bucket, limit: rule.limit, window_s: rule.windowSeconds, retryAfter_s: retryAfter },
  })
}
