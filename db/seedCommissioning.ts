import type { Transaction } from 'kysely'
import { commissioningBasis, storeCommissioningRecord } from '../server/domain/commissioning'
import { commissioningCheck } from '../shared/engine/commissioning'
import { ENGINE_VERSION } from '../shared/engine/version'
import { CommissioningInputSchema } from '../shared/schemas/commissioning'
import type { Database } from './schema'
import { DEMO_ACCOUNTS, DEMO_COMMISSIONING } from './demo-scenario'

/**
 * Stores the demo commissioning record against the demo option's stored assessment (the real engine,
 * in process, as the server's worker would run it) unless the site has a record already; returns the
 * records created. A missing site or option is left alone.
 */
export async function seedCommissioningDemo(trx: Transaction<Database>, orgId: number): Promise<number> {
  const demo = DEMO_COMMISSIONING
  const site = await trx.selectFrom('sites').select(['id', 'org_id']).where('org_id', '=', orgId).where('name', '=', demo.siteName).where('deleted_at', 'is', null).executeTakeFirst()
  if (!site) return 0
  if (await trx.selectFrom('commissioning_records').select('id').where('site_id', '=', site.id).executeTakeFirst()) return 0
  const assessment = await trx
    .selectFrom('assessments')
    .innerJoin('options', 'options.id', 'assessments.option_id')
    .select('assessments.id')
    .where('assessments.site_id', '=', site.id)
    .where('options.name', '=', demo.optionName)
    .where('options.deleted_at', 'is', null)
    .orderBy('assessments.id', 'desc')
    .executeTakeFirst()
  if (!assessment) return 0
  const body = CommissioningInputSchema.parse({ ...demo.record, assessmentId: assessment.id })
  const { optionId, input } = await commissioningBasis(trx, site.id, assessment.id)
  const engineer = DEMO_ACCOUNTS.find((a) => a.role === 'engineer')!
  const user = await trx.selectFrom('users').select('id').where('email', '=', engineer.email).executeTakeFirst()
  await storeCommissioningRecord(trx, {
    siteId: site.id, orgId: site.org_id, optionId, userId: user?.id ?? null, input: body, result: commissioningCheck(input, body), engineVersion: ENGINE_VERSION,
  })
  return 1
}
