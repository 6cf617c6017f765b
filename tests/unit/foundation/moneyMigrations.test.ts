import { afterEach, describe, expect, it } from 'vitest'
import { databaseAt } from './migrationFixtures'
import { migrateToLatest, type openDatabase } from '../../../db/connection'
import { migrations } from '../../../db/migrations'
import { unitCapacity } from '../../../shared/engine/venturi'
import { OptionInputSchema } from '../../../shared/schemas/option'

// Migrations 0009 (an organisation's currency), 0010 (civils priced per m³/s of design flow instead
// of per unit) and 0011 (capex and NPV as assessment columns), on rows written as the server wrote
// them before, with the old name `civilsPerUnit` kept here on purpose.

let db: ReturnType<typeof openDatabase> | undefined
afterEach(async () => {
  await db?.destroy()
  db = undefined
})

const HEAD_m = 2.4
const design = (civilsPerUnit: number) => ({
  units: 2, constriction: 'venturi', throatDiameter_m: 0.5, outletDiameter_m: 1, throatDepth_m: 2.5, inletLoss: 0.04,
  air: { pipeDiameter_m: 0.4, pipeLength_m: 8 }, turbine: { ratedPower_kW: null },
  operation: { mode: 'energy-first', allowedDrawdown_m: 0.05, closedMonths: [] },
  costs: { fixedCost: 50_000, ratedPowerPrice: 3_000, civilsPerUnit },
})
/** One unit of `design` full at the gross head, m³/s (the engine's unit capacity: Q = C·A_t·√(2gH/K)). */
const capacity = unitCapacity(HEAD_m, { throatDiameter_m: 0.5, outletDiameter_m: 1, inletLoss: 0.04, diffuserEfficiency: 0.88, flowCoefficient: 0.98 })

/** A database at 0008 with one organisation, a site, two options (civils at the old default, and the engineer's own) and an assessment of the second. */
async function storedBefore() {
  const { db: d, orgId, siteId } = await databaseAt('0008_bubble_model', { gross_head_m: HEAD_m })
  const org = { id: orgId }
  const site = { id: siteId }
  const option = (name: string, civils: number) => d.insertInto('options').values({
    site_id: site.id, org_id: org.id, name, design: JSON.stringify(design(civils)), settings: '{}', created_by: null, deleted_at: null, deleted_by: null,
  }).returning('id').executeTakeFirstOrThrow()
  await option('at the old default', 40_000)
  const own = await option('own figure', 55_000)
  const a = await d.insertInto('assessments').values({
    option_id: own.id, site_id: site.id, org_id: org.id, engine_version: 'x', annual_energy_mwh: 20, capacity_factor: 0.3, rated_power_kw: 8,
    min_cavitation_margin_m: 3, net_oxygen_gain_slf_mgl: 0.1, lcoe: 1_830, flags_raised: '[]', flag_count: 0, supersedes_id: null, created_by: null,
  }).returning('id').executeTakeFirstOrThrow()
  await d.insertInto('assessment_payloads').values({
    assessment_id: a.id,
    input_json: JSON.stringify({ site: { grossHead_m: HEAD_m }, option: design(55_000), flows: [1, 2, 3] }),
    result_json: JSON.stringify({ money: { capex: 184_000, npv: -169_000 } }),
  }).execute()
  return d
}

async function costsOf(d: NonNullable<typeof db>) {
  const rows = await d.selectFrom('options').select(['name', 'design']).orderBy('id').execute()
  return Object.fromEntries(rows.map((r) => [r.name, (JSON.parse(r.design) as { costs: Record<string, number> }).costs]))
}

describe('money migrations 0009–0011', () => {
  it('give every existing organisation pounds sterling', async () => {
    db = await storedBefore()
    await migrateToLatest(db)
    expect(await db.selectFrom('organisations').select(['currency_code', 'currency_symbol']).execute()).toEqual([{ currency_code: 'GBP', currency_symbol: '£' }])
    // and a new organisation gets them too, unless it says otherwise
    await db.insertInto('organisations').values({ name: 'New' }).execute()
    expect((await db.selectFrom('organisations').select('currency_code').where('name', '=', 'New').executeTakeFirstOrThrow()).currency_code).toBe('GBP')
  })

  it('move civils at the old default to the new one, and keep an engineer\'s own civil cost as it was', async () => {
    db = await storedBefore()
    await migrateToLatest(db)
    const costs = await costsOf(db)
    expect(costs['at the old default']).toEqual({ fixedCost: 50_000, ratedPowerPrice: 3_000, civilsPerDesignFlow: 78_000 })
    // 55 000 per unit × 2 units = civils per m³/s × 2 units × one unit's capacity at the gross head
    const perFlow = costs['own figure']!.civilsPerDesignFlow!
    expect(perFlow).toBe(Math.round(55_000 / capacity))
    expect(Math.abs(perFlow * 2 * capacity - 110_000)).toBeLessThan(2 * capacity)
    for (const c of Object.values(costs)) expect(c).not.toHaveProperty('civilsPerUnit')
    // The migrated option is one the schema takes as it is now.
    const row = await db.selectFrom('options').select('design').where('name', '=', 'own figure').executeTakeFirstOrThrow()
    expect(OptionInputSchema.safeParse({ name: 'O', design: JSON.parse(row.design) }).success).toBe(true)
  })

  it('rewrite the stored input of a past assessment the same way, leaving the rest of it alone', async () => {
    db = await storedBefore()
    await migrateToLatest(db)
    const input = JSON.parse((await db.selectFrom('assessment_payloads').select('input_json').executeTakeFirstOrThrow()).input_json)
    expect(input.option.costs).toEqual({ fixedCost: 50_000, ratedPowerPrice: 3_000, civilsPerDesignFlow: Math.round(55_000 / capacity) })
    expect(input.flows).toEqual([1, 2, 3])
    expect(input.site).toEqual({ grossHead_m: HEAD_m })
  })

  it('copy each stored run\'s capex and NPV into its columns', async () => {
    db = await storedBefore()
    await migrateToLatest(db)
    expect(await db.selectFrom('assessments').select(['capex', 'npv']).execute()).toEqual([{ capex: 184_000, npv: -169_000 }])
  })

  it('put civils per unit back when undone', async () => {
    db = await storedBefore()
    await migrateToLatest(db)
    await migrations['0011_assessment_money']!.down!(db as never)
    await migrations['0010_civils_per_design_flow']!.down!(db as never)
    await migrations['0009_organisation_currency']!.down!(db as never)
    const costs = await costsOf(db)
    expect(costs['at the old default']).toEqual({ fixedCost: 50_000, ratedPowerPrice: 3_000, civilsPerUnit: 40_000 })
    // Back to within a rounding of the engineer's figure (the per-m³/s price was rounded to whole units).
    expect(Math.abs(costs['own figure']!.civilsPerUnit! - 55_000)).toBeLessThanOrEqual(1)
    const input = JSON.parse((await db.selectFrom('assessment_payloads').select('input_json').executeTakeFirstOrThrow()).input_json)
    expect(input.option.costs).not.toHaveProperty('civilsPerDesignFlow')
    const columns = (await db.introspection.getTables()).find((t) => t.name === 'organisations')!.columns.map((c) => c.name)
    expect(columns).not.toContain('currency_code')
  })
})
