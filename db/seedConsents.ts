import type { Transaction } from 'kysely'
import { updateConsent, updateConstraints } from '../server/domain/consents'
import type { Database } from './schema'
import { DEMO_CONSENTS } from './demo-scenario'

// The consents part of the demo scenario (db/demo-scenario.ts): each demo site's consents list and
// constraints, stored by the domain operations the routes call, as the engineer. A site that already
// has any permission or constraints saved is left alone, so running the seed twice changes nothing.

/** Adds the demo consents lists that are missing; returns the number of records created. */
export async function seedConsentsDemo(trx: Transaction<Database>, orgId: number, userId: number, now = new Date().toISOString()): Promise<number> {
  let created = 0
  for (const demo of DEMO_CONSENTS) {
    const site = await trx.selectFrom('sites').select(['id', 'org_id']).where('org_id', '=', orgId).where('name', '=', demo.siteName).where('deleted_at', 'is', null).executeTakeFirst()
    if (!site) continue
    const [hasConsent, hasConstraints] = await Promise.all([
      trx.selectFrom('site_consents').select('id').where('site_id', '=', site.id).executeTakeFirst(),
      trx.selectFrom('site_constraints').select('site_id').where('site_id', '=', site.id).executeTakeFirst(),
    ])
    if (hasConsent || hasConstraints) continue
    await updateConstraints(trx, { site, patch: { version: 0, ...demo.constraints }, userId, now })
    created++
    for (const c of demo.consents) {
      const { kind, ...fields } = c
      await updateConsent(trx, { site, kind, patch: { version: 0, ...fields }, userId, now })
      created++
    }
  }
  return created
}
