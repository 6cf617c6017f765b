// Seeded random numbers for the Monte Carlo: the same seed always gives the same draws, on the
// server's worker and in the browser alike (Math.random cannot be seeded).

/** A source of numbers uniform in [0, 1). */
export type Random = () => number

/**
 * Mulberry32 (Tommy Ettinger, public domain): a 32-bit state generator, fast and of good quality for
 * simulation (not for secrets). The seed is taken as an unsigned 32-bit whole number.
 */
export function seededRandom(seed: number): Random {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** How one uncertain input is spread between its low and high ends. */
export type Spread =
  | { kind: 'uniform', low: number, high: number }
  | { kind: 'triangular', low: number, mode: number, high: number }

/** One draw from a spread by inverting its cumulative distribution at u in [0, 1) (uniform; triangular: Evans, Hastings & Peacock, Statistical Distributions). */
export function drawFrom(spread: Spread, u: number): number {
  if (spread.kind === 'uniform') return spread.low + u * (spread.high - spread.low)
  const { low: a, mode: c, high: b } = spread
  if (!(b > a)) return a
  const f = (c - a) / (b - a)
  return u < f ? a + Math.sqrt(u * (b - a) * (c - a)) : b - Math.sqrt((1 - u) * (b - a) * (b - c))
}
