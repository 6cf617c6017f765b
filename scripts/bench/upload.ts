// Flow record upload end to end: a 36,525-day CSV (the engine benchmark's invented century, written
// `date,flow`, gaps blank) POSTed as multipart to /api/sites/[id]/flow-record on the built server in
// replace mode, against a bare baseline in this process: papaparse's parse of the same text plus one
// transaction inserting the same rows into the real flow_days table (the migrations, run on a fresh
// temporary SQLite file with the server's pragmas) through one better-sqlite3 prepared statement.
// Then a hostile one: 150 MB sent chunked (no Content-Length) against the 10 MB limit, timed to its 413,
// with the server's resident memory watched all along.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { performance } from 'node:perf_hooks'
import SQLite from 'better-sqlite3'
import Papa from 'papaparse'
import { migrateToLatest, openDatabase } from '../../db/connection'
import { parseFlowCsv } from '../../server/domain/flowCsv'
import { chunkedUpload } from '../lib/chunkedUpload'
import type { FlowUploadResult } from '../../shared/schemas/flowRecord'
import { century } from './engine'
import { type BenchFigure, median, timeRuns } from './harness'
import { signUpSession, startBenchServer } from './server'

const RUNS = 5
const MAX_RATIO = 2
const MB = 1024 * 1024
const HOSTILE_BYTES = 150 * MB
const MAX_GROWTH = 100 * MB

/** Resident memory of process `pid`, bytes (VmRSS). */
function residentBytes(pid: number): number {
  return Number(/^VmRSS:\s+(\d+) kB$/m.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1] ?? NaN) * 1024
}

/** The century as CSV text with a header row, one line a day. */
export function centuryCsv(): { text: string; days: number } {
  const days = century()
  const lines = ['date,flow', ...days.map((d) => `${d.date},${d.flow === null ? '' : d.flow.toFixed(3)}`)]
  return { text: lines.join('\n') + '\n', days: days.length }
}

/** A site body for POST /api/orgs/[orgId]/sites (invented). */
const siteBody = {
  name: 'Bench upload weir (invented)',
  riverName: 'Bench Water',
  location: { lat: 54.4, lng: -2.9 },
  altitude_m: 120,
  weir: { grossHead_m: 2.1, crestWidth_m: 14, shape: 'sharp-crested-vertical-face', waterQuality: 'clean' },
  months: Array.from({ length: 12 }, (_, i) => ({ waterTemp_C: 6 + i, upstreamOxygen: { value: 10 - i / 4, unit: 'mg/L' } })),
}

/** Milliseconds of the bare parse + one-transaction insert, `runs` times after one warm-up. */
async function baseline(text: string, expectedDays: number, runs: number): Promise<number[]> {
  const dir = mkdtempSync(join(tmpdir(), 'gillwatt-bench-upload-'))
  const path = join(dir, 'baseline.sqlite')
  try {
    const db = openDatabase(path)
    await migrateToLatest(db)
    const org = await db.insertInto('organisations').values({ name: 'Baseline organisation (invented)' }).returning('id').executeTakeFirstOrThrow()
    const site = await db
      .insertInto('sites')
      .values({ org_id: org.id, name: 'Baseline weir', river_name: 'Bench Water', lat: 54.4, lng: -2.9, altitude_m: 120, gross_head_m: 2.1, target_oxygen_mgl: 6, weir: '{}', head_table: '[]', reserved_flow: '{}', months: '[]', fdc_points: '[]' })
      .returning('id')
      .executeTakeFirstOrThrow()
    await db.destroy()

    // The same pragmas as db/connection.ts openDatabase (WAL, foreign keys, synchronous NORMAL).
    const sqlite = new SQLite(path)
    sqlite.pragma('journal_mode = WAL')
    sqlite.pragma('foreign_keys = ON')
    sqlite.pragma('busy_timeout = 5000')
    sqlite.pragma('synchronous = NORMAL')
    const insert = sqlite.prepare('insert into flow_days (site_id, day, flow) values (?, ?, ?)')
    const insertAll = sqlite.transaction((rows: string[][]) => {
      for (const r of rows) insert.run(site.id, r[0], r[1] === '' || r[1] === undefined ? null : Number(r[1]))
    })
    const out: number[] = []
    for (let i = 0; i <= runs; i++) {
      sqlite.exec('delete from flow_days')
      sqlite.pragma('wal_checkpoint(TRUNCATE)')
      const t = performance.now()
      const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true })
      insertAll(parsed.data.slice(1))
      const ms = performance.now() - t
      const stored = (sqlite.prepare('select count(*) as n from flow_days').get() as { n: number }).n
      if (stored !== expectedDays) throw new Error(`baseline stored ${stored} days, expected ${expectedDays}`)
      if (i > 0) out.push(ms)
    }
    sqlite.close()
    return out
  } finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

export async function uploadBench(): Promise<BenchFigure[]> {
  const { text, days } = centuryCsv()
  const server = await startBenchServer()
  let uploadMs: number[]
  let hostile: { status: number; ms: number; sent: number; growth: number }
  try {
    const me = await signUpSession(server.baseURL, 'upload')
    const created = await fetch(`${server.baseURL}/api/orgs/${me.orgId}/sites`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', accept: 'application/json', cookie: me.cookie },
      body: JSON.stringify(siteBody),
    })
    const site = (await created.json()) as { id?: number }
    if (created.status !== 201 || !site.id) throw new Error(`POST /api/orgs/${me.orgId}/sites answered ${created.status}: ${JSON.stringify(site)}`)

    const upload = async () => {
      const form = new FormData()
      form.append('mode', 'replace')
      form.append('file', new Blob([text], { type: 'text/csv' }), 'bench-century.csv')
      const res = await fetch(`${server.baseURL}/api/sites/${site.id}/flow-record`, { method: 'POST', headers: { accept: 'application/json', cookie: me.cookie }, body: form })
      const body = (await res.json()) as FlowUploadResult
      if (res.status !== 201 || body.daysInFile !== days || body.record.days !== days) {
        throw new Error(`POST /api/sites/${site.id}/flow-record answered ${res.status}: ${JSON.stringify(body).slice(0, 400)}`)
      }
    }
    await upload()
    uploadMs = []
    for (let i = 0; i < RUNS; i++) {
      const t = performance.now()
      await upload()
      uploadMs.push(performance.now() - t)
    }

    const before = residentBytes(server.pid)
    let most = before
    const watch = setInterval(() => (most = Math.max(most, residentBytes(server.pid))), 10)
    const reply = await chunkedUpload(`${server.baseURL}/api/sites/${site.id}/flow-record`, me.cookie, { fileName: 'huge.csv', type: 'text/csv', head: 'date,flow\n', fill: 0x31, fileBytes: HOSTILE_BYTES }).finally(() =>
      clearInterval(watch),
    )
    if (reply.status !== 413) throw new Error(`a ${HOSTILE_BYTES / MB} MB chunked upload answered ${reply.status}, not 413`)
    const health = await fetch(`${server.baseURL}/api/health`)
    if (health.status !== 200) throw new Error(`/api/health answered ${health.status} after the chunked upload`)
    hostile = { status: reply.status, ms: reply.ms, sent: reply.sentBytes, growth: most - before }
  } finally {
    await server.stop()
  }
  const bareMs = await baseline(text, days, RUNS)
  // Where the route's time goes: its own parser (every line checked and reported) on the same text.
  const parserMs = timeRuns(RUNS, () => {
    const parsed = parseFlowCsv(text)
    if (!parsed.ok || parsed.days.length !== days) throw new Error('parseFlowCsv refused the benchmark file')
  })
  const ratio = median(uploadMs) / median(bareMs)
  const kb = (Buffer.byteLength(text) / 1024).toFixed(0)
  return [
    { name: `upload of a ${days.toLocaleString('en-GB')}-day CSV (${kb} KiB), replace mode, over HTTP: median of ${RUNS}`, value: median(uploadMs), unit: 'ms', target: '(reported)', pass: true },
    { name: `bare papaparse parse + one-transaction insert of the same rows (better-sqlite3 prepared statement): median of ${RUNS}`, value: median(bareMs), unit: 'ms', target: '(baseline)', pass: true },
    { name: 'of which the route\'s parser, parseFlowCsv (server/domain/flowCsv.ts), in process: median', value: median(parserMs), unit: 'ms', target: '(reported)', pass: true },
    { name: 'upload ÷ bare parse and insert', value: ratio, unit: '×', target: `< ${MAX_RATIO}×`, pass: ratio < MAX_RATIO },
    { name: `${HOSTILE_BYTES / MB} MB flow CSV sent chunked (no Content-Length) against the 10 MB limit: time to the 413 (${(hostile.sent / MB).toFixed(1)} MB sent by then)`, value: hostile.ms, unit: 'ms', target: '(reported)', pass: true },
    { name: 'the server\'s resident memory growth meanwhile (largest VmRSS seen, sampled every 10 ms, less the start)', value: hostile.growth / MB, unit: 'MB', target: `< ${MAX_GROWTH / MB} MB`, pass: hostile.growth < MAX_GROWTH },
  ]
}
