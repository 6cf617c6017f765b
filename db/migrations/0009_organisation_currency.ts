import type { Kysely } from 'kysely'

// Each organisation names the currency its money figures are in (an ISO 4217 code and the symbol
// shown beside amounts). Nothing is converted: the engine works in one unnamed currency and the app
// labels its amounts with this. Existing organisations get pounds sterling, the currency the cost
// defaults were worked in.
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('organisations').addColumn('currency_code', 'text', (c) => c.notNull().defaultTo('GBP')).execute()
  await db.schema.alterTable('organisations').addColumn('currency_symbol', 'text', (c) => c.notNull().defaultTo('£')).execute()
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('organisations').dropColumn('currency_symbol').execute()
  await db.schema.alterTable('organisations').dropColumn('currency_code').execute()
}
