import type { Kysely } from 'kysely'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { migrateToLatest, openDatabase } from '../../../db/connection'
import { DEMO_COMMISSIONING } from '../../../db/demo-scenario'
import type { Database } from '../../../db/schema'
import { seedDemo } from '../../../db/seed'
import { latestCommissioningLine, listCommissioning } from '../../../server/domain/commissioning'

// The demo's commissioning record: stored once against the demo option's assessment, with its verdicts.
let db: Kysely<Database>
let siteId: number

beforeAll(async () => {
  db = openDatabase(':memory:')
  await migrateToLatest(db)
  await seedDemo(db, async (pw) => `fake:${pw}`)
  siteId = (await db.selectFrom('sites').select('id').where('name', '=', DEMO_COMMISSIONING.siteName).executeTakeFirstOrThrow()).id
}, 120_000)
afterAll(async () => db.destroy())

describe('demo commissioning record', () => {
  it('is stored once, against the option named, and performs as assessed', async () => {
    const again = await seedDemo(db, async (pw) => `fake:${pw}`)
    expect(again.created).toBe(0)
    const { records } = await listCommissioning(db, siteId)
    expect(records).toHaveLength(1)
    const r = records[0]!
    expect(r).toMatchObject({ optionName: DEMO_COMMISSIONING.optionName, measuredBy: DEMO_COMMISSIONING.record.measuredBy, manometerDensity_kgm3: 13546 })
    expect(r.result.flowVerdict.kind).toBe('as-assessed')
    expect(r.result.oxygenVerdict.kind).toBe('as-assessed')
    expect((await latestCommissioningLine(db, siteId))?.sentence).toBe('Measured on 14 October 2026: performs as assessed')
  })
})
