import { sql, type Kysely } from 'kysely'

const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`

// Design options of a site and the stored assessments of each option. An assessment keeps the exact
// engine input it ran (defaults filled in), the engine version and the whole result (in
// assessment_payloads), plus the headline figures as columns so lists, the portfolio and the
// comparison sort without reading the JSON.
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('options')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('site_id', 'integer', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('name', 'text', (c) => c.notNull().modifyEnd(sql`collate nocase`))
    .addColumn('notes', 'text', (c) => c.notNull().defaultTo(''))
    // JSON text, validated by shared/schemas/option.ts on the way in: the engine's option and settings.
    .addColumn('design', 'text', (c) => c.notNull())
    .addColumn('settings', 'text', (c) => c.notNull())
    .addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
    .addColumn('created_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('updated_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('deleted_at', 'text')
    .addColumn('deleted_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .execute()
  await db.schema.createIndex('options_site').on('options').columns(['site_id', 'id']).where(sql.ref('deleted_at'), 'is', null).execute()
  // An organisation's live option ids, so "is this option live?" never reads the wide option rows.
  await db.schema.createIndex('options_live').on('options').columns(['org_id', 'id']).where(sql.ref('deleted_at'), 'is', null).execute()

  await db.schema
    .createTable('assessments')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('option_id', 'integer', (c) => c.notNull().references('options.id').onDelete('cascade'))
    .addColumn('site_id', 'integer', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('engine_version', 'text', (c) => c.notNull())
    // Headline figures, copied from result.summary for sorting.
    .addColumn('annual_energy_mwh', 'real', (c) => c.notNull())
    .addColumn('capacity_factor', 'real', (c) => c.notNull())
    .addColumn('rated_power_kw', 'real', (c) => c.notNull())
    .addColumn('min_cavitation_margin_m', 'real')
    .addColumn('net_oxygen_gain_slf_mgl', 'real', (c) => c.notNull())
    .addColumn('lcoe', 'real')
    // JSON list of the ids of the flags raised, and their count (for sorting).
    .addColumn('flags_raised', 'text', (c) => c.notNull().defaultTo('[]'))
    .addColumn('flag_count', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('supersedes_id', 'integer', (c) => c.references('assessments.id').onDelete('set null'))
    .addColumn('created_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .execute()
  // The exact AssessInput the engine ran (after defaults) and its whole AssessResult, JSON text. Kept
  // in their own table: with a century of daily flows an input runs to megabytes, and beside the
  // headline columns it would spread the portfolio's 10,000 look-ups over as many pages.
  await db.schema
    .createTable('assessment_payloads')
    .addColumn('assessment_id', 'integer', (c) => c.primaryKey().references('assessments.id').onDelete('cascade'))
    .addColumn('input_json', 'text', (c) => c.notNull())
    .addColumn('result_json', 'text', (c) => c.notNull())
    .execute()

  // The portfolio reads every live site of an organisation; this covering index holds all it needs of
  // a site, so the 10,000 look-ups never touch the wide site rows (months, reach, FDC JSON).
  await db.schema
    .createIndex('sites_portfolio')
    .on('sites')
    .columns(['org_id', 'deleted_at', 'id', 'name', 'river_name', 'lat', 'lng', 'gross_head_m'])
    .execute()
  // Each site's latest assessment (the portfolio) and each option's, newest first: read backwards by id.
  // option_id rides along so the portfolio's "latest of a live option" reads the index alone.
  await db.schema.createIndex('assessments_site_latest').on('assessments').columns(['site_id', 'id', 'option_id']).execute()
  await db.schema.createIndex('assessments_option_latest').on('assessments').columns(['option_id', 'id']).execute()
  // An assessment is re-run at most once; the re-run of a re-run continues the chain.
  await db.schema
    .createIndex('assessments_supersedes')
    .on('assessments')
    .column('supersedes_id')
    .unique()
    .where(sql.ref('supersedes_id'), 'is not', null)
    .execute()
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropIndex('sites_portfolio').execute()
  await db.schema.dropTable('assessment_payloads').execute()
  await db.schema.dropTable('assessments').execute()
  await db.schema.dropTable('options').execute()
}
