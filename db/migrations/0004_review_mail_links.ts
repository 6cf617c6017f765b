import { sql, type Kysely } from 'kysely'

const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`
const REVIEW_STATES = sql`('draft', 'submitted', 'accepted', 'accepted-with-conditions', 'returned')`

// The review of a site (its current state, the history of every change, the comment thread), single-site
// grants for invited reviewers, the outbox of e-mails, invitations, password resets and summary links.
// Every token (invitation, reset, summary link) is stored only as its SHA-256 hash.
export async function up(db: Kysely<unknown>): Promise<void> {
  // One row per site once it has been submitted; a site without one is in `draft`.
  await db.schema
    .createTable('site_reviews')
    .addColumn('site_id', 'integer', (c) => c.primaryKey().references('sites.id').onDelete('cascade'))
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('state', 'text', (c) => c.notNull().check(sql`state in ${REVIEW_STATES}`))
    // The assessment under review: the one last submitted.
    .addColumn('assessment_id', 'integer', (c) => c.references('assessments.id').onDelete('set null'))
    .addColumn('submitted_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('submitted_at', 'text')
    .addColumn('decided_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('decided_at', 'text')
    .addColumn('reason', 'text')
    .addColumn('conditions', 'text')
    .addColumn('updated_at', 'text', (c) => c.notNull().defaultTo(now))
    .execute()
  await db.schema.createIndex('site_reviews_org').on('site_reviews').columns(['org_id', 'state']).execute()

  await db.schema
    .createTable('review_events')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('site_id', 'integer', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('kind', 'text', (c) => c.notNull().check(sql`kind in ('submitted', 'decided')`))
    .addColumn('from_state', 'text', (c) => c.notNull().check(sql`from_state in ${REVIEW_STATES}`))
    .addColumn('to_state', 'text', (c) => c.notNull().check(sql`to_state in ${REVIEW_STATES}`))
    .addColumn('user_id', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('assessment_id', 'integer', (c) => c.references('assessments.id').onDelete('set null'))
    .addColumn('note', 'text')
    .addColumn('reason', 'text')
    .addColumn('conditions', 'text')
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .execute()
  await db.schema.createIndex('review_events_site').on('review_events').columns(['site_id', 'id']).execute()

  await db.schema
    .createTable('comments')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('site_id', 'integer', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('user_id', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('body', 'text', (c) => c.notNull())
    .addColumn('assessment_id', 'integer', (c) => c.references('assessments.id').onDelete('set null'))
    .addColumn('month', 'integer', (c) => c.check(sql`month between 1 and 12`))
    .addColumn('flag_id', 'text')
    // JSON list of the user ids mentioned (and notified).
    .addColumn('mentions', 'text', (c) => c.notNull().defaultTo('[]'))
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .execute()
  await db.schema.createIndex('comments_site').on('comments').columns(['site_id', 'id']).execute()

  // A person who may read and review one site without being a member of its organisation.
  await db.schema
    .createTable('site_grants')
    .addColumn('user_id', 'integer', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('site_id', 'integer', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('role', 'text', (c) => c.notNull().check(sql`role = 'reviewer'`))
    .addColumn('granted_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addPrimaryKeyConstraint('site_grants_pk', ['user_id', 'site_id'])
    .execute()
  await db.schema.createIndex('site_grants_site').on('site_grants').column('site_id').execute()

  // Every e-mail Gillwatt produces. Without SMTP it is the only place mail goes; with SMTP it is the
  // record of what was sent (sent_at) or why it failed (error).
  await db.schema
    .createTable('outbox')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('org_id', 'integer', (c) => c.references('organisations.id').onDelete('cascade'))
    .addColumn('to_address', 'text', (c) => c.notNull())
    .addColumn('subject', 'text', (c) => c.notNull())
    .addColumn('text', 'text', (c) => c.notNull())
    .addColumn('html', 'text', (c) => c.notNull())
    .addColumn('kind', 'text', (c) => c.notNull())
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('sent_at', 'text')
    .addColumn('error', 'text')
    .execute()
  await db.schema.createIndex('outbox_org').on('outbox').columns(['org_id', 'id']).execute()

  await db.schema
    .createTable('invitations')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('role', 'text', (c) => c.notNull().check(sql`role in ('admin', 'engineer', 'reviewer', 'viewer')`))
    // Set for a single-site reviewer invitation.
    .addColumn('site_id', 'integer', (c) => c.references('sites.id').onDelete('cascade'))
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('invited_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('expires_at', 'text', (c) => c.notNull())
    .addColumn('accepted_at', 'text')
    .addColumn('accepted_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('revoked_at', 'text')
    .addColumn('revoked_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .execute()
  await db.schema.createIndex('invitations_org').on('invitations').columns(['org_id', 'id']).execute()

  await db.schema
    .createTable('password_resets')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('user_id', 'integer', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('expires_at', 'text', (c) => c.notNull())
    .addColumn('used_at', 'text')
    .execute()
  await db.schema.createIndex('password_resets_user').on('password_resets').column('user_id').execute()

  // Reset requests per e-mail (existing or not), for the throttle; Unix milliseconds.
  await db.schema
    .createTable('password_reset_requests')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('requested_at', 'integer', (c) => c.notNull())
    .execute()
  await db.schema.createIndex('password_reset_requests_email').on('password_reset_requests').columns(['email', 'requested_at']).execute()

  await db.schema
    .createTable('summary_links')
    .addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
    .addColumn('site_id', 'integer', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('org_id', 'integer', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('note', 'text')
    .addColumn('created_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('expires_at', 'text', (c) => c.notNull())
    .addColumn('revoked_at', 'text')
    .addColumn('revoked_by', 'integer', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('view_count', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('last_viewed_at', 'text')
    .execute()
  await db.schema.createIndex('summary_links_site').on('summary_links').columns(['site_id', 'id']).execute()
  await db.schema.createIndex('summary_links_org').on('summary_links').columns(['org_id', 'id']).execute()
}

export async function down(db: Kysely<unknown>): Promise<void> {
  for (const table of ['summary_links', 'password_reset_requests', 'password_resets', 'invitations', 'outbox', 'site_grants', 'comments', 'review_events', 'site_reviews']) {
    await db.schema.dropTable(table).execute()
  }
}
