/**
 * Wraps a pure function of up to three numbers so it remembers its last `size` distinct argument
 * triples and answers (newest replacing oldest). Inside one assessment the same temperature and
 * pressure come back thousands of times in a row, so water properties need one slot; gas saturation
 * is asked in turn about a few fixed points (the surface, mid-submergence and 20 °C for every flow
 * of one month), which a single slot would forget each time. Arguments are compared with Object.is and passed on unchanged (a missing
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
