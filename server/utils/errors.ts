import type { H3Error } from 'h3'
import { isDomainError, type DomainStatus } from '../domain/errors'

// The one place a refusal from server/domain becomes an HTTP error. server/plugins/domainErrors.ts
// applies it to every route; call it yourself only where a handler must answer a domain refusal
// differently.

const STATUS_TEXT: Record<DomainStatus, string> = {
  400: 'Bad Request',
  401: 'Unauthorized',
  403: 'Forbidden',
  404: 'Not Found',
  409: 'Conflict',
  410: 'Gone',
  413: 'Content Too Large',
  415: 'Unsupported Media Type',
  422: 'Unprocessable Entity',
  429: 'Too Many Requests',
}

/** The h3 error for a DomainError (status, message naming the field, data); anything else unchanged. */
export function httpErrorOf(error: unknown): unknown {
  if (!isDomainError(error)) return error
  return createError({ statusCode: error.status, statusMessage: STATUS_TEXT[error.status], message: error.message, data: error.data })
}

/**
 * h3 has already wrapped a thrown DomainError as an "unhandled" 500-style error whose cause is the
 * DomainError; this gives that wrapper the domain's status, message and data, as a handled error.
 */
export function applyDomainError(error: H3Error): void {
  const domain = error.cause
  if (!isDomainError(domain)) return
  const mapped = httpErrorOf(domain) as H3Error
  error.statusCode = mapped.statusCode
  error.statusMessage = mapped.statusMessage
  error.message = mapped.message
  error.data = mapped.data
  error.unhandled = false
}
