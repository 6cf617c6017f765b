import type { Kysely, Transaction } from 'kysely'
import { buildAssessInput, insertAssessment, loadStoredRecord, storedOption } from '../server/domain/assessments'
import { saveFlowRecord } from '../server/domain/flowRecords'
import { createOptionFromInput } from '../server/domain/options'
import { createSite } from '../server/domain/sites'
import { assessWithUncertainty } from '../shared/engine/assess'
import { OptionInputSchema } from '../shared/schemas/option'
import type { Database } from './schema'
import { seedReviewDemo } from './seedReview'
import { seedConsentsDemo } from './seedConsents'
import { seedCommissioningDemo } from './seedCommissioning'
import { DEMO_ACCOUNTS, DEMO_CURRENCY, DEMO_ORGANISATION, DEMO_OPTIONS, DEMO_PASSWORD, DEMO_PENDING_ACCOUNT, DEMO_SITES, DEMO_VERIFIED_AT, demoDailyFlows, type DemoOption, type DemoSite } from './demo-scenario'

/** Hashes a password the same way the server does (nuxt-auth-utils' scrypt). */
export type PasswordHasher = (password: string) => Promise<string>

/**
 * Loads the invented demo scenario. Safe to run twice: people are matched by e-mail, the
 * organisation and its sites by name (deleted sites included), and nothing already there is
 * changed or duplicated. `created` counts the new organisation, people, sites and flow records.
 */
export async function seedDemo(db: Kysely<Database>, hash: PasswordHasher): Promise<{ orgId: number; created: number }> {
  const passwordHash = await hash(DEMO_PASSWORD)
  return db.transaction().execute(async (trx) => {
    let created = 0
    let org = await trx.selectFrom('organisations').select('id').where('name', '=', DEMO_ORGANISATION).executeTakeFirst()
    if (!org) {
      org = await trx.insertInto('organisations').values({ name: DEMO_ORGANISATION, currency_code: DEMO_CURRENCY.code, currency_symbol: DEMO_CURRENCY.symbol }).returning('id').executeTakeFirstOrThrow()
      created++
    }
    for (const account of DEMO_ACCOUNTS) {
      let user = await trx.selectFrom('users').select('id').where('email', '=', account.email).executeTakeFirst()
      if (!user) {
        user = await trx
          .insertInto('users')
          .values({ email: account.email, name: account.name, password_hash: passwordHash, email_verified_at: DEMO_VERIFIED_AT, last_org_id: org.id })
          .returning('id')
          .executeTakeFirstOrThrow()
        created++
      }
      await trx
        .insertInto('memberships')
        .values({ user_id: user.id, org_id: org.id, role: account.role })
        .onConflict((oc) => oc.columns(['user_id', 'org_id']).doNothing())
        .execute()
    }
    // A pending account: signed up, address not yet confirmed, so it belongs to no organisation
    // and the app asks it to confirm its address.
    if (!(await trx.selectFrom('users').select('id').where('email', '=', DEMO_PENDING_ACCOUNT.email).executeTakeFirst())) {
      await trx.insertInto('users').values({ email: DEMO_PENDING_ACCOUNT.email, name: DEMO_PENDING_ACCOUNT.name, password_hash: passwordHash }).execute()
      created++
    }
    const engineer = DEMO_ACCOUNTS.find((a) => a.role === 'engineer')!
    const engineerId = (await trx.selectFrom('users').select('id').where('email', '=', engineer.email).executeTakeFirstOrThrow()).id
    for (const demo of DEMO_SITES) created += await seedSite(trx, org.id, engineerId, demo)
    for (const demo of DEMO_OPTIONS) created += await seedOption(trx, org.id, engineerId, demo)
    created += await seedReviewDemo(trx, org.id)
    created += await seedConsentsDemo(trx, org.id, engineerId)
    created += await seedCommissioningDemo(trx, org.id)
    if (created) {
      await trx.insertInto('audit_log').values({ org_id: org.id, user_id: null, action: 'demo.seeded', detail: JSON.stringify({ accounts: DEMO_ACCOUNTS.length, sites: DEMO_SITES.length }) }).execute()
    }
    return { orgId: org.id, created }
  })
}

/** Adds one demo site (and its generated flow record) unless the organisation has one by that name; returns the records created. */
async function seedSite(trx: Transaction<Database>, orgId: number, userId: number, demo: DemoSite): Promise<number> {
  const { site } = demo
  const found = await trx.selectFrom('sites').select('id').where('org_id', '=', orgId).where('name', '=', site.name).executeTakeFirst()
  if (found) return 0
  const row = await createSite(trx, { orgId, userId, input: site })
  if (!demo.record) return 1
  // Stored as an upload of the generated days would be (gauged flows, no scaling).
  await saveFlowRecord(trx, row.id, 'replace', demoDailyFlows(demo.record), [], {
    fileName: demo.record.fileName,
    uploadedBy: userId,
    uploadedAt: new Date().toISOString(),
    dateColumn: 'date',
    flowColumn: 'flow_m3s',
    flagColumn: null,
    dateFormat: 'iso',
    scale: null,
  })
  return 2
}

/**
 * Adds one demo option to its demo site unless the site already has a live option by that name, and
 * stores one assessment of it (the real engine, on the input the server would build) unless it has
 * one; returns the records created. A missing or deleted site is left alone.
 */
async function seedOption(trx: Transaction<Database>, orgId: number, userId: number, demo: DemoOption): Promise<number> {
  const site = await trx.selectFrom('sites').selectAll().where('org_id', '=', orgId).where('name', '=', demo.siteName).where('deleted_at', 'is', null).executeTakeFirst()
  if (!site) return 0
  let created = 0
  const input = OptionInputSchema.parse(demo.option)
  let option = await trx.selectFrom('options').selectAll().where('site_id', '=', site.id).where('name', '=', input.name).where('deleted_at', 'is', null).executeTakeFirst()
  if (!option) {
    option = await createOptionFromInput(trx, site, userId, input)
    created++
  }
  const stored = await trx.selectFrom('assessments').select('id').where('option_id', '=', option.id).executeTakeFirst()
  if (stored) return created
  const engineInput = buildAssessInput(site, await loadStoredRecord(trx, site.id), storedOption(option))
  await insertAssessment(trx, { option, userId, input: engineInput, result: assessWithUncertainty(engineInput), supersedesId: null })
  return created + 1
}
