// The engine's worker pool under load, on the built server: 20 clients keep posting the heaviest sweep
// the API takes (400 grid points over an 80,000-day record, several seconds of engine work each)
// while GET /api/health is measured beside them: first while their bodies arrive, then while they run. With engine work on the request thread, one such
// sweep held every other request for seconds; in the pool, health should not notice.
// The sweep clients are one person, so the bench server raises the per-person limits.
import { spawn } from 'node:child_process'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import autocannon from 'autocannon'
import type { BenchFigure } from './harness'
import { type BenchServer, signUpSession, startBenchServer } from './server'

const SWEEP_CLIENTS = 20
const HEALTH_CONNECTIONS = 4
const DURATION_S = 10
/** The first seconds of the load, while the 20 bodies (2.8 MB each) arrive and are read; measured apart. */
const LEAD_S = 6
const MAX_HEALTH_P99_MS = 50

/** 400 grid points over 80,000 invented days (seasonal flows): the largest sweep the schema allows. */
export function heaviestSweep(): string {
  const t0 = Date.UTC(1800, 0, 1)
  const days = Array.from({ length: 80_000 }, (_, i) => ({
    date: new Date(t0 + i * 86_400_000).toISOString().slice(0, 10),
    flow: Math.round((2 + 1.5 * Math.sin((i / 365.25) * 2 * Math.PI) + ((i * 7919) % 101) / 50) * 1000) / 1000,
  }))
  const input = {
    site: { altitude_m: 120, grossHead_m: 2, months: Array.from({ length: 12 }, (_, m) => ({ temperature_C: 4 + 13 * Math.sin((m / 12) * Math.PI), upstreamOxygen_mgL: 10 })) },
    hydrology: { kind: 'record', days },
    option: { units: 2, throatDiameter_m: 0.6, outletDiameter_m: 1.2, throatDepth_m: 1.5, air: { pipeDiameter_m: 0.5, pipeLength_m: 10 } },
  }
  const grid = {
    throatDiameters_m: Array.from({ length: 20 }, (_, i) => 0.3 + i * 0.02),
    units: [1, 2, 3, 4, 5],
    throatDepths_m: [0.5, 1, 1.5, 2],
  }
  return JSON.stringify({ input, grid })
}

/**
 * autocannon's command line in a process of its own, so sending 20 large bodies never delays the
 * health measurement made in this one. Resolves with its JSON result.
 */
function sweepClients(url: string, cookie: string, body: string, seconds: number): Promise<autocannon.Result> {
  const dir = mkdtempSync(join(tmpdir(), 'gillwatt-bench-sweep-'))
  const file = join(dir, 'sweep.json')
  writeFileSync(file, body)
  const cli = createRequire(import.meta.url).resolve('autocannon/autocannon.js')
  // A sweep waits in the queue up to the pool's time limit: the clients wait longer than that (-t 60).
  const args = [cli, '-j', '-c', String(SWEEP_CLIENTS), '-d', String(seconds), '-t', '60', '-m', 'POST', '-H', 'content-type: application/json', '-H', 'accept: application/json', '-H', `cookie: ${cookie}`, '-i', file, url]
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, args, { stdio: ['ignore', 'pipe', 'pipe'] })
    let out = ''
    let err = ''
    child.stdout.on('data', (d) => (out += d))
    child.stderr.on('data', (d) => (err += d))
    child.on('error', reject)
    child.on('exit', (code) => {
      rmSync(dir, { recursive: true, force: true })
      try {
        resolve(JSON.parse(out) as autocannon.Result)
      } catch {
        reject(new Error(`autocannon for the sweeps exited with code ${code}: ${err.slice(-2000)}`))
      }
    })
  })
}

const statuses = (r: autocannon.Result) =>
  Object.entries(r.statusCodeStats ?? {})
    .map(([code, { count }]) => `${code}×${count ?? 0}`)
    .join(', ') || 'none'

export async function poolLoadBench(): Promise<BenchFigure[]> {
  const server: BenchServer = await startBenchServer({
    env: { NUXT_RATE_LIMITS: JSON.stringify({ 'engine-sweep': { limit: 1_000_000 } }) },
  })
  try {
    const me = await signUpSession(server.baseURL, 'pool')
    const body = heaviestSweep()
    const healthReq: autocannon.Options = { url: `${server.baseURL}/api/health`, headers: { accept: 'application/json' }, connections: HEALTH_CONNECTIONS }
    // The quiet figure first, for comparison.
    const quiet = await autocannon({ ...healthReq, duration: DURATION_S })
    const sweeping = sweepClients(`${server.baseURL}/api/engine/sweep`, me.cookie, body, LEAD_S + DURATION_S + 2)
    const arriving = await autocannon({ ...healthReq, duration: LEAD_S })
    const loaded = await autocannon({ ...healthReq, duration: DURATION_S })
    const sweeps = await sweeping
    const healthBroken = [arriving, loaded].reduce((n, r) => n + r.non2xx + r.errors + r.timeouts, 0)
    return [
      { name: `GET /api/health, ${HEALTH_CONNECTIONS} connections, ${DURATION_S} s, quiet server: 99th percentile latency`, value: quiet.latency.p99, unit: 'ms', target: '(baseline)', pass: true },
      {
        name: `GET /api/health in the first ${LEAD_S} s of that load, while the 20 sweep bodies (${(body.length / 1048576).toFixed(1)} MB each) arrive and are read: 99th percentile latency (max ${arriving.latency.max} ms)`,
        value: arriving.latency.p99,
        unit: 'ms',
        target: '(reported)',
        pass: true,
      },
      {
        name: `GET /api/health, ${HEALTH_CONNECTIONS} connections, the next ${DURATION_S} s, while ${SWEEP_CLIENTS} clients' sweeps of 400 points over 80,000 days wait and run: 99th percentile latency (max ${loaded.latency.max} ms, ${Math.round(loaded.requests.average)} req/s)`,
        value: loaded.latency.p99,
        unit: 'ms',
        target: `< ${MAX_HEALTH_P99_MS} ms`,
        pass: loaded.latency.p99 < MAX_HEALTH_P99_MS,
      },
      { name: `health answers not 2xx, errors and timeouts under that load (${statuses(arriving)}; ${statuses(loaded)})`, value: healthBroken, unit: '', target: '0', pass: healthBroken === 0 },
      {
        name: `the sweeps' answers meanwhile (${statuses(sweeps)}; 503: queue full or past the pool's time limit; errors/timeouts ${sweeps.errors}/${sweeps.timeouts})`,
        value: sweeps.requests.total,
        unit: 'answered',
        target: '(reported)',
        pass: true,
      },
    ]
  } finally {
    await server.stop()
  }
}
