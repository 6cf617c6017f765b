import type { Kysely } from 'kysely'

// Operating rules (how the units are run): every stored option gains the default rule (energy first,
// 0.05 m allowed drawdown, no closed months) in place of the minimum unit flow and staging that level
// control replaces, and its settings the acceptable oxygen loss (0.1 mg/L); comments that pointed at
// the old "never runs" flag id point at its new name. Rows are rewritten one by one in JavaScript, so
// the migration reads the same on any database.
const OPERATION = { mode: 'energy-first', allowedDrawdown_m: 0.05, closedMonths: [] as number[] }
const ACCEPTABLE_LOSS_mgL = 0.1

interface Db {
  options: { id: number, design: string, settings: string }
  comments: { id: number, flag_id: string | null }
}

export async function up(raw: Kysely<unknown>): Promise<void> {
  const db = raw as unknown as Kysely<Db>
  const rows = await db.selectFrom('options').select(['id', 'design', 'settings']).execute()
  for (const r of rows) {
    const design = JSON.parse(r.design) as Record<string, unknown>
    const settings = JSON.parse(r.settings) as Record<string, unknown>
    delete design.minUnitFlowFraction
    delete design.staging
    design.operation ??= { ...OPERATION }
    settings.acceptableOxygenLoss_mgL ??= ACCEPTABLE_LOSS_mgL
    await db.updateTable('options').set({ design: JSON.stringify(design), settings: JSON.stringify(settings) }).where('id', '=', r.id).execute()
  }
  await db.updateTable('comments').set({ flag_id: 'never-runs' }).where('flag_id', '=', 'head-limited-never-runs').execute()
}

export async function down(raw: Kysely<unknown>): Promise<void> {
  const db = raw as unknown as Kysely<Db>
  const rows = await db.selectFrom('options').select(['id', 'design', 'settings']).execute()
  for (const r of rows) {
    const design = JSON.parse(r.design) as Record<string, unknown>
    const settings = JSON.parse(r.settings) as Record<string, unknown>
    delete design.operation
    design.minUnitFlowFraction = 0.3
    design.staging = 'sequential'
    delete settings.acceptableOxygenLoss_mgL
    await db.updateTable('options').set({ design: JSON.stringify(design), settings: JSON.stringify(settings) }).where('id', '=', r.id).execute()
  }
  await db.updateTable('comments').set({ flag_id: 'head-limited-never-runs' }).where('flag_id', '=', 'never-runs').execute()
}
