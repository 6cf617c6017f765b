// Portfolio benchmark, function level: a temporary SQLite file with one organisation of 10,000
// invented sites, two options each and one to three stored assessments per option (real result JSON
// from the engine), then the portfolio of server/domain/portfolio.ts (loadPortfolio) timed as the route runs
// it, page by page. `fillPortfolio` is also used by portfolioPage.ts for the same data over HTTP.
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Kysely } from 'kysely'
import { migrateToLatest, openDatabase } from '../../db/connection'
import type { Database, SiteRow } from '../../db/schema'
import { assess } from '../../shared/engine/assess'
import { OptionInputSchema } from '../../shared/schemas/option'
import { PortfolioQuerySchema } from '../../shared/schemas/portfolio'
import { buildAssessInput, storedOption, summaryColumns } from '../../server/domain/assessments'
import { allPortfolioRows, loadPortfolio } from '../../server/domain/portfolio'
import { type BenchFigure, median, percentile, timeAsync } from './harness'

const SITES = 10_000
const RUNS = 60
const TARGET_MS = 50

const MONTHS = Array.from({ length: 12 }, (_, i) => ({ waterTemp_C: 5 + 11 * Math.sin((Math.PI * i) / 11), upstreamOxygen: { value: 12 - i / 3, unit: 'mg/L' } }))
const FDC = [
  { exceedance: 5, flow: 30 }, { exceedance: 20, flow: 12 }, { exceedance: 50, flow: 5 }, { exceedance: 80, flow: 2.2 }, { exceedance: 95, flow: 1.2 },
]

/** Who owns the generated sites, and how many to make. */
export interface PortfolioFill {
  orgId: number
  /** When given, every 20th site goes to this organisation instead, so scoping is exercised. */
  otherOrgId?: number
  /** Recorded as the creator of every assessment. */
  userId: number
  sites: number
}

/**
 * Fills an organisation with invented sites (about 1 in 97 soft-deleted), two options each (one in
 * ten second options deleted) and one to three stored assessments per option for nine sites in ten,
 * carrying the result JSON of one real engine run. Deterministic; one transaction. The one generator
 * of both portfolio benchmarks (function level here, over HTTP in portfolioPage.ts).
 */
export async function fillPortfolio(db: Kysely<Database>, { orgId, otherOrgId, userId, sites }: PortfolioFill): Promise<void> {
  // One real engine run gives the stored JSON every row carries (rows differ in their headline columns).
  const option = OptionInputSchema.parse({
    name: 'Bench option',
    design: { units: 2, throatDiameter_m: 0.5, outletDiameter_m: 1, throatDepth_m: 2.5, air: { pipeDiameter_m: 0.4, pipeLength_m: 8 } },
  })
  const siteTemplate = {
    weir: JSON.stringify({ grossHead_m: 2, crestWidth_m: 15, shape: 'sharp-crested-vertical-face', waterQuality: 'clean' }),
    head_table: '[]',
    reserved_flow: JSON.stringify({ kind: 'percentile', exceedance: 95 }),
    flow_rules: JSON.stringify({ preset: 'none', maxTake: { kind: 'none' }, keptShare_pct: 0, passFlow_m3s: 0 }),
    months: JSON.stringify(MONTHS),
    fdc_points: JSON.stringify(FDC),
  }
  const probe = { id: 0, org_id: orgId, name: 'probe', river_name: 'probe', lat: 0, lng: 0, altitude_m: 100, gross_head_m: 2, target_oxygen_mgl: 6, reach: null, catchment: null, notes: '', version: 1, created_by: null, created_at: '', updated_at: '', deleted_at: null, deleted_by: null, ...siteTemplate } satisfies SiteRow
  const input = buildAssessInput(probe, null, storedOption({ design: JSON.stringify(option.design), settings: JSON.stringify(option.settings) }))
  const result = assess(input)
  const inputJson = JSON.stringify(input)
  const resultJson = JSON.stringify(result)
  const cols = summaryColumns(result)

  let state = 12345
  const rand = () => ((state = (Math.imul(state, 1664525) + 1013904223) >>> 0) / 4294967296)
  await db.transaction().execute(async (trx) => {
    for (let start = 0; start < sites; start += 500) {
      const inserted = await trx
        .insertInto('sites')
        .values(
          Array.from({ length: Math.min(500, sites - start) }, (_, k) => {
            const i = start + k
            return {
              org_id: otherOrgId !== undefined && i % 20 === 19 ? otherOrgId : orgId,
              name: `Bench weir ${String(i).padStart(5, '0')}`,
              river_name: `Bench Water ${i % 40}`,
              lat: 50 + rand() * 8,
              lng: -5 + rand() * 7,
              altitude_m: 100,
              gross_head_m: 1 + rand() * 2,
              target_oxygen_mgl: 6,
              ...siteTemplate,
              deleted_at: i % 97 === 0 ? '2026-01-01T00:00:00.000Z' : null,
            }
          }),
        )
        .returning('id')
        .execute()
      for (const s of inserted) {
        const options = await trx
          .insertInto('options')
          .values([0, 1].map((n) => ({ site_id: s.id, org_id: orgId, name: `Option ${n + 1}`, design: JSON.stringify(option.design), settings: JSON.stringify(option.settings), deleted_at: n === 1 && rand() < 0.1 ? '2026-01-01T00:00:00.000Z' : null })))
          .returning('id')
          .execute()
        // A site in ten has no assessment at all; the others one to three per option.
        if (rand() < 0.1) continue
        const rows = options.flatMap((o) =>
          Array.from({ length: 1 + Math.floor(rand() * 3) }, () => ({
            option_id: o.id, site_id: s.id, org_id: orgId, engine_version: rand() < 0.2 ? '0.0.9' : result.engineVersion,
            ...cols,
            annual_energy_mwh: rand() * 200, capacity_factor: rand(), lcoe: rand() < 0.05 ? null : 50 + rand() * 900, flag_count: Math.floor(rand() * 3),
            created_by: userId,
          })),
        )
        const ids = await trx.insertInto('assessments').values(rows).returning('id').execute()
        await trx.insertInto('assessment_payloads').values(ids.map((a) => ({ assessment_id: a.id, input_json: inputJson, result_json: resultJson }))).execute()
      }
    }
  })
}

export async function portfolioBench(): Promise<BenchFigure[]> {
  const dir = mkdtempSync(join(tmpdir(), 'gillwatt-bench-'))
  const db = openDatabase(join(dir, 'bench.sqlite'))
  try {
    await migrateToLatest(db)
    const org = await db.insertInto('organisations').values({ name: 'Bench organisation (invented)' }).returning('id').executeTakeFirstOrThrow()
    const other = await db.insertInto('organisations').values({ name: 'Another organisation (invented)' }).returning('id').executeTakeFirstOrThrow()
    const user = await db.insertInto('users').values({ email: 'bench@bench.example', name: 'Bench', password_hash: 'x' }).returning('id').executeTakeFirstOrThrow()
    await fillPortfolio(db, { orgId: org.id, otherOrgId: other.id, userId: user.id, sites: SITES })

    const q = (over: Record<string, string>) => PortfolioQuerySchema.parse(over)
    const cases: [string, ReturnType<typeof q>][] = [
      ['first page by name', q({})],
      ['page 50 by annual energy, descending', q({ sort: 'annualEnergy_MWh', dir: 'desc', page: '50' })],
      ['first page by LCOE, cheapest first', q({ sort: 'lcoe' })],
      ['text filter "weir 12" by net oxygen gain', q({ q: 'weir 12', sort: 'netOxygenGainSummerLowFlow_mgL', dir: 'desc' })],
      ['river filter by flags raised', q({ river: 'Bench Water 7', sort: 'flagsRaised', dir: 'desc' })],
    ]
    const figures: BenchFigure[] = []
    let sink = 0
    for (const [name, query] of cases) {
      const ms = await timeAsync(RUNS, async () => {
        const { format: _format, ...pageQuery } = query
        sink += (await loadPortfolio(db, org.id, pageQuery, 'page')).rows.length
      })
      const p95 = percentile(ms, 95)
      figures.push({ name: `portfolio, ${SITES.toLocaleString('en-GB')} sites, ${name}: 95th percentile`, value: p95, unit: 'ms', target: `< ${TARGET_MS} ms`, pass: p95 < TARGET_MS })
    }
    const csvMs = await timeAsync(10, async () => {
      sink += (await allPortfolioRows(db, org.id, q({ sort: 'annualEnergy_MWh' }))).length
    })
    figures.push({ name: 'portfolio, every row of the organisation (CSV export query): median', value: median(csvMs), unit: 'ms', target: '(reported)', pass: true })
    if (sink <= 0) throw new Error('benchmark read no rows')
    return figures
  } finally {
    await db.destroy()
    rmSync(dir, { recursive: true, force: true })
  }
}
