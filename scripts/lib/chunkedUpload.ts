import { randomBytes } from 'node:crypto'
import { type IncomingHttpHeaders, request } from 'node:http'
import { performance } from 'node:perf_hooks'

// A multipart upload of any size sent chunked (no Content-Length) and written with back-pressure,
// for the upload tests and the upload benchmark: both send bodies far over a route's limit and watch
// what the server does with them. Plain Node, no test framework.

/** The reply to a chunked upload, with how much of the body had been written when it came. */
export interface ChunkedReply {
  status: number
  /** The reply parsed as JSON, or its text when it is not JSON. */
  body: any
  headers: IncomingHttpHeaders
  /** Milliseconds from the start of the request to the reply. */
  ms: number
  /** Bytes of the request body written when the reply arrived. */
  sentBytes: number
  /** Whether the whole body had been written by then. */
  sentAll: boolean
}

/** What to send: one file part named "file". */
export interface ChunkedUpload {
  fileName: string
  type: string
  /** Size of the file part, bytes. */
  fileBytes: number
  /** The file's first bytes (the rest is filler). */
  head?: Uint8Array | string
  /** The filler byte (default `a`). */
  fill?: number
}

/**
 * POSTs a multipart/form-data body with `Transfer-Encoding: chunked` (no Content-Length): one file part
 * named "file" of `fileBytes` bytes, written 64 KiB at a time as the socket takes it, and no more once
 * the reply has arrived. Resolves with the reply and how much of the body had been written by then.
 */
export function chunkedUpload(url: string, cookie: string, upload: ChunkedUpload): Promise<ChunkedReply> {
  const boundary = `gillwatt-chunked-${randomBytes(8).toString('hex')}`
  return new Promise((resolve, reject) => {
    const started = performance.now()
    const req = request(url, { method: 'POST', headers: { cookie, accept: 'application/json', 'content-type': `multipart/form-data; boundary=${boundary}` } })
    let replied = false
    let sent = 0
    let sentAll = false
    req.on('response', (res) => {
      replied = true
      const ms = performance.now() - started
      const sentAtReply = sent
      const sentAllAtReply = sentAll
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => {
        const text = Buffer.concat(chunks).toString('utf8')
        let body: unknown = text
        try {
          body = JSON.parse(text)
        } catch {
          // not JSON: keep the text
        }
        resolve({ status: res.statusCode ?? 0, body, headers: res.headers, ms, sentBytes: sentAtReply, sentAll: sentAllAtReply })
        req.destroy()
      })
    })
    req.on('error', (error) => {
      if (!replied) reject(error)
    })
    const write = (chunk: Buffer) =>
      new Promise<void>((done) => {
        sent += chunk.length
        if (req.write(chunk)) done()
        else {
          const go = () => {
            req.off('drain', go)
            req.off('close', go)
            done()
          }
          req.once('drain', go)
          req.once('close', go)
        }
      })
    void (async () => {
      const head = Buffer.from(upload.head ?? '')
      await write(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${upload.fileName}"\r\nContent-Type: ${upload.type}\r\n\r\n`))
      await write(head)
      const filler = Buffer.alloc(64 * 1024, upload.fill ?? 0x61)
      for (let left = upload.fileBytes - head.length; left > 0 && !replied && !req.destroyed; left -= filler.length) {
        await write(left >= filler.length ? filler : filler.subarray(0, left))
      }
      if (replied || req.destroyed) return
      await write(Buffer.from(`\r\n--${boundary}--\r\n`))
      sentAll = true
      req.end()
    })()
  })
}
