import type { Kysely } from 'kysely'

// Flow rules beside the hands-off flow (`reserved_flow`): the maximum take, the share of the flow that
// stays in the river and the fish- or eel-pass flow, as one JSON text. Every existing site gets the
// rules that change nothing, so its figures stay as they were.
const NO_RULES = JSON.stringify({ preset: 'none', maxTake: { kind: 'none' }, keptShare_pct: 0, passFlow_m3s: 0 })

export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('sites').addColumn('flow_rules', 'text', (c) => c.notNull().defaultTo(NO_RULES)).execute()
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('sites').dropColumn('flow_rules').execute()
}
