import { spawnSync } from 'node:child_process'
import { copyFileSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import SQLite from 'better-sqlite3'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { backupDatabase, checkGillwattDatabase, defaultBackupPath, restoreDatabase } from '../../../db/backup'
import { migrateToLatest, openDatabase } from '../../../db/connection'
import { LATEST_MIGRATION } from '../../../db/migrations'

let dir: string
let open: SQLite.Database[] = []

beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'gillwatt-backup-'))
})
afterEach(() => {
  for (const db of open) if (db.open) db.close()
  open = []
  rmSync(dir, { recursive: true, force: true })
})

/** A migrated Gillwatt database at `path`, closed again. */
async function makeDatabase(path: string) {
  const db = openDatabase(path)
  await migrateToLatest(db)
  await db.destroy()
}

/** A raw writer connection like the server's (WAL), with automatic checkpoints off so rows stay in the -wal file. */
function writer(path: string) {
  const db = new SQLite(path)
  db.pragma('journal_mode = WAL')
  db.pragma('wal_autocheckpoint = 0')
  open.push(db)
  return db
}

const addUser = (db: SQLite.Database, name: string) =>
  db.prepare("insert into users (email, name, password_hash) values (?, ?, 'x')").run(`${name.toLowerCase()}@backup.example`, name)

/** The user names in a database file, read on a fresh connection (closing it folds back any -wal it opened). */
function userNames(path: string): string[] {
  const db = new SQLite(path, { fileMustExist: true })
  try {
    return (db.prepare('select name from users order by name').all() as { name: string }[]).map((r) => r.name)
  } finally {
    db.close()
  }
}

describe('backupDatabase', () => {
  it('copies a live database with an open writer, including rows still only in the -wal file', async () => {
    const live = join(dir, 'live.sqlite')
    await makeDatabase(live)
    const w = writer(live)
    for (const name of ['Ada', 'Bryn', 'Cai']) addUser(w, name)
    // The rows are committed but not checkpointed: the main file alone does not hold them.
    expect(statSync(`${live}-wal`).size).toBeGreaterThan(0)
    copyFileSync(live, join(dir, 'main-only.sqlite'))
    expect(userNames(join(dir, 'main-only.sqlite'))).toEqual([])

    const target = join(dir, 'copies', 'one.sqlite')
    const report = await backupDatabase(live, target)
    expect(report).toMatchObject({ path: target, migration: LATEST_MIGRATION })
    expect(report.pages).toBeGreaterThan(1)
    expect(report.bytes).toBe(report.pages * report.pageSize)
    expect(report.bytes).toBe(statSync(target).size)
    // A self-contained file: no -wal beside it, and no temporary file left in the folder.
    expect(readdirSync(join(dir, 'copies'))).toEqual(['one.sqlite'])
    expect(userNames(target)).toEqual(['Ada', 'Bryn', 'Cai'])
    expect(checkGillwattDatabase(target)).toBe(LATEST_MIGRATION)

    // The writer carries on unharmed, and a later backup sees its later rows.
    addUser(w, 'Dilys')
    await backupDatabase(live, join(dir, 'copies', 'two.sqlite'))
    expect(userNames(join(dir, 'copies', 'two.sqlite'))).toEqual(['Ada', 'Bryn', 'Cai', 'Dilys'])
  })

  it('refuses a missing database, an existing backup file and a folder in the way, with clear messages', async () => {
    const live = join(dir, 'live.sqlite')
    await expect(backupDatabase(live, join(dir, 'b.sqlite'))).rejects.toThrow(`database ${live} does not exist`)
    expect(existsSync(live)).toBe(false)
    await makeDatabase(live)
    writeFileSync(join(dir, 'taken.sqlite'), 'keep me')
    await expect(backupDatabase(live, join(dir, 'taken.sqlite'))).rejects.toThrow(/already exists; choose another name/)
    expect(readFileSync(join(dir, 'taken.sqlite'), 'utf8')).toBe('keep me')
    writeFileSync(join(dir, 'file'), '')
    await expect(backupDatabase(live, join(dir, 'file', 'b.sqlite'))).rejects.toThrow(/is not a folder/)
    await expect(backupDatabase(live, live)).rejects.toThrow(/is the database itself/)
  })

  it('names default backups by UTC time under .data/backups', () => {
    expect(defaultBackupPath(new Date(Date.UTC(2026, 4, 17, 10, 11, 12, 345)))).toBe(join('.data', 'backups', 'gillwatt-20260517T101112345Z.sqlite'))
  })
})

describe('restoreDatabase', () => {
  it('round-trips: puts the backup in place and keeps the replaced file (with its -wal rows) beside it', async () => {
    const live = join(dir, 'live.sqlite')
    await makeDatabase(live)
    const w = writer(live)
    addUser(w, 'Before')
    const copy = join(dir, 'copy.sqlite')
    await backupDatabase(live, copy)
    addUser(w, 'After')

    // While a connection holds the database open, as the server does, a restore refuses.
    await expect(restoreDatabase(copy, live)).rejects.toThrow(/is in use \(is the Gillwatt server running\?\); stop the server/)
    expect(userNames(live)).toEqual(['After', 'Before'])
    expect(readdirSync(dir).filter((f) => f.includes('before-restore') || f.includes('.restore-'))).toEqual([])

    w.close()
    const when = new Date(Date.UTC(2026, 0, 2, 3, 4, 5, 6))
    const report = await restoreDatabase(copy, live, when)
    const kept = `${live}.before-restore-20260102T030405006Z`
    expect(report).toMatchObject({ path: live, keptAs: kept, migration: LATEST_MIGRATION })
    expect(userNames(live)).toEqual(['Before'])
    expect(userNames(kept)).toEqual(['After', 'Before'])
    expect(existsSync(`${live}-wal`)).toBe(false)
    // The server's way of opening it works and sees the restored data.
    const db = openDatabase(live)
    expect(await db.selectFrom('users').select('name').execute()).toEqual([{ name: 'Before' }])
    await db.destroy()

    // A second restore in the same millisecond keeps the first kept file too.
    const again = await restoreDatabase(copy, live, when)
    expect(again.keptAs).toBe(`${kept}-2`)
    expect(userNames(kept)).toEqual(['After', 'Before'])
  })

  it('restores into an empty place when there is no database yet', async () => {
    const live = join(dir, 'live.sqlite')
    await makeDatabase(live)
    const copy = join(dir, 'copy.sqlite')
    await backupDatabase(live, copy)
    const fresh = join(dir, 'new', 'gillwatt.sqlite')
    const report = await restoreDatabase(copy, fresh)
    expect(report.keptAs).toBeNull()
    expect(checkGillwattDatabase(fresh)).toBe(LATEST_MIGRATION)
  })

  it('refuses a non-SQLite, truncated, foreign or missing backup with a clear message and leaves the target untouched', async () => {
    const live = join(dir, 'live.sqlite')
    await makeDatabase(live)
    const w = writer(live)
    addUser(w, 'Stays')
    w.close()
    const copy = join(dir, 'copy.sqlite')
    await backupDatabase(live, copy)
    const before = readFileSync(live)

    const text = join(dir, 'notes.sqlite')
    writeFileSync(text, 'date,flow\n2020-01-01,3\n'.repeat(200))
    const truncated = join(dir, 'truncated.sqlite')
    writeFileSync(truncated, readFileSync(copy).subarray(0, Math.floor(statSync(copy).size / 2)))
    const foreign = join(dir, 'foreign.sqlite')
    const other = new SQLite(foreign)
    other.exec('create table notes (body text)')
    other.close()

    await expect(restoreDatabase(text, live)).rejects.toThrow(`backup ${text} is not a readable SQLite database`)
    await expect(restoreDatabase(truncated, live)).rejects.toThrow(new RegExp(`backup ${truncated} is (not a readable SQLite database|damaged)`))
    await expect(restoreDatabase(foreign, live)).rejects.toThrow(`backup ${foreign} is not a Gillwatt database (no kysely_migration or users table)`)
    await expect(restoreDatabase(join(dir, 'nope.sqlite'), live)).rejects.toThrow(`backup ${join(dir, 'nope.sqlite')} does not exist`)
    await expect(restoreDatabase(dir, live)).rejects.toThrow(`backup ${dir} is not a file`)

    expect(readFileSync(live).equals(before)).toBe(true)
    expect(userNames(live)).toEqual(['Stays'])
    expect(readdirSync(dir).sort()).toEqual(['copy.sqlite', 'foreign.sqlite', 'live.sqlite', 'notes.sqlite', 'truncated.sqlite'])
  })
})

describe('npm run db:backup / db:restore (db/cli.ts)', () => {
  const cli = (args: string[], databasePath: string) =>
    spawnSync(process.execPath, ['--import', 'tsx', 'db/cli.ts', ...args], {
      cwd: join(import.meta.dirname, '../../..'),
      env: { ...process.env, DATABASE_PATH: databasePath },
      encoding: 'utf8',
    })

  it('backs up DATABASE_PATH to a named file and restores it, keeping the replaced file', { timeout: 120_000 }, async () => {
    const live = join(dir, 'data', 'gillwatt.sqlite')
    await makeDatabase(live)
    const w = writer(live)
    addUser(w, 'Original')
    const file = join(dir, 'saved', 'b.sqlite')
    // The writer stays open during the backup, as a running server would.
    const backup = cli(['backup', file], live)
    expect(backup.status, backup.stderr).toBe(0)
    expect(backup.stdout).toMatch(new RegExp(`Backed up .* to ${file}: \\d+ pages of \\d+ bytes, [\\d.]+ MB, integrity ok, migration ${LATEST_MIGRATION}\\.`))
    expect(userNames(file)).toEqual(['Original'])

    addUser(w, 'Later')
    const busy = cli(['restore', file], live)
    expect(busy.status).toBe(1)
    expect(busy.stderr).toMatch(/is in use \(is the Gillwatt server running\?\); stop the server, then restore/)
    w.close()

    const restore = cli(['restore', file], live)
    expect(restore.status, restore.stderr).toBe(0)
    expect(restore.stdout).toMatch(/Restored .* integrity ok/)
    const kept = readdirSync(join(dir, 'data')).filter((f) => f.startsWith('gillwatt.sqlite.before-restore-'))
    expect(kept).toHaveLength(1)
    expect(restore.stdout).toContain(`The replaced database is kept as ${join(dir, 'data', kept[0]!)}.`)
    expect(userNames(live)).toEqual(['Original'])
    expect(userNames(join(dir, 'data', kept[0]!))).toEqual(['Later', 'Original'])

    const missing = cli(['restore'], live)
    expect(missing.status).toBe(1)
    expect(missing.stderr).toMatch(/restore: name the backup file/)
    const absent = cli(['backup', join(dir, 'x.sqlite')], join(dir, 'absent.sqlite'))
    expect(absent.status).toBe(1)
    expect(absent.stderr).toContain(`database ${join(dir, 'absent.sqlite')} does not exist`)
    expect(existsSync(join(dir, 'absent.sqlite'))).toBe(false)
  })
})
