import type { H3Event } from 'h3'
import type { ZodType } from 'zod'
import { parseSafeJson } from '../../shared/utils/safeJson'

// Request bodies, read with a limit counted on the bytes actually received. Every route that takes a
// body names its limit where it reads it (one of BODY_LIMITS), so a body is only read after the
// route has checked who is calling, and never held past its limit: a declared Content-Length over
// the limit is refused unread, and a chunked body is cut off the moment it passes (413, with
// `Connection: close` so nothing more is read from that connection). JSON routes take
// `application/json` only. Multipart uploads have their own reader (server/utils/uploads.ts).

/** The body limits routes choose from, in bytes. */
export const BODY_LIMITS = {
  /** Routes open to signed-out callers (sign-in, sign-up, password reset, invitations, links). */
  public: 8 * 1024,
  /** Ordinary signed-in forms: a site, an option, a comment, a review decision. */
  form: 256 * 1024,
  /** Engine inputs: an option with a daily flow record (a century of days fits well inside). */
  engine: 8 * 1024 * 1024,
} as const

const megabytesOrKilobytes = (bytes: number) => (bytes >= 1024 * 1024 ? `${(bytes / 1048576).toFixed(0)} MB` : `${(bytes / 1024).toFixed(0)} kB`)

/** 413 naming `what` and the limit. */
export function bodyTooLarge(what: string, limit: number) {
  return createError({
    statusCode: 413,
    statusMessage: 'Payload Too Large',
    message: `${what}: is larger than the ${megabytesOrKilobytes(limit)} limit`,
    data: { limitBytes: limit },
  })
}

/**
 * A refused body whose declared length is at most this is read and thrown away, bytes: nuxt-security
 * refuses declared bodies over 64 MB (uploads; 32 MB otherwise) before any route, so this is bounded.
 */
const DISCARD_AT_MOST = 64 * 1024 * 1024 + 64 * 1024

/** A refused chunked body is read on and dropped for at most this many bytes, or this long. */
const CHUNKED_DRAIN_BYTES = 256 * 1024 * 1024
const CHUNKED_DRAIN_MS = 2000

/**
 * Ends reading from a request whose body is refused, holding none of it. A body of declared
 * length up to DISCARD_AT_MOST is read on and thrown away, so the client (which is still sending)
 * sees the answer rather than a broken pipe. A chunked body could be endless: it too is read on and
 * dropped, but only for a short grace (2 s, 256 MB at most) in which the client reads the answer
 * and stops, and then the connection is cut. (Closed at once after the answer, the connection would
 * be reset while the client still sends, and a reset may throw the answer away before the client
 * reads it.) A larger declared body is not read at all: `Connection: close`.
 */
export function stopReading(event: H3Event): void {
  const req = event.node.req
  req.removeAllListeners('data')
  req.unpipe()
  const declared = Number(req.headers['content-length'] ?? NaN)
  const chunked = /\bchunked\b/i.test(String(req.headers['transfer-encoding'] ?? ''))
  if (!chunked && Number.isFinite(declared) && declared <= DISCARD_AT_MOST) {
    req.resume()
    return
  }
  if (!chunked) {
    if (!event.node.res.headersSent) event.node.res.setHeader('Connection', 'close')
    req.pause()
    return
  }
  let drained = 0
  const cut = () => {
    clearTimeout(timer)
    req.socket?.destroy()
  }
  const timer = setTimeout(cut, CHUNKED_DRAIN_MS)
  timer.unref()
  req.on('data', (chunk: Buffer) => {
    drained += chunk.length
    if (drained > CHUNKED_DRAIN_BYTES) cut()
  })
  req.once('end', () => clearTimeout(timer))
  req.resume()
}

const RawBodySymbol = Symbol.for('h3RawBody')

/**
 * The raw body, at most `limit` bytes: undefined when there is none; 413 when the declared length or
 * the bytes received pass the limit. h3's own readers see the same bytes afterwards.
 */
export function readBodyBytes(event: H3Event, limit: number, what = 'body'): Promise<Buffer | undefined> {
  const req = event.node.req as typeof event.node.req & { [RawBodySymbol]?: Promise<Buffer | undefined> }
  // A body read before (by another reader, with another limit) is held to this limit too.
  const cached = req[RawBodySymbol]
  if (cached) return cached.then((bytes) => (bytes && bytes.length > limit ? Promise.reject(bodyTooLarge(what, limit)) : bytes))
  const declared = Number(req.headers['content-length'] ?? NaN)
  const chunked = /\bchunked\b/i.test(String(req.headers['transfer-encoding'] ?? ''))
  if (!chunked && !(declared > 0)) return Promise.resolve(undefined)
  if (Number.isFinite(declared) && declared > limit) {
    stopReading(event)
    return Promise.reject(bodyTooLarge(what, limit))
  }
  const promise = new Promise<Buffer | undefined>((resolve, reject) => {
    const chunks: Buffer[] = []
    let received = 0
    let settled = false
    const fail = (error: unknown) => {
      if (settled) return
      settled = true
      reject(error)
    }
    req.on('data', (chunk: Buffer) => {
      if (settled) return
      received += chunk.length
      if (received > limit) {
        chunks.length = 0
        stopReading(event)
        fail(bodyTooLarge(what, limit))
        return
      }
      chunks.push(chunk)
    })
    req.on('end', () => {
      if (settled) return
      settled = true
      resolve(received === 0 ? undefined : Buffer.concat(chunks, received))
    })
    req.on('error', () => fail(createError({ statusCode: 400, statusMessage: 'Bad Request', message: `${what}: the request ended before its body was complete` })))
    req.on('aborted', () => fail(createError({ statusCode: 400, statusMessage: 'Bad Request', message: `${what}: the request ended before its body was complete` })))
  })
  req[RawBodySymbol] = promise
  return promise
}

/** True for `application/json`, with or without parameters such as `charset=utf-8`. */
const isJsonType = (type: string) => /^application\/json\s*(;|$)/i.test(type.trim())

/**
 * The body as JSON text, at most `limit` bytes: 415 unless it is sent as `application/json`,
 * undefined when there is no body. For routes that pass the text on (the engine's worker pool).
 */
export async function readJsonText(event: H3Event, limit: number): Promise<string | undefined> {
  const type = String(event.node.req.headers['content-type'] ?? '')
  const declared = Number(event.node.req.headers['content-length'] ?? NaN)
  const chunked = /\bchunked\b/i.test(String(event.node.req.headers['transfer-encoding'] ?? ''))
  const hasBody = chunked || declared > 0
  if (hasBody && !isJsonType(type)) {
    stopReading(event)
    throw createError({
      statusCode: 415,
      statusMessage: 'Unsupported Media Type',
      message: `body: send JSON with Content-Type: application/json (got ${type.split(';')[0]!.trim() || 'no type'})`,
    })
  }
  const bytes = await readBodyBytes(event, limit)
  if (!bytes) return undefined
  const text = bytes.toString('utf8')
  return text.trim() ? text : undefined
}

/** Parses JSON text, refusing prototype keys; 400 naming the body when it cannot be read. */
export function parseJsonBody(text: string): unknown {
  try {
    return parseSafeJson(text)
  } catch {
    throw createError({
      statusCode: 400,
      statusMessage: 'Bad Request',
      message: 'body: is not valid JSON, or holds a key such as "__proto__" or "constructor" that is refused',
    })
  }
}

/**
 * Reads, parses and validates a JSON body of at most `limit` bytes (one of BODY_LIMITS): 415 for
 * another content type, 413 past the limit, 400 for broken JSON or a field the schema refuses (the
 * message names the field, as `validator` does). No body validates as `{}`.
 */
export async function readValidatedJson<T>(event: H3Event, schema: ZodType<T>, limit: number): Promise<T> {
  const text = await readJsonText(event, limit)
  const body = text === undefined ? undefined : parseJsonBody(text)
  try {
    return validator(schema, 'body')(body)
  } catch (error) {
    // The same 400 h3's readValidatedBody gives for a validator's error.
    if (error instanceof InputError) throw createError({ statusCode: 400, statusMessage: 'Validation Error', message: error.message, data: { issues: error.issues } })
    throw error
  }
}

/** Parses already-read input (multipart fields) like the house validator: 400 naming the field. */
export function parseFields<T>(schema: ZodType<T>, input: unknown, what = 'body'): T {
  try {
    return validator(schema, what)(input)
  } catch (error) {
    if (error instanceof InputError) {
      throw createError({ statusCode: 400, statusMessage: 'Validation Error', message: error.message, data: { issues: error.issues } })
    }
    throw error
  }
}

