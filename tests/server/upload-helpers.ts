import { existsSync, readdirSync, readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import SQLite from 'better-sqlite3'
import { expect } from 'vitest'

// Helpers for the upload tests that run a server of their own: the server's resident memory and the
// files in its uploads folder. The chunked upload itself is scripts/lib/chunkedUpload.ts, which the
// upload benchmark sends too.

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
