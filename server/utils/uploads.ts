import type { H3Event } from 'h3'

/** Room for the multipart boundaries and text fields around the file itself, bytes. */
const MULTIPART_OVERHEAD = 64 * 1024

const megabytes = (bytes: number) => `${Math.round(bytes / 1024 / 1024)} MB`

/** 413 with the limit in the message. */
export function tooLarge(what: string, limit: number) {
  return createError({
    statusCode: 413,
    statusMessage: 'Payload Too Large',
    message: `${what}: is larger than the ${megabytes(limit)} limit`,
    data: { limitBytes: limit },
  })
}

/** Bytes a client may send after the closing boundary: CR, LF, space, tab. */
const isTrailingSpace = (byte: number) => byte === 13 || byte === 10 || byte === 32 || byte === 9

/**
 * Whether `body` holds the closing boundary `close`. It normally ends the body, give or take a line
 * end, so the tail is compared first; only a body that does not end so (cut short, or with an
 * epilogue after the boundary, which is rare) is searched whole.
 */
function holdsClose(body: Buffer, close: Buffer): boolean {
  let end = body.length
  while (end > 0 && isTrailingSpace(body[end - 1]!)) end--
  if (end >= close.length && body.compare(close, 0, close.length, end - close.length, end) === 0) return true
  return body.lastIndexOf(close) !== -1
}

/**
 * 400 unless the multipart body ends with its closing boundary (`--boundary--`). The multipart reader
 * keeps the parts it found complete and drops the rest without a word, so a body cut short after the
 * file part would lose the fields after it (an append would become a replace).
 */
async function requireWholeBody(event: H3Event, type: string, part: string) {
  const boundary = /boundary=(?:"([^"]+)"|([^;]+))/i.exec(type)
  const body = await readRawBody(event, false)
  const close = boundary ? Buffer.from(`--${(boundary[1] ?? boundary[2] ?? '').trim()}--`) : null
  if (!close || !body || !holdsClose(body, close)) {
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: `${part}: the upload ended before its closing boundary (cut short); nothing was stored, send it again` })
  }
}

/**
 * Reads a multipart/form-data upload with one file part: 415 when the request is not multipart,
 * 413 when Content-Length or the file itself is over `maxBytes`, 400 naming the part when it is
 * missing or empty, or when the body was cut short. Text parts come back as `fields`.
 */
export async function readUpload(event: H3Event, maxBytes: number, part = 'file') {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!/^multipart\/form-data\b/i.test(type)) {
    throw createError({ statusCode: 415, statusMessage: 'Unsupported Media Type', message: `${part}: send the file as multipart/form-data` })
  }
  const declared = Number(getRequestHeader(event, 'content-length') ?? NaN)
  if (Number.isFinite(declared) && declared > maxBytes + MULTIPART_OVERHEAD) throw tooLarge(part, maxBytes)
  const parts = (await readMultipartFormData(event)) ?? []
  const file = parts.find((p) => p.name === part && p.filename !== undefined)
  if (!file) throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: `${part}: is required (a file part named "${part}")` })
  if (file.data.length === 0) throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: `${part}: is empty (0 bytes)` })
  if (file.data.length > maxBytes) throw tooLarge(part, maxBytes)
  await requireWholeBody(event, type, part)
  const fields: Record<string, string> = {}
  for (const p of parts) {
    if (p !== file && p.name && p.filename === undefined) fields[p.name] = p.data.toString('utf8')
  }
  return { file, fileName: safeFileName(file.filename ?? ''), mediaType: (file.type ?? '').split(';')[0]!.trim().toLowerCase(), fields }
}

/** The last path segment of a client's file name, without control characters, at most 200 characters. */
export function safeFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? ''
  // eslint-disable-next-line no-control-regex
  const clean = base.replace(/[\u0000-\u001f\u007f"]/g, '').trim().slice(0, 200)
  return clean || 'upload'
}
