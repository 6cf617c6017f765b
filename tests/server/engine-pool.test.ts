import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startBuiltServer, type BuiltServer } from '../../scripts/builtServer.mjs'
import { draft, record } from '../unit/engine/fixtures'
import type { Client } from './client'
import { signUp } from './client'
import { createOption } from './options-helpers'
import { createSite } from './sites-helpers'

// Engine work runs in the worker-thread pool, off the request thread: a heavy sweep leaves the server
// answering; a full queue, a run past its time limit and a caller past their rate limit get a clear
// 503 or 429 with Retry-After; the engine's own 422 naming the field still comes back through the pool.

/** A long daily record (the schema's largest is 80,000 days), with seasonal flows and no gaps. */
function longRecordInput(days: number) {
  const flows = Array.from({ length: days }, (_, i) => 2 + 1.5 * Math.sin((i / 365.25) * 2 * Math.PI) + ((i * 7919) % 101) / 50)
  return { ...draft(), hydrology: { kind: 'record' as const, days: record('1800-01-01', flows) } }
}

/** A sweep over an 80,000-day record of 60 grid points, or of 400 (the most allowed): seconds of engine work. */
function heavySweep(points: 60 | 400) {
  const [diameters, units, depths] = points === 60 ? [15, 2, 2] : [20, 5, 4]
  const grid = {
    throatDiameters_m: Array.from({ length: diameters }, (_, i) => 0.3 + i * 0.02),
    units: Array.from({ length: units }, (_, i) => i + 1),
    throatDepths_m: Array.from({ length: depths }, (_, i) => 0.5 + i * 0.5),
  }
  return JSON.stringify({ input: longRecordInput(80_000), grid })
}

const SMALL_SWEEP = { input: draft(), grid: { throatDiameters_m: [0.4, 0.6], units: [1], throatDepths_m: [1] } }

describe('engine work off the request thread (shared test server)', () => {
  let client: Client
  beforeAll(async () => {
    client = (await signUp('engine-pool')).client
  })

  it('answers /api/health again and again while several heavy sweeps run', async () => {
    const body = heavySweep(60)
    let sweepsDone = 0
    const sweeps = [0, 1, 2].map(() =>
      client.request('POST', '/api/engine/sweep', body).then((res) => {
        sweepsDone++
        return res
      }),
    )
    // Health is asked one request after another until the first sweep answers: with the engine on
    // the request thread, no answer comes while a sweep computes.
    let healthBeforeFirstSweep = 0
    while (sweepsDone === 0) {
      const res = await client.get('/api/health')
      expect(res.status).toBe(200)
      if (sweepsDone === 0) healthBeforeFirstSweep++
      await new Promise((r) => setTimeout(r, 20))
    }
    const results = await Promise.all(sweeps)
    for (const res of results) {
      expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200)
      expect(res.body.points).toHaveLength(60)
    }
    expect(healthBeforeFirstSweep).toBeGreaterThanOrEqual(10)
  }, 120_000)

  it('still answers 422 naming the field when the engine refuses an input that passed the schema', async () => {
    const input = { ...draft(), hydrology: { kind: 'record', days: record('2001-01-01', [1, 2, 3]).map((d, i) => (i === 1 ? { ...d, date: '2001-13-01' } : d)) } }
    // Named by its path in the body: the sweep and sensitivity bodies hold the input under `input`.
    for (const [path, body, field] of [
      ['/api/engine/assess', input, 'days[1].date'],
      ['/api/engine/sweep', { input, grid: SMALL_SWEEP.grid }, 'input.days[1].date'],
      ['/api/engine/sensitivity', { input }, 'input.days[1].date'],
    ] as const) {
      const res = await client.post(path, body)
      expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBe(422)
      expect(res.body.message).toBe(`${field}: is not a calendar date`)
      expect(res.body.data.issues[0].path).toBe(field)
    }
  })

  it('still answers 400 naming the field for a body the schema refuses, and 400 for broken JSON', async () => {
    const bad = draft()
    bad.option.throatDiameter_m = -1
    const res = await client.post('/api/engine/sweep', { input: bad, grid: SMALL_SWEEP.grid })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^input\.option\.throatDiameter_m:/)
    const broken = await client.request('POST', '/api/engine/assess', '{"site": ')
    expect(broken.status).toBe(400)
    expect(broken.body.message).toMatch(/^body:/)
  })
})

describe('a full queue, on a server with one engine thread and a queue of one', () => {
  let server: BuiltServer
  beforeAll(async () => {
    server = await startBuiltServer({
      prefix: 'gillwatt-test-pool-',
      env: { NUXT_ENGINE_POOL_THREADS: '1', NUXT_ENGINE_POOL_QUEUE_LIMIT: '1' },
    })
  })
  afterAll(async () => {
    await server?.close()
  })

  it('answers 503 with Retry-After once one sweep runs and one waits, and answers again afterwards', async () => {
    const body = heavySweep(400)
    const people = await Promise.all([0, 1, 2, 3, 4].map((k) => signUp(`pool-full-${k}`, { verify: false, baseURL: server.baseURL })))
    const aborts = people.map(() => new AbortController())
    const answers = await Promise.allSettled(
      people.map(({ client }, k) =>
        client.request('POST', '/api/engine/sweep', body, { signal: aborts[k]!.signal }).then((res) => {
          // As soon as one is refused, the others are given up: a given-up request's task is cancelled.
          if (res.status === 503) aborts.forEach((a, j) => j !== k && a.abort())
          return res
        }),
      ),
    )
    const refused = answers.flatMap((a) => (a.status === 'fulfilled' && a.value.status === 503 ? [a.value] : []))
    expect(refused.length).toBeGreaterThanOrEqual(1)
    for (const res of refused) {
      expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0)
      expect(res.body.message).toMatch(/busy/i)
    }
    // The given-up sweeps were cancelled: the one thread soon takes a small sweep and answers it. The
    // server learns of a client gone away, and its thread is ended, a moment after the abort: until
    // then the queue may still be full (503), so ask again a bounded number of times.
    let after = await people[0]!.client.post('/api/engine/sweep', SMALL_SWEEP)
    // (At most 15 more: the person's sweep allowance on this server is 20 a minute.)
    for (let i = 0; i < 15 && after.status === 503; i++) {
      await new Promise((r) => setTimeout(r, 500))
      after = await people[0]!.client.post('/api/engine/sweep', SMALL_SWEEP)
    }
    expect(after.status).toBe(200)
    expect((await fetch(`${server.baseURL}/api/health`)).status).toBe(200)
  }, 120_000)
})

describe('the time limit and the rate limit, on a server with a short time limit and a low sweep limit', () => {
  let server: BuiltServer
  beforeAll(async () => {
    server = await startBuiltServer({
      prefix: 'gillwatt-test-pool-',
      env: {
        NUXT_ENGINE_POOL_TIME_LIMIT_MS: '2000',
        NUXT_RATE_LIMITS: JSON.stringify({ 'engine-sweep': { limit: 3, windowSeconds: 3600 } }),
      },
    })
  })
  afterAll(async () => {
    await server?.close()
  })

  it('answers 503 with Retry-After when a sweep passes the time limit, and keeps answering', async () => {
    const { client } = await signUp('pool-slow', { verify: false, baseURL: server.baseURL })
    const res = await client.request('POST', '/api/engine/sweep', heavySweep(400))
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(503)
    expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(res.body.message).toMatch(/time limit/i)
    expect((await fetch(`${server.baseURL}/api/health`)).status).toBe(200)
    expect((await client.post('/api/engine/sweep', SMALL_SWEEP)).status).toBe(200)
  }, 120_000)

  it('answers 429 with Retry-After past a person\'s sweep limit, on both sweep routes, and not to anyone else', async () => {
    const one = await signUp('pool-rate-one', { verify: false, baseURL: server.baseURL })
    const other = await signUp('pool-rate-other', { verify: false, baseURL: server.baseURL })
    const option = await createOption(one.client, (await createSite(one.client, one.orgId)).id)
    for (let k = 0; k < 3; k++) expect((await one.client.post('/api/engine/sweep', SMALL_SWEEP)).status).toBe(200)
    const refused = await one.client.post('/api/engine/sweep', SMALL_SWEEP)
    expect(refused.status).toBe(429)
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(refused.body.message).toMatch(/too many sweeps/i)
    // The option sweep shares the person's sweep allowance.
    expect((await one.client.post(`/api/options/${option.id}/sweep`, { grid: SMALL_SWEEP.grid })).status).toBe(429)
    expect((await other.client.post('/api/engine/sweep', SMALL_SWEEP)).status).toBe(200)
    // Assessments have an allowance of their own.
    expect((await one.client.post('/api/engine/assess', draft())).status).toBe(200)
  })
})
