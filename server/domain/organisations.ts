import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'
import type { Currency, OrganisationSettings, OrganisationSettingsDto } from '../../shared/schemas/organisation'
import { notFound } from './errors'
import { inTransaction } from './transaction'

// Organisations: starting one, with the person who starts it as its first admin; its settings (the
// currency its money figures are shown in).

/** Stores a new organisation with `adminId` as its admin; returns its id and name. */
export async function createOrganisation(db: Kysely<Database>, args: { name: string; adminId: number }): Promise<{ id: number; name: string }> {
  return inTransaction(db, async (trx) => {
    const org = await trx.insertInto('organisations').values({ name: args.name }).returning(['id', 'name']).executeTakeFirstOrThrow()
    await trx.insertInto('memberships').values({ user_id: args.adminId, org_id: org.id, role: 'admin' }).execute()
    return org
  })
}

/** An organisation's settings; 404 when it is gone. */
export async function organisationSettings(db: Kysely<Database>, orgId: number): Promise<OrganisationSettingsDto> {
  const row = await db.selectFrom('organisations').select(['id', 'name', 'currency_code', 'currency_symbol']).where('id', '=', orgId).executeTakeFirst()
  if (!row) throw notFound('Organisation not found')
  return { orgId: row.id, name: row.name, currency: { code: row.currency_code, symbol: row.currency_symbol } }
}

/** The currency an organisation's money figures are in (for CSVs and summaries built on the server). */
export async function organisationCurrency(db: Kysely<Database>, orgId: number): Promise<Currency> {
  return (await organisationSettings(db, orgId)).currency
}

/** Changes an organisation's settings; answers them before and after (for the audit line). */
export async function updateOrganisationSettings(
  db: Kysely<Database>,
  orgId: number,
  settings: OrganisationSettings,
): Promise<{ before: OrganisationSettingsDto; after: OrganisationSettingsDto }> {
  return inTransaction(db, async (trx) => {
    const before = await organisationSettings(trx, orgId)
    await trx.updateTable('organisations').set({ currency_code: settings.currency.code, currency_symbol: settings.currency.symbol }).where('id', '=', orgId).execute()
    return { before, after: await organisationSettings(trx, orgId) }
  })
}
