import type { ZodType } from 'zod'
import { retiredFieldIssues } from '../../shared/schemas/retiredFields'

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
 * returns the parsed value or throws an InputError listing every field that failed. A field under
 * a name the API has retired (shared/schemas/retiredFields.ts) fails too, naming its new name: the
 * schema would drop it as an unknown key and use a default in its place.
 */
export function validator<T>(schema: ZodType<T>, what = 'request') {
  return (input: unknown): T => {
    const retired = retiredFieldIssues(input)
    if (retired.length > 0) throw inputError(retired)
    const result = schema.safeParse(input ?? {})
    if (result.success) return result.data
    throw inputError(result.error.issues.map((i) => ({
      path: i.path.map(String).join('.') || what,
      message: i.message,
    })))
  }
}

/** The InputError of a non-empty list of issues: its message names the first field. */
function inputError(issues: { path: string; message: string }[]): InputError {
  const first = issues[0]!
  const more = issues.length > 1 ? ` (and ${issues.length - 1} more)` : ''
  return new InputError(`${first.path}: ${first.message}${more}`, issues)
}
