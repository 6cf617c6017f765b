// How domain operations refuse: they throw a DomainError carrying the HTTP status the refusal
// deserves, the field it is about (when there is one) and a message that names that field first.
// Domain code never builds h3 errors: server/utils/errors.ts turns a DomainError into one, for every
// route at once (server/plugins/domainErrors.ts), so handlers need no try/catch around domain calls.
// The seed and the benchmarks see the same errors as plain exceptions.

/** The statuses a domain refusal may carry. */
export type DomainStatus = 400 | 401 | 403 | 404 | 409 | 410 | 413 | 415 | 422 | 429

/** A refusal by a domain operation: status, message (field first), optional field and extra data for the client. */
export class DomainError extends Error {
  override readonly name = 'DomainError'
  constructor(
    readonly status: DomainStatus,
    message: string,
    readonly options: { field?: string; data?: Record<string, unknown> } = {},
  ) {
    super(message)
  }

  /** The field the refusal is about, if any. */
  get field(): string | undefined {
    return this.options.field
  }

  /** Extra details the client gets as the error's `data`. */
  get data(): Record<string, unknown> | undefined {
    return this.options.data
  }
}

/** True for a DomainError (checked by name too, in case two copies of this module are loaded). */
export function isDomainError(error: unknown): error is DomainError {
  return error instanceof DomainError || (error instanceof Error && error.name === 'DomainError' && typeof (error as DomainError).status === 'number')
}

/** 404 with a neutral message. */
export const notFound = (message: string, data?: Record<string, unknown>) => new DomainError(404, message, { data })

/** 409: the stored state does not allow the change. */
export const conflict = (message: string, data?: Record<string, unknown>) => new DomainError(409, message, { data })

/** 422 naming the field, with the field in `data.issues` as a validation failure would list it. */
export function unprocessable(field: string, message: string): DomainError {
  return new DomainError(422, `${field}: ${message}`, { field, data: { issues: [{ path: field, message }] } })
}
