import { sql, type Kysely } from 'kysely'

const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`

// The consents and constraints list of a site. `site_consents` holds one row per site and kind of
// permission once someone saves it (a kind without a row is "not started"). `site_constraints` holds
// what the checks need and a permission does not: the nearest dwelling and its noise limit, and
// whether the weir is a gauging station. They are kept out of `sites` so saving them never moves the
// site's version (an engineer editing the overview gets no 409 from a consents edit) and the site
// form stays as it is. A review decision may require permissions: their kinds, as JSON, on the
// review and its history.
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('site_consents')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('site_id', 'integer', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('kind', 'text', (c) => c.notNull())
    .addColumn('status', 'text', (c) =>
      c.notNull().defaultTo('not-started').check(sql`status in ('not-started', 'not-needed', 'applied', 'granted', 'granted-with-conditions', 'refused')`),
    )
    .addColumn('reference', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('applied_on', 'text')
    .addColumn('decided_on', 'text')
    .addColumn('conditions', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('notes', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
    .addColumn('created_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('updated_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('updated_at', 'text', (c) => c.notNull().defaultTo(now))
    .addUniqueConstraint('site_consents_site_kind', ['site_id', 'kind'])
    .execute()

  await db.schema
    .createTable('site_constraints')
    .addColumn('site_id', 'integer', (c) => c.primaryKey().references('sites.id').onDelete('cascade'))
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('nearest_dwelling_m', 'real')
    .addColumn('noise_limit_dba', 'real')
    .addColumn('is_gauging_station', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
    .addColumn('updated_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('updated_at', 'text', (c) => c.notNull().defaultTo(now))
    .execute()

  await db.schema.alterTable('site_reviews').addColumn('required_consents', 'text', (c) => c.notNull().defaultTo('[]')).execute()
  await db.schema.alterTable('review_events').addColumn('required_consents', 'text', (c) => c.notNull().defaultTo('[]')).execute()
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('review_events').dropColumn('required_consents').execute()
  await db.schema.alterTable('site_reviews').dropColumn('required_consents').execute()
  await db.schema.dropTable('site_constraints').execute()
  await db.schema.dropTable('site_consents').execute()
}
