import type { Client } from './client'
import { addMember, signUp } from './client'
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
    await addMember(owner.client, owner.orgId, p, role)
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

export { lastOutboxId, outboxSince, testDb, tokenFromMail, type OutboxRow } from './mailbox'

/** ISO time `days` days ago. */
export const daysAgo = (days: number) => new Date(Date.now() - days * 86_400_000).toISOString()
