import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import { AssessInputSchema } from '../../shared/schemas/assess'
import { SensitivityRequestSchema, SweepRequestSchema } from '../../shared/schemas/engineRequests'
import { draft, fieldOf, numbersIn, setAt } from '../unit/engine/fixtures'
import type { Client } from './client'
import { signUp } from './client'
import { bodiesFor, expectFieldRefusal, expectSafe, hostileValue, refusedBodies, show } from './hostile-arbitraries'
import { createOption } from './options-helpers'
import { createSite, siteBody } from './sites-helpers'

// The engine routes (assess, sweep, sensitivity) with hostile bodies, and with each numeric input
// at its limits: a 400 naming the field, a 422 naming it, or a 200 whose every number is finite and
// whose nulls are only where the result may hold none (JSON turns NaN and Infinity into null).

let client: Client
let orgId: number

beforeAll(async () => {
  const owner = await signUp('hostile-engine')
  client = owner.client
  orgId = owner.orgId
})

const GRID = { throatDiameters_m: [0.3, 0.6], units: [1, 2], throatDepths_m: [0.5, 1.5] }

/** Keys whose value may be null in an engine result (`number | null` in shared/engine). */
const NULLABLE = new Set(['cavitationIndex', 'cavitationMargin_m', 'minCavitationMargin_m', 'minCavitationIndex', 'lcoe', 'simplePayback_yr', 'daysWithData', 'best', 'shutReason', 'shareOfTime', 'worst',
  // the baseline's ratios are null when nothing is given up or no oxygen gained, its cost cross-check with no rating (results.ts)
  'oxygenPerMWhGivenUp', 'energyGivenUpPerMgL', 'capexCrossCheck_usd2014',
  // no energy, no break-even price; no record, no years; no Monte Carlo asked for, none run; a percentile
  // outside the draws' or years' plotting positions, or an LCOE of draws that make no energy, is not given (money.ts, recordYears.ts, monteCarlo.ts)
  'breakEvenPrice', 'years', 'uncertainty', 'p90', 'p50', 'p10', 'p50Energy_MWh', 'p90Energy_MWh', 'driest', 'worstYearNetGain_mgL',
  // no tail level where heads come from the head table (weirHydraulics.ts); no maximum take in the flow rules (depletedReach.ts)
  'tailDepth_m', 'maxTake_m3s'])

/** Nulls outside NULLABLE (a NaN or Infinity that JSON turned into null), and any non-finite number, with their paths. */
function brokenNumbers(v: unknown, nullable: Set<string>, path = '$', key = ''): string[] {
  if (v === null) return nullable.has(key) ? [] : [`${path}=null`]
  if (typeof v === 'number') return Number.isFinite(v) ? [] : [`${path}=${v}`]
  if (Array.isArray(v)) return v.flatMap((x, i) => brokenNumbers(x, nullable, `${path}[${i}]`, key))
  if (typeof v === 'object') return Object.entries(v as Record<string, unknown>).flatMap(([k, x]) => brokenNumbers(x, nullable, `${path}.${k}`, k))
  return []
}


/** The base input with its defaults filled in and every optional number present, so each can be moved. */
const base = AssessInputSchema.parse({
  ...draft(),
  gaugeScaling: { siteArea_km2: 40, gaugeArea_km2: 50 },
  site: { ...draft().site, headTable: [{ flow_m3s: 5, head_m: 2 }, { flow_m3s: 20, head_m: 1.6 }] },
})
const numericPaths = numbersIn(base).map(([p]) => p).filter((p) => !/months\[(?![06]\])/.test(p))
const LIMITS: unknown[] = [0, -0, Number.MIN_VALUE, 1e-300, 1e300, Number.MAX_VALUE, -1, -1e300, 'NaN', 'Infinity', '-Infinity', '1e999', '12']

/** True when `message` names `field`, or the same column of the row before or after (FDC points, head table: an ordering rule). */
function namesField(message: string, field: string): boolean {
  const named = /^([\w.]+):/.exec(message)?.[1] ?? ''
  if (named === field) return true
  const a = /^(.*)\.(\d+)\.(\w+)$/.exec(named)
  const b = /^(.*)\.(\d+)\.(\w+)$/.exec(field)
  return !!a && !!b && a[1] === b[1] && a[3] === b[3] && Math.abs(Number(a[2]) - Number(b[2])) === 1
}

const ROUTES = [
  { path: '/api/engine/assess', wrap: (input: unknown) => input, prefix: '' },
  { path: '/api/engine/sweep', wrap: (input: unknown) => ({ input, grid: GRID }), prefix: 'input.' },
  { path: '/api/engine/sensitivity', wrap: (input: unknown) => ({ input, fraction: 0.9 }), prefix: 'input.' },
] as const

describe('engine routes with inputs at their limits', () => {
  it('the base input answers 200 on every route with only finite numbers', async () => {
    for (const route of ROUTES) {
      const res = await client.post(route.path, route.wrap(base))
      expect(res.status, show(res.body)).toBe(200)
      expect(brokenNumbers(res.body, NULLABLE)).toEqual([])
    }
  })

  it('each numeric input at zero, tiny, huge, negative or as text: refused naming it, or only finite numbers', async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...ROUTES), fc.constantFrom(...numericPaths), fc.constantFrom(...LIMITS), async (route, path, value) => {
        const label = `${route.path} ${fieldOf(path)} = ${show(value)}`
        const res = await client.post(route.path, route.wrap(setAt(base, path, value)))
        expectSafe(res, label)
        if (typeof value === 'string') expect(res.status, label).toBe(400)
        if (res.status === 200) expect(brokenNumbers(res.body, NULLABLE), label).toEqual([])
        else {
          expect([400, 422], `${label} → ${res.status}`).toContain(res.status)
          // A 400 (the schema) and a 422 (the engine) alike name the field by its path in the body.
          expect(namesField(res.body.message, route.prefix + fieldOf(path)), `${label}: ${res.body.message}`).toBe(true)
        }
      }),
      { numRuns: 150 },
    )
  })

  it('hostile bodies are refused with a 400 naming the field', async () => {
    const routes = [
      { path: '/api/engine/assess', schema: AssessInputSchema, good: base as unknown as Record<string, unknown> },
      { path: '/api/engine/sweep', schema: SweepRequestSchema, good: { input: base, grid: GRID } },
      { path: '/api/engine/sensitivity', schema: SensitivityRequestSchema, good: { input: base, fraction: 0.2 } },
    ]
    // Whole bodies, and the base input with one nested field (not only numbers) replaced by anything.
    const leafPaths = (v: unknown, path = '$'): string[] =>
      v !== null && typeof v === 'object' ? [path, ...Object.entries(v).flatMap(([k, x]) => leafPaths(x, Array.isArray(v) ? `${path}[${k}]` : `${path}.${k}`))] : [path]
    for (const route of routes) {
      const paths = leafPaths(route.good).filter((p) => p !== '$' && !/months\[(?!0\])/.test(p))
      const nestedBodies = fc.tuple(fc.constantFrom(...paths), hostileValue).map(([p, v]) => setAt(route.good, p, v) as unknown)
      await fc.assert(
        fc.asyncProperty(refusedBodies(route.schema, fc.oneof(bodiesFor(route.good), nestedBodies)), async (body) => {
          expectFieldRefusal(await client.request('POST', route.path, JSON.stringify(body)), `${route.path} ${show(body)}`, body)
        }),
        { numRuns: 60 },
      )
    }
  })
})

describe('stored sites and options at their limits', () => {
  it('hydrology and assessments of a site at its limits are finite, or refused naming the field', async () => {
    const HYDROLOGY_NULLABLE = new Set(['stats', 'scale', 'flow'])
    const sites = [
      { fdcPoints: [{ exceedance: 0, flow: 1e6 }, { exceedance: 50, flow: 1e6 }, { exceedance: 100, flow: 0 }], catchment: { siteArea_km2: 1e6, gaugeArea_km2: 1000 } },
      { fdcPoints: [{ exceedance: 1, flow: Number.MIN_VALUE }, { exceedance: 2, flow: Number.MIN_VALUE }, { exceedance: 3, flow: 0 }], reservedFlow: { kind: 'fixed', flow: 1e6 } },
      { headTable: [{ flow: 0, head: 0 }, { flow: 1e6, head: 20 }], weir: { grossHead_m: Number.MIN_VALUE, crestWidth_m: 1000, shape: 'sharp-crested-vertical-face', waterQuality: 'clean' } },
    ]
    for (const over of sites) {
      const site = await createSite(client, orgId, over)
      const hyd = await client.get(`/api/sites/${site.id}/hydrology`)
      expect(hyd.status, show(hyd.body)).toBe(200)
      expect(brokenNumbers(hyd.body, HYDROLOGY_NULLABLE), show(over)).toEqual([])
      const option = await createOption(client, site.id, { design: { throatDiameter_m: 10, outletDiameter_m: 20, throatDepth_m: 30, units: 50 }, settings: { life_yr: 1, exportPrice: 1e12 } })
      const run = await client.post(`/api/options/${option.id}/assessments`, {})
      expectSafe(run, show(over))
      if (run.status === 201) {
        const stored = await client.get(`/api/assessments/${run.body.id}`)
        expect(brokenNumbers(stored.body.result, NULLABLE), show(over)).toEqual([])
      } else {
        expect(run.status, show(run.body)).toBe(422)
        expect(run.body.message).toMatch(/^[\w.]+: /)
      }
    }
  })

  it('catchment areas too far apart for the area-ratio method are refused naming the smaller one', async () => {
    const site = await client.post(`/api/orgs/${orgId}/sites`, { ...siteBody(), catchment: { siteArea_km2: 1e6, gaugeArea_km2: Number.MIN_VALUE } })
    expectFieldRefusal(site, 'catchment')
    expect(site.body.message).toMatch(/^catchment\.gaugeArea_km2: /)
  })
})
