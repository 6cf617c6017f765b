import { sql, type Kysely } from 'kysely'

const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`

// Sites with their reach, weir, months and hydrology inputs; each site's daily flow record
// (one row a day, WITHOUT ROWID so the 36,525 days of a century sit in the primary-key b-tree)
// and the record's summary; attachments (photos, drawings) kept in the uploads storage.
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('sites')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    // Scalar columns: what the list sorts and filters by. NOCASE so "brackwin" sorts beside "Brackwin".
    .addColumn('name', 'text', (c) => c.notNull().modifyEnd(sql`collate nocase`))
    .addColumn('river_name', 'text', (c) => c.notNull().modifyEnd(sql`collate nocase`))
    .addColumn('lat', 'real', (c) => c.notNull())
    .addColumn('lng', 'real', (c) => c.notNull())
    .addColumn('altitude_m', 'real', (c) => c.notNull())
    .addColumn('gross_head_m', 'real', (c) => c.notNull())
    .addColumn('target_oxygen_mgl', 'real', (c) => c.notNull())
    // JSON text, validated by shared/schemas/site.ts on the way in.
    .addColumn('reach', 'text')
    .addColumn('weir', 'text', (c) => c.notNull())
    .addColumn('head_table', 'text', (c) => c.notNull().defaultTo('[]'))
    .addColumn('reserved_flow', 'text', (c) => c.notNull())
    .addColumn('months', 'text', (c) => c.notNull())
    .addColumn('catchment', 'text')
    .addColumn('fdc_points', 'text', (c) => c.notNull().defaultTo('[]'))
    .addColumn('notes', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
    .addColumn('created_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('updated_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('deleted_at', 'text')
    .addColumn('deleted_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .execute()
  // The list pages through one organisation's live sites in a chosen order: one partial index per
  // sort key, id last so pages are stable; the deleted list has its own.
  for (const [name, column] of [
    ['name', 'name'],
    ['river', 'river_name'],
    ['head', 'gross_head_m'],
    ['created', 'created_at'],
    ['updated', 'updated_at'],
  ] as const) {
    await db.schema
      .createIndex(`sites_org_${name}`)
      .on('sites')
      .columns(['org_id', column, 'id'])
      .where(sql.ref('deleted_at'), 'is', null)
      .execute()
  }
  await db.schema
    .createIndex('sites_org_deleted')
    .on('sites')
    .columns(['org_id', 'deleted_at', 'id'])
    .where(sql.ref('deleted_at'), 'is not', null)
    .execute()

  await db.schema
    .createTable('flow_days')
    .addColumn('site_id', 'integer', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('day', 'text', (c) => c.notNull())
    // Gauged flow as uploaded, m³/s (before any area-ratio scaling); null marks a gap.
    .addColumn('flow', 'real')
    .addPrimaryKeyConstraint('flow_days_pk', ['site_id', 'day'])
    .modifyEnd(sql`without rowid`)
    .execute()

  await db.schema
    .createTable('flow_records')
    .addColumn('site_id', 'integer', (c) => c.primaryKey().references('sites.id').onDelete('cascade'))
    .addColumn('file_name', 'text', (c) => c.notNull())
    .addColumn('uploaded_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('uploaded_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('date_column', 'text', (c) => c.notNull())
    .addColumn('flow_column', 'text', (c) => c.notNull())
    .addColumn('flag_column', 'text')
    .addColumn('date_format', 'text', (c) => c.notNull().check(sql`date_format in ('iso', 'day-first')`))
    .addColumn('day_count', 'integer', (c) => c.notNull())
    .addColumn('gap_count', 'integer', (c) => c.notNull())
    .addColumn('first_day', 'text', (c) => c.notNull())
    .addColumn('last_day', 'text', (c) => c.notNull())
    // Area-ratio scaling applied when the flows are read: Q_site = Q_gauge · site / gauge.
    .addColumn('site_area_km2', 'real')
    .addColumn('gauge_area_km2', 'real')
    .addColumn('scale_factor', 'real', (c) => c.notNull().defaultTo(1))
    // Statistics of the site flows, kept so the site and its list need not read every day.
    .addColumn('q95', 'real')
    .addColumn('q50', 'real')
    .addColumn('q10', 'real')
    .addColumn('mean_flow', 'real')
    .execute()

  await db.schema
    .createTable('attachments')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('site_id', 'integer', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('storage_key', 'text', (c) => c.notNull().unique())
    .addColumn('original_name', 'text', (c) => c.notNull())
    .addColumn('content_type', 'text', (c) => c.notNull())
    .addColumn('size_bytes', 'integer', (c) => c.notNull())
    .addColumn('uploaded_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('deleted_at', 'text')
    .execute()
  await db.schema.createIndex('attachments_site').on('attachments').columns(['site_id', 'id']).execute()
}

export async function down(db: Kysely<unknown>): Promise<void> {
  for (const table of ['attachments', 'flow_records', 'flow_days', 'sites']) {
    await db.schema.dropTable(table).execute()
  }
}
