import { sql, type Kysely } from 'kysely'

// Users, organisations, role memberships, the audit trail and the sign-in throttle.
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('users')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('email', 'text', (c) => c.notNull().unique())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('password_hash', 'text', (c) => c.notNull())
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`))
    .execute()

  await db.schema
    .createTable('organisations')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`))
    .execute()

  await db.schema
    .createTable('memberships')
    .addColumn('user_id', 'integer', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('role', 'text', (c) => c.notNull().check(sql`role in ('admin', 'engineer', 'reviewer', 'viewer')`))
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`))
    .addPrimaryKeyConstraint('memberships_pk', ['user_id', 'org_id'])
    .execute()
  await db.schema.createIndex('memberships_org').on('memberships').column('org_id').execute()

  await db.schema
    .createTable('audit_log')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('org_id', 'integer', (c) => c.references('organisations.id').onDelete('cascade'))
    .addColumn('user_id', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('action', 'text', (c) => c.notNull())
    .addColumn('target_type', 'text')
    .addColumn('target_id', 'integer')
    .addColumn('detail', 'text')
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`))
    .execute()
  await db.schema.createIndex('audit_log_org_time').on('audit_log').columns(['org_id', 'id']).execute()

  await db.schema
    .createTable('sign_in_failures')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('failed_at', 'integer', (c) => c.notNull())
    .execute()
  await db.schema.createIndex('sign_in_failures_email').on('sign_in_failures').columns(['email', 'failed_at']).execute()
}

export async function down(db: Kysely<unknown>): Promise<void> {
  for (const table of ['sign_in_failures', 'audit_log', 'memberships', 'organisations', 'users']) {
    await db.schema.dropTable(table).execute()
  }
}
