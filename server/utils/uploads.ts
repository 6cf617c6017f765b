import { createWriteStream } from 'node:fs'
import { rm } from 'node:fs/promises'
import { Transform, Writable } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import busboy from 'busboy'
import type { H3Event } from 'h3'

// Multipart uploads, read as a stream by busboy with the limit counted on the bytes actually received
// (a chunked body has no Content-Length to trust): the answer is a 413 naming the part the moment the
// file passes its limit, and nothing more of a chunked body is read (see leaveRest). Never more than
// the limit is held: the file goes to a file on disk as it arrives (attachments) or into memory, at
// most the limit (the flow CSV, parsed whole). A body cut short before its closing boundary is a 400
// and keeps nothing. Text fields are small and few.

/** Room for the boundaries, part headers and text fields around the file itself, bytes. */
const MULTIPART_OVERHEAD = 64 * 1024
/** Text fields: how many, and how long each may be. */
const MAX_FIELDS = 20
const MAX_FIELD_BYTES = 4 * 1024
/** Bytes of the file's start kept for telling its type. */
const HEAD_BYTES = 64

/** The file part of an upload. */
export interface UploadedFile {
  /** Bytes received. */
  size: number
  /** Its first bytes (up to 64), for telling the type by content. */
  head: Buffer
  /** The client's name for it, made safe to show (see safeFileName). */
  fileName: string
  /** The declared type without parameters, lower case ('' when none). */
  mediaType: string
}

export interface Upload<F extends UploadedFile = UploadedFile> {
  file: F
  /** The text parts, by name. */
  fields: Record<string, string>
}

/** Where the file's bytes go while they arrive. */
interface Sink {
  writable: Writable
  /** Drops whatever was kept (the file on disk is removed). */
  discard(): Promise<void>
}

/**
 * What happens to the rest of a refused body (see stopReading in body.ts): a chunked one could be
 * endless and is read no further, the connection closing after the answer; one of declared, bounded
 * length is read and thrown away, so the client, still sending, gets the answer whole.
 */
function leaveRest(event: H3Event, bb?: busboy.Busboy) {
  if (bb) event.node.req.unpipe(bb)
  stopReading(event)
}

const badRequest = (message: string) => createError({ statusCode: 400, statusMessage: 'Bad Request', message })

/**
 * Reads an upload with one file part named `part` of at most `maxBytes`, holding the file in memory
 * (at most `maxBytes`): 415 when the request is not multipart, 413 past the limit, 400 naming the
 * part when it is missing, empty or cut short.
 */
export async function readUploadInMemory(event: H3Event, maxBytes: number, part = 'file'): Promise<Upload<UploadedFile & { data: Buffer }>> {
  const chunks: Buffer[] = []
  const sink: Sink = {
    writable: new Writable({
      write(chunk: Buffer, _encoding, done) {
        chunks.push(chunk)
        done()
      },
    }),
    discard: async () => {
      chunks.length = 0
    },
  }
  const upload = await readUpload(event, maxBytes, part, () => sink)
  return { file: { ...upload.file, data: Buffer.concat(chunks, upload.file.size) }, fields: upload.fields }
}

/**
 * Reads an upload as readUploadInMemory does, but streams the file to `path` (created, never
 * overwritten). On any refusal or failure the file at `path` is removed before this throws.
 */
export function readUploadToFile(event: H3Event, maxBytes: number, path: string, part = 'file'): Promise<Upload> {
  return readUpload(event, maxBytes, part, () => {
    const writable = createWriteStream(path, { flags: 'wx' })
    return {
      writable,
      discard: async () => {
        // Closed first, so a file still being opened cannot appear after the removal.
        await new Promise<void>((done) => {
          if (writable.closed) return done()
          writable.once('close', () => done())
          writable.destroy()
        })
        await rm(path, { force: true })
      },
    }
  })
}

function readUpload(event: H3Event, maxBytes: number, part: string, openSink: () => Sink): Promise<Upload> {
  const req = event.node.req
  const type = String(req.headers['content-type'] ?? '')
  if (!/^multipart\/form-data\b/i.test(type)) {
    leaveRest(event)
    throw createError({ statusCode: 415, statusMessage: 'Unsupported Media Type', message: `${part}: send the file as multipart/form-data` })
  }
  const declared = Number(req.headers['content-length'] ?? NaN)
  if (Number.isFinite(declared) && declared > maxBytes + MULTIPART_OVERHEAD) {
    leaveRest(event)
    throw bodyTooLarge(part, maxBytes)
  }
  let bb: busboy.Busboy
  try {
    bb = busboy({
      headers: req.headers,
      // File names arrive as UTF-8 from browsers; busboy's default reads them as latin1.
      defParamCharset: 'utf8',
      // `limit` fires when a file reaches fileSize exactly, so one byte more lets a file of exactly maxBytes through.
      limits: { fileSize: maxBytes + 1, files: 1, fields: MAX_FIELDS, fieldSize: MAX_FIELD_BYTES, parts: MAX_FIELDS + 1, headerPairs: 20 },
    })
  } catch {
    leaveRest(event)
    throw badRequest(`${part}: the multipart/form-data type has no boundary`)
  }

  return new Promise<Upload>((resolve, reject) => {
    let settled = false
    let received = 0
    let sink: Sink | undefined
    let writing: Promise<void> | undefined
    let file: UploadedFile | undefined
    const fields = new Map<string, string>()

    const fail = (error: unknown) => {
      if (settled) return
      settled = true
      if (!req.complete) leaveRest(event, bb)
      else req.unpipe(bb)
      // busboy throws when destroyed inside its own event handlers.
      setImmediate(() => bb.destroy())
      const dropped = sink ? sink.discard() : Promise.resolve()
      dropped.then(
        () => reject(error),
        () => reject(error),
      )
    }

    req.on('data', (chunk: Buffer) => {
      received += chunk.length
      if (received > maxBytes + MULTIPART_OVERHEAD) fail(bodyTooLarge(part, maxBytes))
    })
    const ended = () => {
      if (!req.complete) fail(badRequest(`${part}: the request ended before its body was complete; nothing was stored`))
    }
    req.on('aborted', ended)
    req.on('close', ended)
    req.on('error', ended)

    bb.on('file', (name, stream, info) => {
      // Only the one part asked for, sent as a file (with a file name), is kept; others are skipped.
      if (settled || sink || name !== part || info.filename === undefined) {
        stream.resume()
        return
      }
      sink = openSink()
      const meta: UploadedFile = { size: 0, head: Buffer.alloc(0), fileName: safeFileName(info.filename), mediaType: info.mimeType.split(';')[0]!.trim().toLowerCase() }
      const meter = new Transform({
        transform(chunk: Buffer, _encoding, done) {
          meta.size += chunk.length
          if (meta.head.length < HEAD_BYTES) meta.head = Buffer.concat([meta.head, chunk.subarray(0, HEAD_BYTES - meta.head.length)])
          done(null, chunk)
        },
      })
      stream.on('limit', () => fail(bodyTooLarge(part, maxBytes)))
      writing = pipeline(stream, meter, sink.writable).then(
        () => {
          file = meta
        },
        (error: NodeJS.ErrnoException) => {
          // An error with a system code is the disk's; anything else is the stream cut short.
          if (error.code && !error.code.startsWith('ERR_')) fail(createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: `${part}: could not be stored just now; nothing was kept, send it again` }))
          else fail(cutShort(part))
        },
      )
    })
    bb.on('field', (name, value, info) => {
      if (info.valueTruncated) fail(bodyTooLarge(name || 'field', MAX_FIELD_BYTES))
      else if (name) fields.set(name, value)
    })
    bb.on('filesLimit', () => fail(createError({ statusCode: 413, statusMessage: 'Payload Too Large', message: `${part}: send one file per upload` })))
    bb.on('fieldsLimit', () => fail(createError({ statusCode: 413, statusMessage: 'Payload Too Large', message: `fields: at most ${MAX_FIELDS} form fields are accepted` })))
    bb.on('partsLimit', () => fail(createError({ statusCode: 413, statusMessage: 'Payload Too Large', message: `fields: at most ${MAX_FIELDS} form fields and one file are accepted` })))
    bb.on('error', (error: Error) => fail(/unexpected end/i.test(error.message) ? cutShort(part) : badRequest(`${part}: the multipart body could not be read (${error.message.slice(0, 100)})`)))
    bb.on('close', () => {
      void (writing ?? Promise.resolve()).then(() => {
        if (settled) return
        if (!file) return fail(badRequest(`${part}: is required (a file part named "${part}")`))
        if (file.size === 0) return fail(badRequest(`${part}: is empty (0 bytes)`))
        if (file.size > maxBytes) return fail(bodyTooLarge(part, maxBytes))
        settled = true
        resolve({ file, fields: Object.fromEntries(fields) })
      })
    })
    req.pipe(bb)
  })
}

const cutShort = (part: string) => badRequest(`${part}: the upload ended before its closing boundary (cut short); nothing was stored, send it again`)

/** The last path segment of a client's file name, without control characters, at most 200 characters. */
export function safeFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? ''
  // eslint-disable-next-line no-control-regex
  const clean = base.replace(/[\u0000-\u001f\u007f"]/g, '').trim().slice(0, 200)
  return clean || 'upload'
}
