import { describe, expect, it } from 'vitest'
import { RATE_LIMITS, RateLimiter, rateLimitRule } from '../../../server/utils/rateLimit'

// The in-memory per-person limiter of server/utils/rateLimit.ts (the 429 itself: tests/server/engine-pool.test.ts).

const rule = { limit: 3, windowSeconds: 60 }

describe('RateLimiter', () => {
  it('allows `limit` calls a window per key, then says when the window ends', () => {
    const limiter = new RateLimiter()
    const t0 = 1_000_000
    for (let k = 0; k < 3; k++) expect(limiter.hit('b', 7, rule, t0 + k).allowed).toBe(true)
    expect(limiter.hit('b', 7, rule, t0 + 10_000)).toEqual({ allowed: false, retryAfterMs: 50_000 })
    // Another key and another bucket count apart.
    expect(limiter.hit('b', 8, rule, t0 + 10_000).allowed).toBe(true)
    expect(limiter.hit('c', 7, rule, t0 + 10_000).allowed).toBe(true)
    // A new window once the old one has ended.
    expect(limiter.hit('b', 7, rule, t0 + 60_000).allowed).toBe(true)
  })

  it('holds at most maxKeys keys, dropping ended windows first, then the oldest', () => {
    const limiter = new RateLimiter(3)
    limiter.hit('b', 1, { limit: 1, windowSeconds: 1 }, 0)
    limiter.hit('b', 2, rule, 0)
    limiter.hit('b', 3, rule, 0)
    limiter.hit('b', 4, rule, 5_000) // key 1's window has ended: it goes
    expect(limiter.size).toBe(3)
    expect(limiter.hit('b', 2, rule, 5_000).allowed).toBe(true)
    expect(limiter.hit('b', 2, rule, 5_000).allowed).toBe(true)
    expect(limiter.hit('b', 2, rule, 5_000).allowed).toBe(false)
    limiter.hit('b', 5, rule, 6_000) // all live: the oldest (key 2) goes and starts afresh
    expect(limiter.size).toBe(3)
    expect(limiter.hit('b', 2, rule, 6_000).allowed).toBe(true)
    expect(limiter.size).toBe(3)
  })
})

describe('rateLimitRule', () => {
  it('takes RATE_LIMITS, with numbers given in runtimeConfig over it and anything else ignored', () => {
    expect(rateLimitRule('engine-sweep', {})).toEqual(RATE_LIMITS['engine-sweep'])
    expect(rateLimitRule('engine-sweep', { 'engine-sweep': { limit: 5 } })).toEqual({ ...RATE_LIMITS['engine-sweep'], limit: 5 })
    expect(rateLimitRule('engine-sweep', { 'engine-sweep': { limit: -1, windowSeconds: 'x' } })).toEqual(RATE_LIMITS['engine-sweep'])
    expect(rateLimitRule('engine-assess', { 'engine-sweep': { limit: 5 } })).toEqual(RATE_LIMITS['engine-assess'])
  })
})
