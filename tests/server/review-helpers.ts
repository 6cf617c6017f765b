import Database from 'better-sqlite3'
import { expect, inject } from 'vitest'
import { Client, signUp } from './client'
import { createAssessment, createOption } from './options-helpers'
import { createSite } from './sites-helpers'

// Shared by the review, mail, invitation, summary-link and password-reset tests: a team whose
// people's e-mails and ids are known, a site with a stored assessment, and direct reads and writes
// of the test database (expiry dates, the outbox).

export interface Person {
  client: Client
  email: string
  id: number
  name: string
}

export type TeamRole = 'admin' | 'engineer' | 'reviewer' | 'viewer' | 'outsider'

/** An organisation with one person of each role, plus an outsider with an organisation of their own. */
export async function makePeople(tag: string) {
  const owner = await signUp(`${tag}-admin`)
  const people = { admin: { client: owner.client, email: owner.email, id: owner.user.id, name: `Test ${tag}-admin` } } as Record<TeamRole, Person>
  for (const role of ['engineer', 'reviewer', 'viewer'] as const) {
    const p = await signUp(`${tag}-${role}`)
    const added = await owner.client.post(`/api/orgs/${owner.orgId}/members`, { email: p.email, role })
    expect(added.status).toBe(201)
    people[role] = { client: p.client, email: p.email, id: p.user.id, name: `Test ${tag}-${role}` }
  }
  const out = await signUp(`${tag}-outsider`)
  people.outsider = { client: out.client, email: out.email, id: out.user.id, name: `Test ${tag}-outsider` }
  return { orgId: owner.orgId, outsiderOrgId: out.orgId, ...people }
}

/** A site of the organisation with one option and one stored assessment, made by `engineer`. */
export async function siteWithAssessment(engineer: Client, orgId: number, name = 'Review weir') {
  const site = await createSite(engineer, orgId, { name })
  const option = await createOption(engineer, site.id)
  const assessment = await createAssessment(engineer, option.id)
  return { siteId: site.id, optionId: option.id, assessmentId: assessment.id as number }
}

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

/** ISO time `days` days ago. */
export const daysAgo = (days: number) => new Date(Date.now() - days * 86_400_000).toISOString()
