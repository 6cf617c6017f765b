import { afterEach, describe, expect, it } from 'vitest'
import { databaseAt } from './migrationFixtures'
import { migrateToLatest, type openDatabase } from '../../../db/connection'
import { migrations } from '../../../db/migrations'

// Migrations 0012 (the Monte Carlo's P50/P90 energy and chance of a net oxygen loss, and the record's
// P90 year, as assessment columns) and 0013 (the conventional turbine's energy), on runs stored as the
// server stored them before: one with both, one from an entered curve with draws set to 0, and one
// from before engine 0.3.0 (neither key).

let db: ReturnType<typeof openDatabase> | undefined
afterEach(async () => {
  await db?.destroy()
  db = undefined
})

const spread = (p90: number, p50: number, p10: number) => ({ p90, p50, p10 })

/** A database at 0011 with one site, one option and three assessments whose stored results differ as said above. */
async function storedBefore() {
  const { db: d, orgId, siteId } = await databaseAt('0011_assessment_money')
  const org = { id: orgId }
  const site = { id: siteId }
  const option = await d.insertInto('options').values({
    site_id: site.id, org_id: org.id, name: 'A', design: '{}', settings: '{}', created_by: null, deleted_at: null, deleted_by: null,
  }).returning('id').executeTakeFirstOrThrow()
  const store = async (result: unknown) => {
    const a = await d.insertInto('assessments').values({
      option_id: option.id, site_id: site.id, org_id: org.id, engine_version: 'x', annual_energy_mwh: 20, capacity_factor: 0.3, rated_power_kw: 8,
      min_cavitation_margin_m: 3, net_oxygen_gain_slf_mgl: 0.1, lcoe: 1_830, flags_raised: '[]', flag_count: 0, supersedes_id: null, created_by: null,
    }).returning('id').executeTakeFirstOrThrow()
    await d.insertInto('assessment_payloads').values({ assessment_id: a.id, input_json: '{}', result_json: JSON.stringify(result) }).execute()
  }
  await store({
    money: { capex: 1, npv: 2 },
    baseline: { annualEnergy_MWh: 346.5 },
    uncertainty: { draws: 200, energy_MWh: spread(16.5, 19.75, 22), worstMonthNetGain_mgL: spread(-0.2, 0.1, 0.3), netLossProbability: 0.215 },
    years: { p50Energy_MWh: 20.5, p90Energy_MWh: 14.25, years: [] },
  })
  await store({ money: { capex: 1, npv: 2 }, uncertainty: null, years: { p50Energy_MWh: 20.5, p90Energy_MWh: null, years: [] } })
  await store({ money: { capex: 1, npv: 2 } })
  return d
}

const COLUMNS = ['energy_p50_mwh', 'energy_p90_mwh', 'net_loss_probability', 'record_p90_mwh'] as const

describe('uncertainty migration 0012', () => {
  it('copies each stored run\'s P50/P90 energy, chance of a net oxygen loss and record P90 year into its columns, null where the run had none', async () => {
    db = await storedBefore()
    await migrateToLatest(db)
    expect(await db.selectFrom('assessments').select(COLUMNS).orderBy('id').execute()).toEqual([
      { energy_p50_mwh: 19.75, energy_p90_mwh: 16.5, net_loss_probability: 0.215, record_p90_mwh: 14.25 },
      { energy_p50_mwh: null, energy_p90_mwh: null, net_loss_probability: null, record_p90_mwh: null },
      { energy_p50_mwh: null, energy_p90_mwh: null, net_loss_probability: null, record_p90_mwh: null },
    ])
  })

  it('drops the columns again when undone, keeping the rows and their other figures', async () => {
    db = await storedBefore()
    await migrateToLatest(db)
    await migrations['0012_assessment_uncertainty']!.down!(db as never)
    const columns = (await db.introspection.getTables()).find((t) => t.name === 'assessments')!.columns.map((c) => c.name)
    for (const c of COLUMNS) expect(columns).not.toContain(c)
    expect(columns).toContain('npv')
    expect(await db.selectFrom('assessments').select('annual_energy_mwh').execute()).toHaveLength(3)
  })
})

describe('baseline migration 0013', () => {
  it('copies each stored run\'s conventional-turbine energy into its column, null for a run stored before the baseline', async () => {
    db = await storedBefore()
    await migrateToLatest(db)
    expect((await db.selectFrom('assessments').select('baseline_energy_mwh').orderBy('id').execute()).map((r) => r.baseline_energy_mwh)).toEqual([346.5, null, null])
    await migrations['0013_assessment_baseline']!.down!(db as never)
    const columns = (await db.introspection.getTables()).find((t) => t.name === 'assessments')!.columns.map((c) => c.name)
    expect(columns).not.toContain('baseline_energy_mwh')
    expect(columns).toContain('energy_p90_mwh')
  })
})
