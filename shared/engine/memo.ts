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
