import type { ZodType } from 'zod'

/** Thrown by `validator`; h3 turns it into a 400 whose message names the first bad field. */
export class InputError extends Error {
  constructor(
    message: string,
    public readonly issues: { path: string; message: string }[],
  ) {
    super(message)
  }
}

/**
 * Wraps a zod schema for h3's readValidatedBody / getValidatedQuery / getValidatedRouterParams:
 * returns the parsed value or throws an InputError listing every field that failed.
 */
export function validator<T>(schema: ZodType<T>, what = 'request') {
  return (input: unknown): T => {
    const result = schema.safeParse(input ?? {})
    if (result.success) return result.data
    const issues = result.error.issues.map((i) => ({
      path: i.path.map(String).join('.') || what,
      message: i.message,
    }))
    const first = issues[0]!
    const more = issues.length > 1 ? ` (and ${issues.length - 1} more)` : ''
    throw new InputError(`${first.path}: ${first.message}${more}`, issues)
  }
}
