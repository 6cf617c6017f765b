// Online backup and offline restore of Gillwatt's SQLite file (`npm run db:backup`, `npm run db:restore`).
// A backup goes through SQLite's backup API (better-sqlite3 `db.backup()`), so it is a consistent copy
// even while the server has the file open in WAL mode and is writing: committed rows still in the -wal
// file are included. Both commands write to a temporary name beside the final one and rename it into
// place only after `PRAGMA integrity_check` says ok, so a half-written copy never sits under the final name.
// A restore needs the server stopped (it refuses while any other connection has the file open) and keeps
// the file it replaces as `<target>.before-restore-<timestamp>`, so it never loses data.
import { closeSync, existsSync, fsyncSync, mkdirSync, openSync, renameSync, rmSync, statSync } from 'node:fs'
import { basename, dirname, join, resolve } from 'node:path'
import SQLite from 'better-sqlite3'

/** Tables every Gillwatt database has: Kysely's migration log and the first migration's users. */
const REQUIRED_TABLES = ['kysely_migration', 'users'] as const

/** What a finished backup or restore reports. */
export interface CopyReport {
  /** Absolute path of the file written. */
  path: string
  /** Pages copied by the backup API. */
  pages: number
  /** Page size of the copy, bytes. */
  pageSize: number
  /** Size of the written file, bytes. */
  bytes: number
  /** Newest migration recorded in the copy, or null when it has none. */
  migration: string | null
}

/** What a restore reports: the copy written plus where the replaced file (and any -wal/-shm) went. */
export interface RestoreReport extends CopyReport {
  /** The replaced database, kept beside the target; null when there was none. */
  keptAs: string | null
}

/** A backup or restore that cannot go ahead; the message says why and what to do. */
export class BackupError extends Error {
  override name = 'BackupError'
}

/** UTC time as `20260517T101112345Z`: sortable and safe in file names on every system. */
export function fileTimestamp(date = new Date()): string {
  return date.toISOString().replace(/[-:.]/g, '')
}

/** The default backup file for a database: `.data/backups/gillwatt-<UTC timestamp>.sqlite`. */
export function defaultBackupPath(date = new Date()): string {
  return join('.data', 'backups', `gillwatt-${fileTimestamp(date)}.sqlite`)
}

function requireFile(path: string, what: string) {
  if (!existsSync(path)) throw new BackupError(`${what} ${path} does not exist`)
  if (!statSync(path).isFile()) throw new BackupError(`${what} ${path} is not a file`)
}

/** The parent folder, created when missing; a clear error when something else sits there. */
function ensureFolder(file: string) {
  const dir = dirname(file)
  if (existsSync(dir) && !statSync(dir).isDirectory()) throw new BackupError(`cannot write ${file}: ${dir} is not a folder`)
  mkdirSync(dir, { recursive: true })
}

/** Flushes a file (or folder entry) to disk, so a rename that follows survives a power cut. */
function fsyncPath(path: string) {
  const fd = openSync(path, 'r')
  try {
    fsyncSync(fd)
  } finally {
    closeSync(fd)
  }
}

/** A name beside `path` that does not exist yet (`path`, else `path-2`, `path-3`…). */
function freeName(path: string): string {
  if (!existsSync(path)) return path
  for (let n = 2; ; n++) if (!existsSync(`${path}-${n}`)) return `${path}-${n}`
}

const sqliteMessage = (error: unknown) => (error instanceof Error ? error.message : String(error))

/**
 * Checks `path` is an intact Gillwatt database: SQLite, integrity_check ok and the tables every Gillwatt
 * database has. Returns its newest migration; throws BackupError naming the problem. Read-only by default
 * (a backup handed in is never changed); `readonly: false` suits the live database, where a read-only
 * connection to a WAL file would leave empty -wal/-shm files behind when no server has it open.
 */
export function checkGillwattDatabase(path: string, what = 'backup', { readonly = true } = {}): string | null {
  requireFile(path, what)
  let db: SQLite.Database | undefined
  try {
    db = new SQLite(path, { readonly, fileMustExist: true })
    const integrity = db.pragma('integrity_check', { simple: true })
    if (integrity !== 'ok') throw new BackupError(`${what} ${path} is damaged: integrity_check says "${String(integrity)}"`)
    const tables = new Set((db.prepare("select name from sqlite_master where type = 'table'").all() as { name: string }[]).map((r) => r.name))
    const missing = REQUIRED_TABLES.filter((t) => !tables.has(t))
    if (missing.length) throw new BackupError(`${what} ${path} is not a Gillwatt database (no ${missing.join(' or ')} table)`)
    const last = db.prepare('select name from kysely_migration order by name desc limit 1').get() as { name: string } | undefined
    return last?.name ?? null
  } catch (error) {
    if (error instanceof BackupError) throw error
    throw new BackupError(`${what} ${path} is not a readable SQLite database: ${sqliteMessage(error)}`)
  } finally {
    db?.close()
  }
}

/**
 * Copies the open database `source` into the new file `tmp` with the backup API, turns the copy into a
 * single self-contained file (rollback journal, no -wal), checks it and returns its figures.
 */
async function copyInto(source: SQLite.Database, tmp: string): Promise<Omit<CopyReport, 'path' | 'bytes' | 'migration'>> {
  // After the first step, copy everything left in one step: SQLite restarts a backup whose source another
  // process changed between steps, so small steps could restart for ever under a busy server. In WAL mode
  // that one step only holds a read snapshot, so the server's writers carry on meanwhile.
  const { totalPages } = await source.backup(tmp, { progress: () => 0x7fffffff })
  const copy = new SQLite(tmp, { fileMustExist: true })
  try {
    copy.pragma('journal_mode = DELETE')
    const integrity = copy.pragma('integrity_check', { simple: true })
    if (integrity !== 'ok') throw new BackupError(`the copy failed its integrity check: "${String(integrity)}"`)
    return { pages: totalPages, pageSize: Number(copy.pragma('page_size', { simple: true })) }
  } finally {
    copy.close()
  }
}

/** Removes a temporary copy and the journal files SQLite may have left beside it. */
function removeTemp(tmp: string) {
  for (const p of [tmp, `${tmp}-journal`, `${tmp}-wal`, `${tmp}-shm`]) rmSync(p, { force: true })
}

/**
 * Online backup of `source` (a Gillwatt database, which may be open and written by the server) to the
 * new file `target`. Refuses to overwrite an existing file. The copy is written as `<target>.tmp-<pid>`,
 * checked with integrity_check, flushed to disk and only then renamed to `target`.
 */
export async function backupDatabase(source: string, target: string): Promise<CopyReport> {
  const from = resolve(source)
  const to = resolve(target)
  checkGillwattDatabase(from, 'database', { readonly: false })
  if (from === to) throw new BackupError(`backup file ${to} is the database itself; choose another name`)
  if (existsSync(to)) throw new BackupError(`backup file ${to} already exists; choose another name (backups are never overwritten)`)
  ensureFolder(to)
  const tmp = join(dirname(to), `.${basename(to)}.tmp-${process.pid}`)
  removeTemp(tmp)
  // Read-write only so that, with no server running, closing it folds back and removes the -wal it opens;
  // it writes nothing itself.
  const db = new SQLite(from, { fileMustExist: true })
  try {
    const figures = await copyInto(db, tmp)
    fsyncPath(tmp)
    renameSync(tmp, to)
    fsyncPath(dirname(to))
    return { path: to, ...figures, bytes: statSync(to).size, migration: checkGillwattDatabase(to) }
  } catch (error) {
    removeTemp(tmp)
    if (error instanceof BackupError) throw error
    throw new BackupError(`backup of ${from} to ${to} failed: ${sqliteMessage(error)}`)
  } finally {
    db.close()
  }
}

/**
 * Folds the target's -wal into the file and takes it out of WAL mode, which SQLite allows only when no
 * other connection has it open: a running server makes this fail, and the restore stops. Returns false
 * when the target is not a readable SQLite file (its -wal/-shm, if any, are then kept beside it).
 */
function quiesceTarget(target: string): boolean {
  let db: SQLite.Database | undefined
  try {
    db = new SQLite(target, { fileMustExist: true, timeout: 0 })
    db.pragma('wal_checkpoint(TRUNCATE)')
    const mode = db.pragma('journal_mode = DELETE', { simple: true })
    if (mode !== 'delete') throw Object.assign(new Error(`journal mode stayed ${String(mode)}`), { code: 'SQLITE_BUSY' })
    return true
  } catch (error) {
    const code = (error as { code?: string }).code ?? ''
    if (code.startsWith('SQLITE_BUSY') || code.startsWith('SQLITE_LOCKED')) {
      throw new BackupError(`database ${target} is in use (is the Gillwatt server running?); stop the server, then restore`)
    }
    return false
  } finally {
    db?.close()
  }
}

/**
 * Restores `backup` (checked first: an intact Gillwatt database) over the database `target`. The server
 * must be stopped; a restore refuses while any other connection has `target` open. The replaced file is
 * checkpointed and kept as `<target>.before-restore-<timestamp>`; stale -wal/-shm files of an unreadable
 * target move with it under the same name, so nothing is deleted. The copy is written to a temporary name,
 * checked and renamed into place.
 */
export async function restoreDatabase(backup: string, target: string, now = new Date()): Promise<RestoreReport> {
  const from = resolve(backup)
  const to = resolve(target)
  if (from === to) throw new BackupError(`backup ${from} is the database itself; nothing to restore`)
  checkGillwattDatabase(from, 'backup')
  ensureFolder(to)
  if (existsSync(to) && !statSync(to).isFile()) throw new BackupError(`database ${to} is not a file`)

  const tmp = join(dirname(to), `.${basename(to)}.restore-${process.pid}`)
  removeTemp(tmp)
  const source = new SQLite(from, { readonly: true, fileMustExist: true })
  let figures: Awaited<ReturnType<typeof copyInto>>
  try {
    figures = await copyInto(source, tmp)
    fsyncPath(tmp)
  } catch (error) {
    removeTemp(tmp)
    throw error instanceof BackupError ? error : new BackupError(`reading backup ${from} failed: ${sqliteMessage(error)}`)
  } finally {
    source.close()
  }

  let keptAs: string | null = null
  try {
    if (existsSync(to)) {
      quiesceTarget(to)
      keptAs = freeName(`${to}.before-restore-${fileTimestamp(now)}`)
      renameSync(to, keptAs)
      for (const side of ['-wal', '-shm', '-journal']) if (existsSync(to + side)) renameSync(to + side, keptAs + side)
    }
    renameSync(tmp, to)
    fsyncPath(dirname(to))
  } catch (error) {
    removeTemp(tmp)
    // Put the replaced file back when it was moved but the copy did not take its place.
    if (keptAs && !existsSync(to)) {
      renameSync(keptAs, to)
      for (const side of ['-wal', '-shm', '-journal']) if (existsSync(keptAs + side)) renameSync(keptAs + side, to + side)
    }
    throw error instanceof BackupError ? error : new BackupError(`restore to ${to} failed: ${sqliteMessage(error)}`)
  }
  return { path: to, ...figures, bytes: statSync(to).size, migration: checkGillwattDatabase(to, 'restored database'), keptAs }
}
