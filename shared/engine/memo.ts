/**
 * Wraps a pure function of numbers so it remembers its last arguments and answer. Inside one
 * assessment the same temperature and pressure come back thousands of times in a row, so water
 * and gas properties cost a comparison instead of a fresh evaluation. Results are identical.
 */
export function rememberLast<A extends number[], R>(fn: (...args: A) => R): (...args: A) => R {
  let lastArgs: A | null = null
  let lastResult: R
  return (...args: A): R => {
    if (lastArgs && lastArgs.length === args.length && lastArgs.every((a, i) => Object.is(a, args[i]))) return lastResult
    lastResult = fn(...args)
    lastArgs = args
    return lastResult
  }
}

/**
 * Like `rememberLast`, but keeps the last `size` distinct argument triples (newest replacing oldest),
 * for functions of up to three numbers asked in turn about a few fixed points, e.g. gas saturation
 * at the surface, at mid-submergence and at 20 °C for every flow of one month, which a single slot
 * would forget each time. Arguments are compared with Object.is and passed on unchanged (a missing
 * one stays undefined, so the function's own defaults apply). The function must be pure; results
 * are identical. No allocation on a hit.
 */
export function rememberRecent<R>(fn: (a: number, b?: number, c?: number) => R, size = 4): (a: number, b?: number, c?: number) => R {
  const as = new Array<number>(size).fill(Number.NaN)
  const bs = new Array<number | undefined>(size).fill(undefined)
  const cs = new Array<number | undefined>(size).fill(undefined)
  const values = new Array<R>(size)
  let filled = 0
  let next = 0
  return (a: number, b?: number, c?: number): R => {
    for (let k = 0; k < filled; k++) {
      if (Object.is(as[k], a) && Object.is(bs[k], b) && Object.is(cs[k], c)) return values[k] as R
    }
    const result = fn(a, b, c)
    as[next] = a
    bs[next] = b
    cs[next] = c
    values[next] = result
    next = (next + 1) % size
    if (filled < size) filled++
    return result
  }
}
