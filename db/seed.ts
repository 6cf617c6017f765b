import type { Kysely, Transaction } from 'kysely'
import { fdcFromRecord, fdcStats } from '../shared/engine/hydrology'
import type { Database } from './schema'
import { assess } from '../shared/engine/assess'
import { OptionInputSchema } from '../shared/schemas/option'
import { buildAssessInput, insertAssessment, loadStoredRecord, storedOption } from './assessmentInput'
import { seedReviewDemo } from './seedReview'
import { DEMO_ACCOUNTS, DEMO_ORGANISATION, DEMO_OPTIONS, DEMO_PASSWORD, DEMO_PENDING_ACCOUNT, DEMO_SITES, DEMO_VERIFIED_AT, demoDailyFlows, type DemoOption, type DemoSite } from './demo-scenario'

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
      org = await trx.insertInto('organisations').values({ name: DEMO_ORGANISATION }).returning('id').executeTakeFirstOrThrow()
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
  const row = await trx
    .insertInto('sites')
    .values({
      org_id: orgId,
      created_by: userId,
      name: site.name,
      river_name: site.riverName,
      lat: site.location.lat,
      lng: site.location.lng,
      altitude_m: site.altitudeM,
      gross_head_m: site.weir.grossHeadM,
      target_oxygen_mgl: site.targetOxygenMgL,
      reach: site.reach ? JSON.stringify(site.reach) : null,
      weir: JSON.stringify(site.weir),
      head_table: JSON.stringify(site.headTable),
      reserved_flow: JSON.stringify(site.reservedFlow),
      months: JSON.stringify(site.months),
      catchment: site.catchment ? JSON.stringify(site.catchment) : null,
      fdc_points: JSON.stringify(site.fdcPoints),
      notes: site.notes,
    })
    .returning('id')
    .executeTakeFirstOrThrow()
  if (!demo.record) return 1
  const days = demoDailyFlows(demo.record)
  for (let i = 0; i < days.length; i += 2000) {
    await trx
      .insertInto('flow_days')
      .values(days.slice(i, i + 2000).map((d) => ({ site_id: row.id, day: d.date, flow: d.flow })))
      .execute()
  }
  const stats = fdcStats(fdcFromRecord(days))
  await trx
    .insertInto('flow_records')
    .values({
      site_id: row.id,
      file_name: demo.record.fileName,
      uploaded_by: userId,
      date_column: 'date',
      flow_column: 'flow_m3s',
      flag_column: null,
      date_format: 'iso',
      day_count: days.length,
      gap_count: days.filter((d) => d.flow === null).length,
      first_day: days[0]!.date,
      last_day: days.at(-1)!.date,
      site_area_km2: null,
      gauge_area_km2: null,
      scale_factor: 1,
      q95: stats.q95,
      q50: stats.q50,
      q10: stats.q10,
      mean_flow: stats.mean,
    })
    .execute()
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
    option = await trx
      .insertInto('options')
      .values({ site_id: site.id, org_id: orgId, name: input.name, notes: input.notes, design: JSON.stringify(input.design), settings: JSON.stringify(input.settings), created_by: userId })
      .returningAll()
      .executeTakeFirstOrThrow()
    created++
  }
  const stored = await trx.selectFrom('assessments').select('id').where('option_id', '=', option.id).executeTakeFirst()
  if (stored) return created
  const engineInput = buildAssessInput(site, await loadStoredRecord(trx, site.id), storedOption(option))
  await insertAssessment(trx, { option, userId, input: engineInput, result: assess(engineInput), supersedesId: null })
  return created + 1
}
