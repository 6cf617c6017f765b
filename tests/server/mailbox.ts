import Database from 'better-sqlite3'
import { inject } from 'vitest'

// Direct reads of the test server's database: the outbox (where every e-mail lands without SMTP),
// and the links in those e-mails.

let db: Database.Database | undefined
/** The test server's SQLite file, opened beside the server (WAL lets both in). */
export function testDb(): Database.Database {
  if (!db) {
    db = new Database(inject('databasePath'))
    db.pragma('busy_timeout = 5000')
  }
  return db
}

export interface OutboxRow {
  id: number
  org_id: number | null
  to_address: string
  subject: string
  text: string
  html: string
  kind: string
  sent_at: string | null
  error: string | null
}

/** Outbox rows newer than `afterId`, oldest first. */
export function outboxSince(afterId: number): OutboxRow[] {
  return testDb().prepare('select * from outbox where id > ? order by id').all(afterId) as OutboxRow[]
}

/** The newest outbox id (0 when empty), to read what a step adds. */
export function lastOutboxId(): number {
  return (testDb().prepare('select coalesce(max(id), 0) as n from outbox').get() as { n: number }).n
}

/** A token taken from the first app link in a mail text (`/invitations/<t>`, `/reset-password/<t>`). */
export function tokenFromMail(text: string, prefix: string): string {
  const m = new RegExp(`${prefix}/([A-Za-z0-9_-]+)`).exec(text)
  if (!m) throw new Error(`no ${prefix} link in:\n${text}`)
  return m[1]!
}

/** The token of the newest e-mail of `kind` to `to`, from its first `prefix` link. */
export function latestToken(to: string, kind: string, prefix: string): string {
  const row = testDb().prepare('select text from outbox where to_address = ? and kind = ? order by id desc limit 1').get(to, kind) as { text: string } | undefined
  if (!row) throw new Error(`no ${kind} e-mail to ${to}`)
  return tokenFromMail(row.text, prefix)
}
