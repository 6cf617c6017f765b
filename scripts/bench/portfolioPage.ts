// Portfolio over HTTP: the built server on a temporary database; a person signs up (admin of their
// own organisation), then a second connection fills that organisation with 10,000 invented sites
// (the same `fillPortfolio` as the function-level benchmark; WAL lets it write while the server runs).
// Timed one request at a time, signed in: GET /api/orgs/[orgId]/portfolio for the first page and a
// sorted later page, the map's unpaged answer, and the server-rendered portfolio page "/", with
// GET /api/me as the floor under them all.
import { performance } from 'node:perf_hooks'
import { openDatabase } from '../../db/connection'
import type { PortfolioDto } from '../../shared/schemas/portfolio'
import { type BenchFigure, median, percentile } from './harness'
import { fillPortfolio } from './portfolio'
import { signUpSession, startBenchServer } from './server'

const SITES = 10_000
const RUNS = 60
const WARM_UP = 5
const TARGET_MS = 50

/** Milliseconds of each of RUNS sequential GETs of `path`, after WARM_UP; `check` sees every answer. */
async function timeGets(url: string, headers: Record<string, string>, check: (status: number, text: string) => void): Promise<number[]> {
  const out: number[] = []
  for (let i = 0; i < WARM_UP + RUNS; i++) {
    const t = performance.now()
    const res = await fetch(url, { headers })
    const text = await res.text()
    const ms = performance.now() - t
    check(res.status, text)
    if (i >= WARM_UP) out.push(ms)
  }
  return out
}

export async function portfolioPageBench(): Promise<BenchFigure[]> {
  const server = await startBenchServer()
  try {
    const me = await signUpSession(server.baseURL, 'portfolio')
    const db = openDatabase(server.databasePath)
    let live: number
    try {
      const other = await db.insertInto('organisations').values({ name: 'Another bench organisation (invented)' }).returning('id').executeTakeFirstOrThrow()
      await fillPortfolio(db, { orgId: me.orgId, otherOrgId: other.id, userId: me.userId, sites: SITES })
      const count = await db.selectFrom('sites').select((eb) => eb.fn.countAll<number>().as('n')).where('org_id', '=', me.orgId).where('deleted_at', 'is', null).executeTakeFirstOrThrow()
      live = Number(count.n)
    } finally {
      await db.destroy()
    }
    // better-sqlite3 is synchronous: the fill held this process's event loop for seconds, and the
    // server may have closed the sign-up's idle keep-alive socket without fetch noticing. One untimed
    // request, tried twice, clears a dead socket out of the pool before anything is timed.
    try {
      await (await fetch(`${server.baseURL}/api/health`)).text()
    } catch {
      await (await fetch(`${server.baseURL}/api/health`)).text()
    }

    const json = { accept: 'application/json', cookie: me.cookie }
    const api = `${server.baseURL}/api/orgs/${me.orgId}/portfolio`
    const page = (what: string, rows: number) => (status: number, text: string) => {
      const body = JSON.parse(text) as PortfolioDto
      if (status !== 200 || body.total !== live || body.rows.length !== rows) {
        throw new Error(`${what} answered ${status} with ${body.rows?.length} rows of ${body.total}; expected ${rows} of ${live}: ${text.slice(0, 300)}`)
      }
    }
    // A signed-in route doing next to nothing: the floor under every figure below (session, middleware, HTTP).
    const floor = await timeGets(`${server.baseURL}/api/me`, json, (status, text) => {
      if (status !== 200) throw new Error(`GET /api/me answered ${status}: ${text.slice(0, 300)}`)
    })
    const first = await timeGets(api, json, page('portfolio first page', 50))
    const sorted = await timeGets(`${api}?sort=annualEnergy_MWh&dir=desc&page=50`, json, page('portfolio page 50 by annual energy', 50))
    const map = await timeGets(`${api}?format=map`, json, page('portfolio map', 2000))
    let rendered = false
    const html = await timeGets(`${server.baseURL}/`, { accept: 'text/html', cookie: me.cookie }, (status, text) => {
      if (status !== 200 || !text.includes('<html')) throw new Error(`GET / signed in answered ${status}: ${text.slice(0, 300)}`)
      rendered ||= text.includes('Bench weir 00001')
    })
    const n = `${live.toLocaleString('en-GB')} live sites`
    return [
      { name: 'GET /api/me signed in (the floor: session, middleware and HTTP on loopback): 95th percentile', value: percentile(floor, 95), unit: 'ms', target: '(reported)', pass: true },
      { name: `GET portfolio, ${n}, first page (50 rows by name), signed in: 95th percentile of ${RUNS}`, value: percentile(first, 95), unit: 'ms', target: `< ${TARGET_MS} ms`, pass: percentile(first, 95) < TARGET_MS },
      { name: `GET portfolio, ${n}, page 50 by annual energy, descending: 95th percentile of ${RUNS}`, value: percentile(sorted, 95), unit: 'ms', target: `< ${TARGET_MS} ms`, pass: percentile(sorted, 95) < TARGET_MS },
      { name: `GET portfolio?format=map (first 2,000 rows, unpaged, for the map): 95th percentile`, value: percentile(map, 95), unit: 'ms', target: '(reported)', pass: true },
      {
        name: `server-rendered portfolio page "/" signed in, HTML (${rendered ? 'table rows rendered on the server' : 'no table rows in the HTML'}): 95th percentile`,
        value: percentile(html, 95),
        unit: 'ms',
        target: '(reported)',
        pass: true,
      },
      { name: 'server-rendered portfolio page "/": median', value: median(html), unit: 'ms', target: '(reported)', pass: true },
    ]
  } finally {
    await server.stop()
  }
}
