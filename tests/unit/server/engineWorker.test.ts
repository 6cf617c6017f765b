import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { pathToFileURL } from 'node:url'
import { Piscina } from 'piscina'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { bundleNodeWorker } from '../../../build/nodeWorker'
import { assess, assessWithUncertainty } from '../../../shared/engine/assess'
import { commissioningCheck } from '../../../shared/engine/commissioning'
import { ENGINE_VERSION } from '../../../shared/engine/version'
import { fdcFromRecord, fdcStats, reservedFlow } from '../../../shared/engine/hydrology'
import { sweep } from '../../../shared/engine/sweep'
import runEngineTask, { type EngineOutcome, type EngineTask } from '../../../workers/engine.worker'
import { draft, parse, record } from '../engine/fixtures'

// The server's engine worker (workers/engine.worker.ts), called directly and, bundled as the build
// bundles it, in a real piscina thread. The `?node-worker` import itself only resolves in the Nitro build.

const GRID = { throatDiameters_m: [0.4, 0.6], units: [1, 2], throatDepths_m: [1] }
const badDate = { ...draft(), hydrology: { kind: 'record' as const, days: record('2001-01-01', [1, 2, 3]).map((d, i) => (i === 1 ? { ...d, date: '2001-13-01' } : d)) } }

describe('runEngineTask', () => {
  it('runs assess, sweep and sensitivity on JSON text, as the engine does in process', () => {
    expect(runEngineTask({ kind: 'assess', body: JSON.stringify(draft()) })).toEqual({ ok: true, value: assess(parse(draft())) })
    // the stateless route runs the Monte Carlo only when the body asks for draws
    const asking = { ...draft(), settings: { monteCarloDraws: 10 } }
    expect(runEngineTask({ kind: 'assess', body: JSON.stringify(asking) })).toEqual({ ok: true, value: assessWithUncertainty(parse(asking)) })
    expect(runEngineTask({ kind: 'sweep', body: JSON.stringify({ input: draft(), grid: GRID }) })).toEqual({ ok: true, value: sweep(parse(draft()), GRID) })
    const s = runEngineTask({ kind: 'sensitivity', body: JSON.stringify({ input: draft() }) })
    expect('value' in s && (s.value as { items: unknown[] }).items.length).toBeGreaterThan(3)
  }, 60_000)

  it('answers the result as JSON text when asked, NaN and infinities as null as any JSON answer', () => {
    expect(runEngineTask({ kind: 'sweep', body: JSON.stringify({ input: draft(), grid: GRID }), answer: 'json' })).toEqual({ ok: true, json: JSON.stringify(sweep(parse(draft()), GRID)) })
  })

  it('runs on an input built elsewhere (stored options)', () => {
    const input = parse({ ...draft(), settings: { monteCarloDraws: 12, monteCarloSeed: 3 } })
    // a stored assessment's run carries its Monte Carlo
    expect(runEngineTask({ kind: 'assess-input', input })).toEqual({ ok: true, value: assessWithUncertainty(input) })
    expect(runEngineTask({ kind: 'sweep-input', input, grid: GRID })).toEqual({ ok: true, value: sweep(input, GRID) })
    const moved = runEngineTask({ kind: 'design-at', input, throatDiameter_m: 0.3, units: 3, throatDepth_m: 1 })
    expect(moved).toMatchObject({ ok: true, value: { throatDiameter_m: 0.3, outletDiameter_m: 0.6, units: 3, throatDepth_m: 1 } })
  })

  it('works through a stored record for the hydrology tab: chart points, statistics, months and reserved flow', () => {
    const days = record('2001-01-01', Array.from({ length: 730 }, (_, i) => (i % 50 === 7 ? null : 1 + (i % 365) / 100)))
    const r = runEngineTask({ kind: 'record-hydrology', days, reservedFlow: { kind: 'percentile', exceedance: 95 } })
    const fdc = fdcFromRecord(days)
    expect(r).toMatchObject({ ok: true, value: { stats: fdcStats(fdc), reservedFlow: reservedFlow({ kind: 'percentile', exceedance: 95 }, fdc), count: fdc.count } })
    const value = (r as { value: { points: unknown[]; monthly: { month: number; days: number }[] } }).value
    expect(value.points).toHaveLength(200)
    expect(value.monthly.map((m) => m.month)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12])
    expect(value.monthly.reduce((n, m) => n + m.days, 0)).toBe(fdc.count)
  })

  it('checks a commissioning measurement against a stored input, and answers 422 naming the field it refuses', () => {
    const input = parse(draft())
    const measurement = {
      measuredAt: '2027-05-12T10:30', riverFlow_m3s: 8, waterTemp_C: 12, manometerFluid: 'mercury' as const, manometerDensity_kgm3: 13546,
      reading_m: 0.1, readingUnit: 'm-of-manometer-fluid' as const, upstreamTapDiameter_m: null, dischargeCoefficient: null,
      upstreamOxygen_mgL: 8.5, downstreamOxygen_mgL: 9.5, oxygenMeasuredAt: 'unit-outlet' as const,
    }
    expect(runEngineTask({ kind: 'commissioning-check', input, measurement })).toEqual({ ok: true, value: { ...commissioningCheck(input, measurement), engineVersion: ENGINE_VERSION } })
    expect(runEngineTask({ kind: 'commissioning-check', input, measurement: { ...measurement, upstreamOxygen_mgL: 12 } }))
      .toMatchObject({ ok: false, status: 422, message: expect.stringMatching(/^upstreamOxygen_mgL: is at or above saturation/) })
  })

  it('answers 400 naming the body for broken JSON and for prototype keys', () => {
    for (const body of ['{"site": ', '{"__proto__": {"x": 1}}', '{"a": {"constructor": 1}}']) {
      expect(runEngineTask({ kind: 'assess', body })).toMatchObject({ ok: false, status: 400, statusMessage: 'Bad Request', message: expect.stringMatching(/^body: /) })
    }
  })

  it('answers 400 naming every field the schema refuses, and for no body at all', () => {
    const bad = draft()
    bad.option.throatDiameter_m = -1
    const r = runEngineTask({ kind: 'sweep', body: JSON.stringify({ input: bad }) }) as Extract<EngineOutcome, { status: 400 | 422 }>
    expect(r).toMatchObject({ ok: false, status: 400, statusMessage: 'Validation Error' })
    expect(r.message).toMatch(/^input\.option\.throatDiameter_m: .*\(and 1 more\)$/)
    expect(r.issues.map((i) => i.path)).toEqual(['input.option.throatDiameter_m', 'grid'])
    expect(runEngineTask({ kind: 'assess', body: undefined })).toMatchObject({ ok: false, status: 400 })
  })

  it('answers 422 naming the field the engine refuses, by its path in the body', () => {
    const refused = (path: string) => ({ ok: false, status: 422, statusMessage: 'Unprocessable Entity', message: `${path}: is not a calendar date`, issues: [{ path, message: 'is not a calendar date' }] })
    for (const task of [
      { kind: 'assess', body: JSON.stringify(badDate) },
      { kind: 'assess-input', input: parse(badDate) },
    ] satisfies EngineTask[]) {
      expect(runEngineTask(task)).toEqual(refused('days[1].date'))
    }
    // The sweep and sensitivity bodies hold the engine input under `input`.
    expect(runEngineTask({ kind: 'sweep', body: JSON.stringify({ input: badDate, grid: GRID }) })).toEqual(refused('input.days[1].date'))
    expect(runEngineTask({ kind: 'sensitivity', body: JSON.stringify({ input: badDate }) })).toEqual(refused('input.days[1].date'))
  })
})

describe('the bundled worker in a piscina thread', () => {
  let dir: string
  let pool: Piscina
  beforeAll(async () => {
    const { code, inputs } = await bundleNodeWorker(join(process.cwd(), 'workers/engine.worker.ts'))
    // One self-contained file: shared/engine and zod are inside it, no import is left to resolve.
    expect(inputs.some((f) => f.includes('shared/engine/assess.ts'))).toBe(true)
    expect(code).not.toMatch(/\bfrom\s*["'](?!node:)[^"']+["']/)
    dir = mkdtempSync(join(tmpdir(), 'gillwatt-worker-'))
    const file = join(dir, 'engine.worker.mjs')
    writeFileSync(file, code)
    pool = new Piscina({ filename: pathToFileURL(file).href, minThreads: 1, maxThreads: 1 })
  })
  afterAll(async () => {
    await pool?.destroy()
    if (dir) rmSync(dir, { recursive: true, force: true })
  })

  it('answers results and refusals as values across the thread boundary', async () => {
    expect(await pool.run({ kind: 'assess', body: JSON.stringify(draft()) })).toEqual({ ok: true, value: assess(parse(draft())) })
    expect(await pool.run({ kind: 'assess', body: JSON.stringify(badDate) })).toMatchObject({ ok: false, status: 422, message: 'days[1].date: is not a calendar date' })
    expect(await pool.run({ kind: 'assess', body: '{' })).toMatchObject({ ok: false, status: 400 })
  })
})
