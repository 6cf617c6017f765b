import { sql, type Kysely } from 'kysely'

// Server-side sessions (a sealed cookie names one; ending the row ends the session), e-mail
// verification, the organisation each person last chose, and one throttle table for sign-in,
// sign-up, password-reset and invitation attempts (replacing the two per-e-mail tables).
const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`

export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('sessions')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('user_id', 'integer', (c) => c.notNull().references('users.id').onDelete('cascade'))
    // SHA-256 of the random session key the sealed cookie carries; the key itself is never stored.
    .addColumn('key_hash', 'text', (c) => c.notNull().unique())
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('last_seen_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('user_agent', 'text', (c) => c.notNull().defaultTo(''))
    .execute()
  await db.schema.createIndex('sessions_user').on('sessions').column('user_id').execute()

  await db.schema.alterTable('users').addColumn('email_verified_at', 'text').execute()
  await db.schema.alterTable('users').addColumn('last_org_id', 'integer', (c) => c.references('organisations.id').onDelete('set null')).execute()

  await db.schema
    .createTable('email_verifications')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('user_id', 'integer', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('expires_at', 'text', (c) => c.notNull())
    .addColumn('used_at', 'text')
    .execute()
  await db.schema.createIndex('email_verifications_user').on('email_verifications').column('user_id').execute()

  await db.schema
    .createTable('throttle_hits')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    // What is counted ('sign-in-failure', 'password-reset', …) and for whom (an account and address, an address).
    .addColumn('bucket', 'text', (c) => c.notNull())
    .addColumn('key', 'text', (c) => c.notNull())
    /** Unix time in milliseconds. */
    .addColumn('at', 'integer', (c) => c.notNull())
    .execute()
  await db.schema.createIndex('throttle_hits_key').on('throttle_hits').columns(['bucket', 'key', 'at']).execute()
  await db.schema.createIndex('throttle_hits_at').on('throttle_hits').column('at').execute()

  await db.schema.dropTable('sign_in_failures').execute()
  await db.schema.dropTable('password_reset_requests').execute()
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('sign_in_failures')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('failed_at', 'integer', (c) => c.notNull())
    .execute()
  await db.schema.createIndex('sign_in_failures_email').on('sign_in_failures').columns(['email', 'failed_at']).execute()
  await db.schema
    .createTable('password_reset_requests')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('requested_at', 'integer', (c) => c.notNull())
    .execute()
  await db.schema.createIndex('password_reset_requests_email').on('password_reset_requests').columns(['email', 'requested_at']).execute()
  await db.schema.dropTable('throttle_hits').execute()
  await db.schema.dropTable('email_verifications').execute()
  await db.schema.alterTable('users').dropColumn('last_org_id').execute()
  await db.schema.alterTable('users').dropColumn('email_verified_at').execute()
  await db.schema.dropTable('sessions').execute()
}
