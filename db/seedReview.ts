import type { Transaction } from 'kysely'
import { recordAudit } from '../server/domain/audit'
import { createInvitation } from '../server/domain/invitations'
import { outboxMailer, type Mailer } from '../server/domain/mail/outbox'
import { addComment, decideReview, submitReview } from '../server/domain/reviewRecords'
import { createSummaryLink } from '../server/domain/summaryLinks'
import { hashLinkToken } from '../server/domain/tokens'
import type { Database } from './schema'
import { DEMO_ACCOUNTS, DEMO_INVITATION, DEMO_REVIEW, DEMO_SUMMARY_LINK, DEMO_SUMMARY_TOKEN } from './demo-scenario'

// The review part of the demo scenario (db/demo-scenario.ts): Hollin Mill weir submitted with its
// two-unit assessment, a comment thread, a decision with conditions, the e-mails those produced, a
// summary link with the fixed demo token, and a pending single-site invitation. Each is stored by
// the same domain operations the routes call, backdated over the past week; the e-mails go to the
// outbox only. Each part is added only when missing, so running the seed twice changes nothing.

const DAY = 86_400_000
const appUrl = () => process.env.NUXT_PUBLIC_APP_URL || 'http://localhost:3000'

/** Adds what is missing of the demo review; returns the number of records created. */
export async function seedReviewDemo(trx: Transaction<Database>, orgId: number, now = Date.now()): Promise<number> {
  const people = new Map<string, { id: number; name: string; email: string }>()
  for (const a of DEMO_ACCOUNTS) {
    const u = await trx.selectFrom('users').select(['id', 'name', 'email']).where('email', '=', a.email).executeTakeFirst()
    if (u) people.set(a.role, u)
  }
  const engineer = people.get('engineer')
  const reviewer = people.get('reviewer')
  const admin = people.get('admin')
  if (!engineer || !reviewer || !admin) return 0
  const site = await trx.selectFrom('sites').selectAll().where('org_id', '=', orgId).where('name', '=', DEMO_REVIEW.siteName).where('deleted_at', 'is', null).executeTakeFirst()
  if (!site) return 0
  let created = 0
  const at = (daysAgo: number, minutes = 0) => new Date(now - daysAgo * DAY + minutes * 60_000).toISOString()
  // Each e-mail is dated when the step that sent it happened, and counts as a record created.
  let mailedAt = new Date(now).toISOString()
  const outbox = outboxMailer(trx, { smtpUrl: '', from: '', appUrl: appUrl(), clock: () => mailedAt })
  const mailer: Mailer = {
    queue: (message) => {
      created++
      return outbox.queue(message)
    },
    link: outbox.link,
  }

  const existingReview = await trx.selectFrom('site_reviews').select('site_id').where('site_id', '=', site.id).executeTakeFirst()
  const assessment = await trx
    .selectFrom('assessments')
    .innerJoin('options', 'options.id', 'assessments.option_id')
    .select(['assessments.id'])
    .where('assessments.site_id', '=', site.id)
    .where('options.name', '=', DEMO_REVIEW.optionName)
    .where('options.deleted_at', 'is', null)
    .orderBy('assessments.id', 'desc')
    .executeTakeFirst()
  if (!existingReview && assessment) {
    const submittedAt = (mailedAt = at(6))
    await submitReview(trx, { site, user: engineer, assessmentId: assessment.id, note: DEMO_REVIEW.note, now: submittedAt, mailer })
    await recordAudit(trx, { orgId, userId: engineer.id, action: 'review.submitted', targetType: 'site', targetId: site.id, detail: { before: { state: 'draft', assessmentId: null }, after: { state: 'submitted', assessmentId: assessment.id } }, at: submittedAt })
    created++

    let day = 5
    for (const c of DEMO_REVIEW.comments) {
      const author = c.by === 'engineer' ? engineer : reviewer
      const createdAt = (mailedAt = at(day--, 30))
      const month = 'month' in c ? c.month : undefined
      const flagId = 'flagId' in c ? c.flagId : undefined
      const { comment, mentions } = await addComment(trx, { site, user: author, input: { body: c.body, month, flagId }, now: createdAt, mailer })
      created++
      await recordAudit(trx, { orgId, userId: author.id, action: 'comment.added', targetType: 'site', targetId: site.id, detail: { before: null, after: { commentId: comment.id, month: month ?? null, flagId: flagId ?? null, mentions } }, at: createdAt })
    }

    const decidedAt = (mailedAt = at(1))
    const d = DEMO_REVIEW.decision
    await decideReview(trx, { site, user: reviewer, decision: d.decision, reason: d.reason, conditions: d.conditions, requiredConsents: d.requiredConsents, now: decidedAt, mailer })
    await recordAudit(trx, {
      orgId,
      userId: reviewer.id,
      action: 'review.decided',
      targetType: 'site',
      targetId: site.id,
      detail: { before: { state: 'submitted' }, after: { state: d.decision, reason: d.reason, conditions: d.conditions }, assessmentId: assessment.id },
      at: decidedAt,
    })
    created += 2
  }

  const linkSite = await trx.selectFrom('sites').select(['id', 'org_id', 'name']).where('org_id', '=', orgId).where('name', '=', DEMO_SUMMARY_LINK.siteName).where('deleted_at', 'is', null).executeTakeFirst()
  if (linkSite && !(await trx.selectFrom('summary_links').select('id').where('token_hash', '=', hashLinkToken(DEMO_SUMMARY_TOKEN)).executeTakeFirst())) {
    const { link } = await createSummaryLink(trx, { site: linkSite, user: engineer, expiresIn_d: DEMO_SUMMARY_LINK.days, note: DEMO_SUMMARY_LINK.note, now: Date.parse(at(1, 60)), token: DEMO_SUMMARY_TOKEN })
    await recordAudit(trx, { orgId, userId: engineer.id, action: 'summary-link.created', targetType: 'summary_link', targetId: link.id, detail: { before: null, after: { siteId: linkSite.id, expiresAt: link.expiresAt, note: DEMO_SUMMARY_LINK.note, demo: true } } })
    created++
  }

  const invSite = await trx.selectFrom('sites').select('id').where('org_id', '=', orgId).where('name', '=', DEMO_INVITATION.siteName).where('deleted_at', 'is', null).executeTakeFirst()
  if (invSite && !(await trx.selectFrom('invitations').select('id').where('org_id', '=', orgId).where('email', '=', DEMO_INVITATION.email).executeTakeFirst())) {
    // A real random token, like any invitation: the link is in the demo outbox, nowhere else.
    mailedAt = new Date(now).toISOString()
    const invitation = await createInvitation(trx, { orgId, inviter: admin, input: { email: DEMO_INVITATION.email, role: DEMO_INVITATION.role, siteId: invSite.id }, now, mailer })
    await recordAudit(trx, {
      orgId,
      userId: admin.id,
      action: 'invitation.created',
      targetType: 'invitation',
      targetId: invitation.id,
      detail: { before: null, after: { email: DEMO_INVITATION.email, role: DEMO_INVITATION.role, siteId: invSite.id, expiresAt: invitation.expiresAt } },
    })
    created++
  }
  return created
}
