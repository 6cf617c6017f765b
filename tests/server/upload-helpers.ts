import { randomBytes } from 'node:crypto'
import { existsSync, readdirSync, readFileSync } from 'node:fs'
import { type IncomingHttpHeaders, request } from 'node:http'
import { join, relative } from 'node:path'
import SQLite from 'better-sqlite3'
import { expect } from 'vitest'

// Helpers for the upload tests that run a server of their own: a chunked multipart upload of any
// size written with back-pressure, the server's resident memory, and the files in its uploads folder.

export interface ChunkedReply {
  status: number
  body: any
  headers: IncomingHttpHeaders
  /** Bytes of the request body written when the reply arrived. */
  sentBytes: number
  /** Whether the whole body had been written by then. */
  sentAll: boolean
}

export interface ChunkedUpload {
  fileName: string
  type: string
  /** Size of the file part, bytes. */
  fileBytes: number
  /** The file's first bytes (the rest is filler). */
  head?: Uint8Array | string
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
    const req = request(url, { method: 'POST', headers: { cookie, accept: 'application/json', 'content-type': `multipart/form-data; boundary=${boundary}` } })
    let replied = false
    let sent = 0
    let sentAll = false
    req.on('response', (res) => {
      replied = true
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
        resolve({ status: res.statusCode ?? 0, body, headers: res.headers, sentBytes: sentAtReply, sentAll: sentAllAtReply })
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

/** Resident memory of process `pid` now, bytes (VmRSS in /proc/<pid>/status). */
export function residentBytes(pid: number): number {
  const kb = /^VmRSS:\s+(\d+) kB$/m.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1]
  if (!kb) throw new Error(`no VmRSS for process ${pid}`)
  return Number(kb) * 1024
}

/** Samples the resident memory of `pid` every 10 ms until `stop()`, which returns the largest seen. */
export function watchResident(pid: number) {
  let most = residentBytes(pid)
  const timer = setInterval(() => {
    try {
      most = Math.max(most, residentBytes(pid))
    } catch {
      // the process has gone: the test fails on its reply
    }
  }, 10)
  return {
    stop() {
      clearInterval(timer)
      return most
    },
  }
}

/** Every file below `dir`, as paths relative to it (`.pending/<key>` for files still being written). */
export function filesUnder(dir: string): string[] {
  if (!existsSync(dir)) return []
  return (readdirSync(dir, { recursive: true, withFileTypes: true }) as import('node:fs').Dirent[])
    .filter((e) => e.isFile())
    .map((e) => relative(dir, join(e.parentPath, e.name)))
    .sort()
}

/** Storage keys of the attachments a user can still see (rows not deleted). */
export function liveAttachmentKeys(databasePath: string): string[] {
  const db = new SQLite(databasePath, { readonly: true, fileMustExist: true })
  try {
    return (db.prepare('select storage_key from attachments where deleted_at is null order by storage_key').all() as { storage_key: string }[]).map((r) => r.storage_key)
  } finally {
    db.close()
  }
}

/** The storage key (file name in the uploads folder) of attachment `id`. */
export function attachmentKey(databasePath: string, id: number): string {
  const db = new SQLite(databasePath, { readonly: true, fileMustExist: true })
  try {
    return (db.prepare('select storage_key from attachments where id = ?').get(id) as { storage_key: string }).storage_key
  } finally {
    db.close()
  }
}

/**
 * Waits (at most `waitMs`) until the uploads folder holds exactly one file per live attachment and
 * nothing else: no pending file, no orphan, no file of a deleted attachment.
 */
export async function expectNoStrayFiles(uploadsDir: string, databasePath: string, waitMs = 5000) {
  const deadline = Date.now() + waitMs
  for (;;) {
    const files = filesUnder(uploadsDir)
    const keys = liveAttachmentKeys(databasePath)
    if (JSON.stringify(files) === JSON.stringify(keys) || Date.now() > deadline) {
      expect(files).toEqual(keys)
      return
    }
    await new Promise((r) => setTimeout(r, 50))
  }
}

/** Waits (at most `waitMs`) for `check` to hold, then asserts it. */
export async function eventually(check: () => boolean, label: string, waitMs = 10_000) {
  const deadline = Date.now() + waitMs
  while (!check() && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50))
  expect(check(), label).toBe(true)
}
