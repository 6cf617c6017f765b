import { Migrator } from 'kysely'
import { afterEach, describe, expect, it } from 'vitest'
import { migrateToLatest, openDatabase } from '../../../db/connection'
import { migrationProvider, migrations } from '../../../db/migrations'

// Migration 0007 renames the old camel-case unit names (kept here on purpose) in stored JSON. Rows
// are written as the server wrote them before it, with JSON.stringify.

let db: ReturnType<typeof openDatabase> | undefined
afterEach(async () => {
  await db?.destroy()
  db = undefined
})

const BEFORE = {
  weir: { grossHeadM: 2.4, crestWidthM: 18, shape: 'sharp-crested-vertical-face', waterQuality: 'clean' },
  months: Array.from({ length: 12 }, (_, i) => ({ waterTempC: 5 + i / 3, upstreamOxygen: { value: 95, unit: '%sat' } })),
  catchment: { siteAreaKm2: 148, gaugeAreaKm2: 121 },
  design: { units: 2, throatDiameter_m: 0.5, costs: { fixedCost: 50_000, costPerKw: 3_100, civilsPerUnit: 40_000 } },
  settings: { discountRate: 0.08, lifeYears: 30 },
  result: {
    summary: { annualEnergy_MWh: 180.5, fullLoadHours: 4100.25, flags: [{ id: 'cavitation', reason: 'quoted "fullLoadHours": stays' }] },
    money: { capex: 1, opexPerYear: 2, revenuePerYear: 3, simplePaybackYears: null, carbonAvoidedT: 36.1 },
    defaultsUsed: [{ field: 'option.costs.costPerKw', value: 3000 }, { field: 'settings.lifeYears', value: 25 }, { field: 'settings.alpha', value: 0.8 }],
  },
}

const AFTER = {
  weir: { grossHead_m: 2.4, crestWidth_m: 18, shape: 'sharp-crested-vertical-face', waterQuality: 'clean' },
  months: BEFORE.months.map((m) => ({ waterTemp_C: m.waterTempC, upstreamOxygen: m.upstreamOxygen })),
  catchment: { siteArea_km2: 148, gaugeArea_km2: 121 },
  design: { units: 2, throatDiameter_m: 0.5, costs: { fixedCost: 50_000, ratedPowerPrice: 3_100, civilsPerUnit: 40_000 } },
  settings: { discountRate: 0.08, life_yr: 30 },
  result: {
    summary: { annualEnergy_MWh: 180.5, annualFullLoad_h: 4100.25, flags: [{ id: 'cavitation', reason: 'quoted "fullLoadHours": stays' }] },
    money: { capex: 1, annualOpex: 2, annualRevenue: 3, simplePayback_yr: null, annualCarbonAvoided_t: 36.1 },
    defaultsUsed: [{ field: 'option.costs.ratedPowerPrice', value: 3000 }, { field: 'settings.life_yr', value: 25 }, { field: 'settings.alpha', value: 0.8 }],
  },
}

/** A database at migration 0006 holding one site, option and assessment written with the old names. */
async function storedBeforeTheRename() {
  const d = openDatabase(':memory:')
  const { error } = await new Migrator({ db: d, provider: migrationProvider }).migrateTo('0006_operating_rules')
  if (error) throw error
  const org = await d.insertInto('organisations').values({ name: 'O' }).returning('id').executeTakeFirstOrThrow()
  const site = await d.insertInto('sites').values({
    org_id: org.id, name: 'S', river_name: 'R', lat: 54, lng: -2, altitude_m: 100, gross_head_m: 2.4, target_oxygen_mgl: 6, reach: null,
    weir: JSON.stringify(BEFORE.weir), reserved_flow: JSON.stringify({ kind: 'percentile', exceedance: 95 }), months: JSON.stringify(BEFORE.months),
    catchment: JSON.stringify(BEFORE.catchment), created_by: null, deleted_at: null, deleted_by: null,
  }).returning('id').executeTakeFirstOrThrow()
  const option = await d.insertInto('options').values({
    site_id: site.id, org_id: org.id, name: 'O', design: JSON.stringify(BEFORE.design), settings: JSON.stringify(BEFORE.settings), created_by: null, deleted_at: null, deleted_by: null,
  }).returning('id').executeTakeFirstOrThrow()
  const assessment = await d.insertInto('assessments').values({
    option_id: option.id, site_id: site.id, org_id: org.id, engine_version: 'x', annual_energy_mwh: 180.5, capacity_factor: 0.5, rated_power_kw: 40,
    min_cavitation_margin_m: 1, net_oxygen_gain_slf_mgl: 0.4, lcoe: 90, flags_raised: '[]', flag_count: 0, supersedes_id: null, created_by: null,
  }).returning('id').executeTakeFirstOrThrow()
  await d.insertInto('assessment_payloads').values({
    assessment_id: assessment.id,
    input_json: JSON.stringify({ option: BEFORE.design, settings: BEFORE.settings }),
    result_json: JSON.stringify(BEFORE.result),
  }).execute()
  return d
}

/** Migrates up to `name` only (later migrations rewrite the same JSON: civils per unit, 0010). */
async function migrateTo(d: NonNullable<typeof db>, name: string) {
  const { error } = await new Migrator({ db: d, provider: migrationProvider }).migrateTo(name)
  if (error) throw error
}

async function stored(d: NonNullable<typeof db>) {
  const site = await d.selectFrom('sites').select(['weir', 'months', 'catchment']).executeTakeFirstOrThrow()
  const option = await d.selectFrom('options').select(['design', 'settings']).executeTakeFirstOrThrow()
  const payload = await d.selectFrom('assessment_payloads').select(['input_json', 'result_json']).executeTakeFirstOrThrow()
  return {
    weir: JSON.parse(site.weir),
    months: JSON.parse(site.months),
    catchment: JSON.parse(site.catchment!),
    design: JSON.parse(option.design),
    settings: JSON.parse(option.settings),
    input: JSON.parse(payload.input_json),
    result: JSON.parse(payload.result_json),
  }
}

describe('migration 0007_unit_suffixes', () => {
  it('renames the old keys of stored sites, options and assessments, keeping every value', async () => {
    db = await storedBeforeTheRename()
    await migrateTo(db, '0007_unit_suffixes')
    const after = await stored(db)
    expect(after).toEqual({ ...AFTER, input: { option: AFTER.design, settings: AFTER.settings } })
  })

  it('puts them back when undone', async () => {
    db = await storedBeforeTheRename()
    await migrateTo(db, '0007_unit_suffixes')
    await migrations['0007_unit_suffixes']!.down!(db as never)
    expect(await stored(db)).toEqual({ ...BEFORE, input: { option: BEFORE.design, settings: BEFORE.settings } })
  })

  it('leaves a null catchment null', async () => {
    db = await storedBeforeTheRename()
    await db.updateTable('sites').set({ catchment: null }).execute()
    await migrateToLatest(db)
    expect((await db.selectFrom('sites').select('catchment').executeTakeFirstOrThrow()).catchment).toBeNull()
  })
})
