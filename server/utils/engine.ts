import type { H3Event } from 'h3'
import { EngineInputError } from '../../shared/engine/errors'

/** Largest JSON body an engine route accepts (a century of daily flows fits well inside). */
export const ENGINE_BODY_LIMIT = 8 * 1024 * 1024

/** 413 before reading a body whose declared length is over `limit` bytes. */
export function assertBodyWithin(event: H3Event, limit: number): void {
  const length = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (length > limit) {
    throw createError({
      statusCode: 413,
      statusMessage: 'Payload Too Large',
      message: `body: ${(length / 1048576).toFixed(1)} MB is over the ${(limit / 1048576).toFixed(0)} MB limit`,
    })
  }
}

/** Runs engine code, turning an EngineInputError into a 422 that names the field. */
export function runEngine<T>(compute: () => T): T {
  try {
    return compute()
  } catch (error) {
    if (error instanceof EngineInputError) {
      throw createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message: `${error.field}: ${error.message}`, data: { issues: [{ path: error.field, message: error.message }] } })
    }
    throw error
  }
}
