// HTTP load on the built server over loopback with autocannon (20 connections, 10 s each), in one
// server process: GET /api/health first, then POST /api/engine/assess signed in, with the documented
// example request of docs/api.md. Each gets a short unrecorded warm-up run first.
import { readFileSync } from 'node:fs'
import autocannon from 'autocannon'
import type { BenchFigure } from './harness'
import { type BenchServer, signUpSession, startBenchServer } from './server'

const CONNECTIONS = 20
const DURATION_S = 10
const WARM_UP_S = 2
const MIN_RATIO = 0.5
const MAX_P99_MS = 100

/** The example body of POST /api/engine/assess in docs/api.md (between its example markers). */
export function assessExample(): string {
  const doc = readFileSync('docs/api.md', 'utf8')
  const m = /<!-- example assess request -->\s*```json\n([\s\S]*?)```\s*<!-- \/example assess request -->/.exec(doc)
  if (!m) throw new Error('docs/api.md has no "example assess request" block')
  return JSON.stringify(JSON.parse(m[1]!))
}

interface Load {
  reqPerSec: number
  p99: number
  non2xx: number
  errors: number
  statuses: string
}

async function load(opts: autocannon.Options): Promise<Load> {
  const r = await autocannon({ connections: CONNECTIONS, ...opts })
  const statuses = Object.entries(r.statusCodeStats ?? {})
    .map(([code, { count }]) => `${code}×${count ?? 0}`)
    .join(', ')
  return { reqPerSec: r.requests.average, p99: r.latency.p99, non2xx: r.non2xx, errors: r.errors + r.timeouts, statuses }
}

export async function httpBench(): Promise<BenchFigure[]> {
  // One person makes every request: the per-person assessment limit is raised so it measures the server.
  const server: BenchServer = await startBenchServer({ env: { NUXT_RATE_LIMITS: JSON.stringify({ 'engine-assess': { limit: 1_000_000 } }) } })
  try {
    const me = await signUpSession(server.baseURL, 'load')
    const body = assessExample()
    const assessReq: autocannon.Options = {
      url: `${server.baseURL}/api/engine/assess`,
      method: 'POST',
      headers: { 'content-type': 'application/json', accept: 'application/json', cookie: me.cookie },
      body,
    }
    // One checked request first: the load figures mean nothing if the route refuses the body.
    const probe = await fetch(assessReq.url as string, { method: 'POST', headers: assessReq.headers as Record<string, string>, body })
    const probeText = await probe.text()
    if (probe.status !== 200 || !('summary' in (JSON.parse(probeText) as object))) {
      throw new Error(`POST /api/engine/assess answered ${probe.status}: ${probeText.slice(0, 400)}`)
    }
    const healthReq: autocannon.Options = { url: `${server.baseURL}/api/health`, headers: { accept: 'application/json' } }

    await load({ ...healthReq, duration: WARM_UP_S })
    const health = await load({ ...healthReq, duration: DURATION_S })
    await load({ ...assessReq, duration: WARM_UP_S })
    const assessLoad = await load({ ...assessReq, duration: DURATION_S })
    const ratio = assessLoad.reqPerSec / health.reqPerSec
    const refused = health.non2xx + assessLoad.non2xx + health.errors + assessLoad.errors
    const limited = /\b429×/.test(`${health.statuses}, ${assessLoad.statuses}`)
    const sentence = (l: Load) => l.statuses || 'none'
    return [
      { name: `GET /api/health, ${CONNECTIONS} connections, ${DURATION_S} s: requests a second`, value: health.reqPerSec, unit: 'req/s', target: '(baseline)', pass: true },
      { name: 'GET /api/health: 99th percentile latency', value: health.p99, unit: 'ms', target: '(reported)', pass: true },
      { name: `POST /api/engine/assess (docs/api.md example, signed in), ${CONNECTIONS} connections, ${DURATION_S} s: requests a second`, value: assessLoad.reqPerSec, unit: 'req/s', target: '(reported)', pass: true },
      { name: 'POST /api/engine/assess: 99th percentile latency', value: assessLoad.p99, unit: 'ms', target: `< ${MAX_P99_MS} ms`, pass: assessLoad.p99 < MAX_P99_MS },
      { name: 'assess ÷ health, requests a second', value: ratio, unit: '×', target: `≥ ${MIN_RATIO}×`, pass: ratio >= MIN_RATIO },
      {
        name: `answers not 2xx, connection errors and timeouts, both runs (status codes: health ${sentence(health)}; assess ${sentence(assessLoad)})${limited ? '; 429s: a rate limiter is answering' : ''}`,
        value: refused,
        unit: '',
        target: '0',
        pass: refused === 0,
      },
    ]
  } finally {
    await server.stop()
  }
}
