// Typed input errors for the engine, so the UI and the server can point at the offending field.

/**
 * An input to the engine is missing, malformed or out of range.
 * `field` is a path into the caller's input, e.g. `points[2].flow` or `days[41].date`.
 */
export class EngineInputError extends Error {
  override readonly name = 'EngineInputError'
  /** Path of the offending input, dotted with [index] for arrays. */
  readonly field: string

  constructor(field: string, message: string) {
    super(message)
    this.field = field
  }
}

/** Bounds for `checkNumber`; each bound is inclusive unless its `…Exclusive` twin is set. */
export interface NumberBounds {
  min?: number
  max?: number
  /** Reject `value === min`. */
  minExclusive?: boolean
  /** Reject `value === max`. */
  maxExclusive?: boolean
  /** Require a whole number. */
  integer?: boolean
}

/** Return `value` if it is a finite number inside `bounds`, else throw an EngineInputError on `field` (input validation, no equation). */
export function checkNumber(value: unknown, field: string, bounds: NumberBounds = {}): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new EngineInputError(field, 'must be a finite number')
  }
  const { min, max, minExclusive = false, maxExclusive = false, integer = false } = bounds
  if (integer && !Number.isInteger(value)) throw new EngineInputError(field, 'must be a whole number')
  if (min !== undefined && (minExclusive ? value <= min : value < min)) {
    throw new EngineInputError(field, `must be ${minExclusive ? 'greater than' : 'at least'} ${min}`)
  }
  if (max !== undefined && (maxExclusive ? value >= max : value > max)) {
    throw new EngineInputError(field, `must be ${maxExclusive ? 'less than' : 'at most'} ${max}`)
  }
  return value
}
