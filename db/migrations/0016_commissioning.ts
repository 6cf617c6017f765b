import { sql, type Kysely } from 'kysely'

const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`

// Commissioning records: measurements on a built scheme (a manometer reading on a unit's throat
// differential, oxygen upstream and downstream) set against the stored assessment they check, with
// the figures and verdicts the engine computed at the time and its version. Removing one marks it
// deleted; the row stays as the record of what was measured and by whom.
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('commissioning_records')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('site_id', 'integer', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('option_id', 'integer', (c) => c.references('options.id').onDelete('set null'))
    .addColumn('assessment_id', 'integer', (c) => c.references('assessments.id').onDelete('set null'))
    // When it was measured, as the person wrote it (local date-time, optionally with its offset).
    .addColumn('measured_at', 'text', (c) => c.notNull())
    .addColumn('measured_by', 'text', (c) => c.notNull())
    .addColumn('entered_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('river_flow_m3s', 'real', (c) => c.notNull())
    .addColumn('water_temp_c', 'real', (c) => c.notNull())
    .addColumn('manometer_fluid', 'text', (c) => c.notNull().check(sql`manometer_fluid in ('water', 'mercury', 'gauge-oil', 'custom')`))
    .addColumn('manometer_density_kgm3', 'real', (c) => c.notNull())
    .addColumn('reading_m', 'real', (c) => c.notNull())
    .addColumn('reading_unit', 'text', (c) => c.notNull().check(sql`reading_unit in ('m-of-manometer-fluid', 'm-of-water')`))
    .addColumn('upstream_tap_diameter_m', 'real')
    .addColumn('discharge_coefficient', 'real')
    .addColumn('upstream_oxygen_mgl', 'real', (c) => c.notNull())
    .addColumn('downstream_oxygen_mgl', 'real', (c) => c.notNull())
    .addColumn('oxygen_measured_at', 'text', (c) => c.notNull().check(sql`oxygen_measured_at in ('unit-outlet', 'below-weir')`))
    .addColumn('notes', 'text', (c) => c.notNull().defaultTo(''))
    // The verdicts as columns for lists; the whole computed check (measured and assessed figures) as JSON.
    .addColumn('flow_verdict', 'text', (c) => c.notNull())
    .addColumn('oxygen_verdict', 'text', (c) => c.notNull())
    .addColumn('result_json', 'text', (c) => c.notNull())
    .addColumn('engine_version', 'text', (c) => c.notNull())
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('deleted_at', 'text')
    .addColumn('deleted_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .execute()
  await db.schema.createIndex('commissioning_records_site').on('commissioning_records').columns(['site_id', 'measured_at']).execute()
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('commissioning_records').execute()
}
