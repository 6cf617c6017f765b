import { afterEach, describe, expect, it } from 'vitest'
import { databaseAt } from './migrationFixtures'
import { migrateToLatest, type openDatabase } from '../../../db/connection'
import { migrations } from '../../../db/migrations'
import { FlowRulesSchema, NO_FLOW_RULES } from '../../../shared/schemas/flowRules'

// Migration 0014 gives every site stored before flow rules the rules that change nothing (the hands-off
// flow, its reserved flow, alone), so its figures stay as they were.

let db: ReturnType<typeof openDatabase> | undefined
afterEach(async () => {
  await db?.destroy()
  db = undefined
})

describe('flow rules migration 0014', () => {
  it('gives a site stored before it no rule beyond its hands-off flow, and keeps the hands-off flow', async () => {
    const at = await databaseAt('0013_assessment_baseline')
    db = at.db
    const before = await db.selectFrom('sites').select('reserved_flow').where('id', '=', at.siteId).executeTakeFirstOrThrow()
    await migrateToLatest(db)
    const after = await db.selectFrom('sites').select(['reserved_flow', 'flow_rules']).where('id', '=', at.siteId).executeTakeFirstOrThrow()
    expect(after.reserved_flow).toBe(before.reserved_flow)
    expect(FlowRulesSchema.parse(JSON.parse(after.flow_rules))).toEqual(NO_FLOW_RULES)
  })

  it('drops the column again when undone, keeping the site', async () => {
    const at = await databaseAt('0013_assessment_baseline')
    db = at.db
    await migrateToLatest(db)
    await migrations['0014_flow_rules']!.down!(db as never)
    const columns = (await db.introspection.getTables()).find((t) => t.name === 'sites')!.columns.map((c) => c.name)
    expect(columns).not.toContain('flow_rules')
    expect(columns).toContain('reserved_flow')
    expect(await db.selectFrom('sites').select('id').execute()).toHaveLength(1)
  })
})
