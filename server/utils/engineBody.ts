import type { H3Event } from 'h3'

/**
 * The body of a stateless engine route as JSON text, at most BODY_LIMITS.engine bytes (415 for
 * another type, 413 past the limit), for the engine pool to parse and check off the request thread.
 */
export async function readEngineBody(event: H3Event): Promise<string | undefined> {
  const text = await readJsonText(event, BODY_LIMITS.engine)
  // server/middleware/01.json-body.ts still reads every JSON body of up to 32 MB before the route
  // does, and readBodyBytes hands a body read earlier back without checking it against the limit:
  // until that changes, the limit is checked again here on what was received.
  // (A UTF-8 byte count is at most three times the string's length: most bodies skip the count.)
  if (text !== undefined && text.length > BODY_LIMITS.engine / 3 && Buffer.byteLength(text) > BODY_LIMITS.engine) throw bodyTooLarge('body', BODY_LIMITS.engine)
  return text
}
