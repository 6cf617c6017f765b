import { afterEach, describe, expect, it } from 'vitest'
import { databaseAt } from './migrationFixtures'
import { migrateToLatest, type openDatabase } from '../../../db/connection'
import { migrations } from '../../../db/migrations'
import { AssessInputSchema } from '../../../shared/schemas/assess'
import { OptionInputSchema } from '../../../shared/schemas/option'

// Migrations 0006 (operating rules) and 0008 (bubble model) rewrite stored option designs and
// settings: an option stored before them must still open, parse and assess after them.

let db: ReturnType<typeof openDatabase> | undefined
afterEach(async () => {
  await db?.destroy()
  db = undefined
})

/** An option as the server stored it before the operating rules: minimum unit flow, staging, bubble contact. */
const OLD_DESIGN = {
  units: 2, constriction: 'venturi', throatDiameter_m: 0.5, outletDiameter_m: 1, throatDepth_m: 2.5, inletLoss: 0.04,
  minUnitFlowFraction: 0.3, staging: 'sequential',
  air: { pipeDiameter_m: 0.4, pipeLength_m: 8, pipeLossK: 1.5, frictionFactor: 0.02, jetPumpEfficiency: 0.25, maxGasLiquidRatio: 1 },
  turbine: { efficiency: 0.6, generatorEfficiency: 0.92, ratedPower_kW: null, cutInFraction: 0.1 },
  costs: { fixedCost: 50_000, costPerKw: 3_000, civilsPerUnit: 40_000 },
}
const OLD_SETTINGS = {
  availability: 0.95, sotePerMetre: 0.03, oxygenMethod: 'bubble-contact', bubbleDiameter_m: 0.002, slipVelocity_ms: 0.25, plumeTime_s: 2,
  oxygenTarget_mgL: 6, lifeYears: 25,
}

async function storedAt(migration: string) {
  const { db: d, orgId, siteId } = await databaseAt(migration)
  const org = { id: orgId }
  const site = { id: siteId }
  await d.insertInto('options').values({
    site_id: site.id, org_id: org.id, name: 'O', design: JSON.stringify(OLD_DESIGN), settings: JSON.stringify(OLD_SETTINGS), created_by: null, deleted_at: null, deleted_by: null,
  }).execute()
  return d
}

async function storedOption(d: NonNullable<typeof db>) {
  const row = await d.selectFrom('options').select(['design', 'settings']).executeTakeFirstOrThrow()
  return { design: JSON.parse(row.design) as Record<string, unknown>, settings: JSON.parse(row.settings) as Record<string, unknown> }
}

describe('migrations 0006 (operating rules) and 0008 (bubble model)', () => {
  it('give a stored option the default operating rule and the bubble model, and it still parses', async () => {
    db = await storedAt('0005_sessions_verification_throttle')
    await migrateToLatest(db)
    const { design, settings } = await storedOption(db)
    expect(design.operation).toEqual({ mode: 'energy-first', allowedDrawdown_m: 0.05, closedMonths: [] })
    expect(design).not.toHaveProperty('minUnitFlowFraction')
    expect(design).not.toHaveProperty('staging')
    expect(settings).toMatchObject({ acceptableOxygenLoss_mgL: 0.1, oxygenMethod: 'bubble-model', bubbleDiameter_m: 0.003, sotePerMetre: 0.04, life_yr: 25 })
    expect(settings).not.toHaveProperty('slipVelocity_ms')
    expect(settings).not.toHaveProperty('plumeTime_s')
    // the migrated option is one the option schema and the engine accept as they are now
    expect(OptionInputSchema.safeParse({ name: 'O', design, settings }).success).toBe(true)
    const months = Array.from({ length: 12 }, () => ({ temperature_C: 10, upstreamOxygen_mgL: 10 }))
    const input = AssessInputSchema.safeParse({ site: { grossHead_m: 2, months }, hydrology: { kind: 'fdc', points: [{ exceedance: 5, flow: 20 }, { exceedance: 50, flow: 5 }, { exceedance: 95, flow: 1 }] }, option: design, settings })
    expect(input.success).toBe(true)
  })

  it('keep a value the engineer chose (not the old default)', async () => {
    db = await storedAt('0005_sessions_verification_throttle')
    await db.updateTable('options').set({ settings: JSON.stringify({ ...OLD_SETTINGS, bubbleDiameter_m: 0.004, sotePerMetre: 0.05, oxygenMethod: 'field-transfer' }) }).execute()
    await migrateToLatest(db)
    expect((await storedOption(db)).settings).toMatchObject({ bubbleDiameter_m: 0.004, sotePerMetre: 0.05, oxygenMethod: 'field-transfer' })
  })

  it('put the old settings back when undone', async () => {
    db = await storedAt('0005_sessions_verification_throttle')
    await migrateToLatest(db)
    await migrations['0008_bubble_model']!.down!(db as never)
    await migrations['0007_unit_suffixes']!.down!(db as never)
    await migrations['0006_operating_rules']!.down!(db as never)
    const { design, settings } = await storedOption(db)
    expect(design).toMatchObject({ minUnitFlowFraction: 0.3, staging: 'sequential' })
    expect(design).not.toHaveProperty('operation')
    expect(settings).toMatchObject({ oxygenMethod: 'bubble-contact', bubbleDiameter_m: 0.002, sotePerMetre: 0.03, slipVelocity_ms: 0.25, plumeTime_s: 2 })
    expect(settings).not.toHaveProperty('acceptableOxygenLoss_mgL')
  })
})
