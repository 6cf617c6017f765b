import type { ChildProcess } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import SQLite from 'better-sqlite3'
import { afterAll, describe, expect, it } from 'vitest'
import { backupDatabase, checkGillwattDatabase, restoreDatabase } from '../../db/backup'
import { LATEST_MIGRATION } from '../../db/migrations'
import { startBuiltServer } from '../../scripts/builtServer.mjs'
import { Client, GOOD_PASSWORD, uniqueEmail } from './client'
import { siteBody } from './sites-helpers'

// A server killed with SIGKILL in the middle of writes restarts on the same file with an intact database
// that holds every write it acknowledged. This file runs its own server processes (not the shared one).

const dir = mkdtempSync(join(tmpdir(), 'gillwatt-killed-'))
const databasePath = join(dir, 'gillwatt.sqlite')
const running = new Set<ChildProcess>()

afterAll(async () => {
  for (const proc of running) await stop(proc, 'SIGKILL')
  rmSync(dir, { recursive: true, force: true })
})

/** Starts the built server on `databasePath` (the same file every time) and waits for /api/health. */
async function start() {
  // Many uploads in a minute by one person: the per-person upload limit gets room here.
  const server = await startBuiltServer({ dir, databasePath, sessionPassword: 'killed-server-test-session-password-0123456789', onSpawn: (proc) => running.add(proc), env: { NUXT_RATE_LIMITS: JSON.stringify({ uploads: { limit: 100_000 } }) } })
  const health = await (await fetch(`${server.baseURL}/api/health`)).json()
  return { proc: server.child, baseURL: server.baseURL, health }
}

/** Sends `signal` and resolves once the process has exited. */
async function stop(proc: ChildProcess, signal: NodeJS.Signals) {
  if (proc.exitCode === null && proc.signalCode === null) {
    const exited = new Promise((r) => proc.once('exit', r))
    proc.kill(signal)
    await exited
  }
  running.delete(proc)
}

/** A CSV of `days` consecutive days from 2001-01-01, every flow `flow`. */
function flatCsv(days: number, flow: number) {
  const lines = ['date,flow']
  for (let i = 0; i < days; i++) lines.push(`${new Date(Date.UTC(2001, 0, 1) + i * 86_400_000).toISOString().slice(0, 10)},${flow}`)
  return `${lines.join('\n')}\n`
}

/** Upload k: its file name, length and flow, so a stored record tells which upload it came from, whole or not. */
const uploadK = (k: number) => ({ name: `record-${k}.csv`, days: 3000 + 11 * k, flow: k + 1 })

/** Checks a flow-record reply is exactly one upload, whole; returns which. */
function wholeUpload(body: { record: { fileName: string; days: number }; days: { flow: number }[] }) {
  const k = Number(/^record-(\d+)\.csv$/.exec(body.record.fileName)?.[1])
  expect(Number.isInteger(k), body.record.fileName).toBe(true)
  const u = uploadK(k)
  expect(body.record.days).toBe(u.days)
  expect(body.days).toHaveLength(u.days)
  expect(new Set(body.days.map((d) => d.flow))).toEqual(new Set([u.flow]))
  return k
}

/** integrity_check and foreign_key_check of the file, read-only (WAL lets it read beside a running server). */
function integrity(path: string) {
  const db = new SQLite(path, { readonly: true, fileMustExist: true })
  try {
    return { integrity: db.pragma('integrity_check', { simple: true }), foreignKeys: db.pragma('foreign_key_check') }
  } finally {
    db.close()
  }
}

describe('a server killed mid-write', () => {
  it('restarts on the same file with every acknowledged write present and nothing half-written', { timeout: 180_000 }, async () => {
    const first = await start()
    const email = uniqueEmail('killed')
    const client = new Client(first.baseURL)
    const signup = await client.post('/api/auth/signup', { name: 'Killed server', email, password: GOOD_PASSWORD, organisationName: 'Tarn & Beck Renewables' })
    expect(signup.status).toBe(202)
    const login = await client.post('/api/auth/login', { email, password: GOOD_PASSWORD })
    expect(login.status).toBe(200)
    const orgId = login.body.memberships[0].orgId as number
    const created = await client.post(`/api/orgs/${orgId}/sites`, siteBody({ name: 'Hollin weir' }))
    expect(created.status).toBe(201)
    const site = created.body as { id: number; version: number }
    const upload = (k: number) => client.upload(`/api/sites/${site.id}/flow-record`, { file: { name: uploadK(k).name, type: 'text/csv', data: flatCsv(uploadK(k).days, uploadK(k).flow) } })
    expect((await upload(0)).status).toBe(201)

    // Three writers run at once until the server dies under them: one patches the site's notes (one
    // version step each), one creates sites, one replaces the flow record with larger and larger files.
    const acked = { patch: -1, patchVersion: site.version, sites: [] as { id: number; name: string }[], upload: 0 }
    let killed = false
    let backupAt: { patch: number; sites: number; upload: number } | undefined
    let backup: Promise<unknown> | undefined
    const backupPath = join(dir, 'backups', 'during-writes.sqlite')
    let resolveKillPoint!: () => void
    const killPoint = new Promise<void>((r) => (resolveKillPoint = r))
    const progress = () => {
      // An online backup taken while all three writers are busy.
      if (!backup && acked.patch >= 10) {
        backupAt = { patch: acked.patch, sites: acked.sites.length, upload: acked.upload }
        backup = backupDatabase(databasePath, backupPath)
      }
      if (acked.patch >= 40 && acked.sites.length >= 15 && acked.upload >= 3) resolveKillPoint()
    }
    /** Runs `step(i)` for i = 0, 1, … until a request fails because the server has gone. */
    const writer = async (step: (i: number) => Promise<void>) => {
      for (let i = 0; !killed; i++) {
        try {
          await step(i)
        } catch (error) {
          if (killed) return
          throw error
        }
        progress()
      }
    }
    const writers = Promise.all([
      writer(async (i) => {
        const res = await client.patch(`/api/sites/${site.id}`, { version: site.version + i, notes: `note ${i}` })
        expect(res.status, JSON.stringify(res.body)).toBe(200)
        acked.patch = i
        acked.patchVersion = res.body.version
      }),
      writer(async (i) => {
        const res = await client.post(`/api/orgs/${orgId}/sites`, siteBody({ name: `Kill site ${i}` }))
        expect(res.status, JSON.stringify(res.body)).toBe(201)
        acked.sites.push({ id: res.body.id, name: res.body.name })
      }),
      writer(async (i) => {
        const res = await upload(i + 1)
        expect(res.status, JSON.stringify(res.body)).toBe(201)
        acked.upload = i + 1
      }),
    ])
    await Promise.race([killPoint, writers])
    expect(backup, 'the backup started while the writers ran').toBeDefined()
    await backup
    killed = true
    await stop(first.proc, 'SIGKILL')
    expect(first.proc.signalCode).toBe('SIGKILL')
    await writers
    const ackedAtKill = structuredClone(acked)

    // The backup taken under load is a whole, intact Gillwatt database holding what was acknowledged before it began.
    expect(checkGillwattDatabase(backupPath)).toBe(LATEST_MIGRATION)
    const copy = new SQLite(backupPath, { readonly: true, fileMustExist: true })
    const copySite = copy.prepare('select version, notes from sites where id = ?').get(site.id) as { version: number; notes: string }
    expect(copySite.version - site.version - 1).toBeGreaterThanOrEqual(backupAt!.patch)
    expect(copySite.notes).toBe(`note ${copySite.version - site.version - 1}`)
    const copyNames = new Set((copy.prepare('select name from sites').all() as { name: string }[]).map((r) => r.name))
    for (const s of ackedAtKill.sites.slice(0, backupAt!.sites)) expect(copyNames.has(s.name)).toBe(true)
    const copyRecord = copy.prepare('select file_name, day_count from flow_records where site_id = ?').get(site.id) as { file_name: string; day_count: number }
    const copyK = Number(/^record-(\d+)\.csv$/.exec(copyRecord.file_name)?.[1])
    expect(copyK).toBeGreaterThanOrEqual(backupAt!.upload)
    expect(copyRecord.day_count).toBe(uploadK(copyK).days)
    expect((copy.prepare('select count(*) as n from flow_days where site_id = ?').get(site.id) as { n: number }).n).toBe(uploadK(copyK).days)
    copy.close()

    // Restart on the same file: healthy, migrated, and everything acknowledged is there.
    const second = await start()
    expect(second.health).toMatchObject({ ok: true, database: 'ok', migration: LATEST_MIGRATION })
    const again = new Client(second.baseURL)
    expect((await again.post('/api/auth/login', { email, password: GOOD_PASSWORD })).status).toBe(200)

    const stored = await again.get(`/api/sites/${site.id}`)
    expect(stored.status).toBe(200)
    // Patch i sets "note i" and version site.version + 1 + i: the stored pair is one whole patch, the
    // last acknowledged one or the one in flight when the server died.
    const storedPatch = stored.body.version - site.version - 1
    expect(stored.body.notes).toBe(`note ${storedPatch}`)
    expect(storedPatch).toBeGreaterThanOrEqual(ackedAtKill.patch)
    expect(storedPatch).toBeLessThanOrEqual(ackedAtKill.patch + 1)

    for (const s of ackedAtKill.sites) {
      const got = await again.get(`/api/sites/${s.id}`)
      expect(got.status).toBe(200)
      expect(got.body.name).toBe(s.name)
    }

    const record = await again.get(`/api/sites/${site.id}/flow-record`)
    expect(record.status).toBe(200)
    const k = wholeUpload(record.body)
    expect(k).toBeGreaterThanOrEqual(ackedAtKill.upload)
    expect(k).toBeLessThanOrEqual(ackedAtKill.upload + 1)

    // WAL lets a reader check the file while the restarted server has it open.
    expect(integrity(databasePath)).toEqual({ integrity: 'ok', foreignKeys: [] })
    // …and a restore refuses while that server runs, leaving its database alone.
    await expect(restoreDatabase(backupPath, databasePath)).rejects.toThrow(/is in use \(is the Gillwatt server running\?\)/)
    expect((await again.get(`/api/sites/${site.id}`)).body.version).toBe(stored.body.version)

    // The restarted server takes new writes, and after it stops the file is still intact.
    const more = await again.patch(`/api/sites/${site.id}`, { version: stored.body.version, notes: 'after the restart' })
    expect(more.status).toBe(200)
    await stop(second.proc, 'SIGTERM')
    expect(integrity(databasePath)).toEqual({ integrity: 'ok', foreignKeys: [] })
    const db = new SQLite(databasePath, { readonly: true, fileMustExist: true })
    expect(db.prepare('select notes from sites where id = ?').get(site.id)).toEqual({ notes: 'after the restart' })
    db.close()
  })
})
