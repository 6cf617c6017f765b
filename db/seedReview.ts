import type { Transaction } from 'kysely'
// The demo's outbox uses the real e-mail templates, so it reads like the real thing.
import { commentMentionMail } from '../server/domain/mail/templates/commentMention'
import { invitationMail } from '../server/domain/mail/templates/invitation'
import { reviewDecidedMail } from '../server/domain/mail/templates/reviewDecided'
import { reviewSubmittedMail } from '../server/domain/mail/templates/reviewSubmitted'
import { hashLinkToken, newLinkToken } from '../server/domain/tokens'
import { REVIEW_STATE_LABELS, siteReviewPath } from '../shared/schemas/review'
import { invitationPath } from '../shared/schemas/invitation'
import { ROLE_LABELS } from '../shared/utils/roles'
import type { Database } from './schema'
import { DEMO_ACCOUNTS, DEMO_INVITATION, DEMO_REVIEW, DEMO_SUMMARY_LINK, DEMO_SUMMARY_TOKEN } from './demo-scenario'
import { monthName } from '../shared/utils/months'

// The review part of the demo scenario (db/demo-scenario.ts): Hollin Mill weir submitted with its
// two-unit assessment, a comment thread, a decision with conditions, the e-mails those produced, a
// summary link with the fixed demo token, and a pending single-site invitation. Each part is added
// only when missing, so running the seed twice changes nothing.

const DAY = 86_400_000
const appUrl = () => (process.env.NUXT_PUBLIC_APP_URL || 'http://localhost:3000').replace(/\/+$/, '')

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
  const org = await trx.selectFrom('organisations').select('name').where('id', '=', orgId).executeTakeFirstOrThrow()
  const site = await trx.selectFrom('sites').selectAll().where('org_id', '=', orgId).where('name', '=', DEMO_REVIEW.siteName).where('deleted_at', 'is', null).executeTakeFirst()
  if (!site) return 0
  let created = 0
  const at = (daysAgo: number, minutes = 0) => new Date(now - daysAgo * DAY + minutes * 60_000).toISOString()
  const mail = async (to: string, m: { subject: string; text: string; html: string }, kind: string, createdAt: string) => {
    await trx.insertInto('outbox').values({ org_id: orgId, to_address: to, ...m, kind, created_at: createdAt }).execute()
    created++
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
    const link = `${appUrl()}${siteReviewPath(site.id)}`
    const submittedAt = at(6)
    await trx
      .insertInto('review_events')
      .values({ site_id: site.id, org_id: orgId, kind: 'submitted', from_state: 'draft', to_state: 'submitted', user_id: engineer.id, assessment_id: assessment.id, note: DEMO_REVIEW.note, created_at: submittedAt })
      .execute()
    await trx.insertInto('audit_log').values({ org_id: orgId, user_id: engineer.id, action: 'review.submitted', target_type: 'site', target_id: site.id, detail: JSON.stringify({ before: { state: 'draft', assessmentId: null }, after: { state: 'submitted', assessmentId: assessment.id } }), created_at: submittedAt }).execute()
    await mail(reviewer.email, reviewSubmittedMail({ siteName: site.name, organisationName: org.name, submitterName: engineer.name, optionName: DEMO_REVIEW.optionName, resubmitted: false, note: DEMO_REVIEW.note, link }), 'review-submitted', submittedAt)
    created++

    let day = 5
    for (const c of DEMO_REVIEW.comments) {
      const author = c.by === 'engineer' ? engineer : reviewer
      const other = c.by === 'engineer' ? reviewer : engineer
      const mentions = c.body.includes(`@${other.name}`) ? [other.id] : []
      const createdAt = at(day--, 30)
      const flagId = 'flagId' in c ? c.flagId : null
      const month = 'month' in c ? c.month : null
      const row = await trx
        .insertInto('comments')
        .values({ site_id: site.id, org_id: orgId, user_id: author.id, body: c.body, month, flag_id: flagId, mentions: JSON.stringify(mentions), created_at: createdAt })
        .returning('id')
        .executeTakeFirstOrThrow()
      created++
      await trx.insertInto('audit_log').values({ org_id: orgId, user_id: author.id, action: 'comment.added', target_type: 'site', target_id: site.id, detail: JSON.stringify({ before: null, after: { commentId: row.id, month, flagId, mentions } }), created_at: createdAt }).execute()
      if (mentions.length) {
        const pointsAt = [month ? monthName(month) : null, flagId ? `the ${flagId} flag` : null].filter(Boolean).join(', ') || null
        await mail(other.email, commentMentionMail({ siteName: site.name, authorName: author.name, body: c.body, pointsAt, link }), 'comment-mention', createdAt)
      }
    }

    const decidedAt = at(1)
    const d = DEMO_REVIEW.decision
    await trx
      .insertInto('review_events')
      .values({ site_id: site.id, org_id: orgId, kind: 'decided', from_state: 'submitted', to_state: d.decision, user_id: reviewer.id, assessment_id: assessment.id, reason: d.reason, conditions: d.conditions, created_at: decidedAt })
      .execute()
    await trx
      .insertInto('site_reviews')
      .values({ site_id: site.id, org_id: orgId, state: d.decision, assessment_id: assessment.id, submitted_by: engineer.id, submitted_at: submittedAt, decided_by: reviewer.id, decided_at: decidedAt, reason: d.reason, conditions: d.conditions, updated_at: decidedAt })
      .execute()
    await trx.insertInto('audit_log').values({ org_id: orgId, user_id: reviewer.id, action: 'review.decided', target_type: 'site', target_id: site.id, detail: JSON.stringify({ before: { state: 'submitted' }, after: { state: d.decision, reason: d.reason, conditions: d.conditions }, assessmentId: assessment.id }), created_at: decidedAt }).execute()
    await mail(engineer.email, reviewDecidedMail({ siteName: site.name, deciderName: reviewer.name, decisionLabel: REVIEW_STATE_LABELS[d.decision], reason: d.reason, conditions: d.conditions, link }), 'review-decided', decidedAt)
    created += 2
  }

  const linkSite = await trx.selectFrom('sites').select('id').where('org_id', '=', orgId).where('name', '=', DEMO_SUMMARY_LINK.siteName).where('deleted_at', 'is', null).executeTakeFirst()
  const tokenHash = hashLinkToken(DEMO_SUMMARY_TOKEN)
  if (linkSite && !(await trx.selectFrom('summary_links').select('id').where('token_hash', '=', tokenHash).executeTakeFirst())) {
    const row = await trx
      .insertInto('summary_links')
      .values({ site_id: linkSite.id, org_id: orgId, token_hash: tokenHash, note: DEMO_SUMMARY_LINK.note, created_by: engineer.id, created_at: at(1, 60), expires_at: new Date(now + DEMO_SUMMARY_LINK.days * DAY).toISOString() })
      .returning(['id', 'expires_at'])
      .executeTakeFirstOrThrow()
    await trx.insertInto('audit_log').values({ org_id: orgId, user_id: engineer.id, action: 'summary-link.created', target_type: 'summary_link', target_id: row.id, detail: JSON.stringify({ before: null, after: { siteId: linkSite.id, expiresAt: row.expires_at, note: DEMO_SUMMARY_LINK.note, demo: true } }) }).execute()
    created++
  }

  const invSite = await trx.selectFrom('sites').select(['id', 'name']).where('org_id', '=', orgId).where('name', '=', DEMO_INVITATION.siteName).where('deleted_at', 'is', null).executeTakeFirst()
  if (invSite && !(await trx.selectFrom('invitations').select('id').where('org_id', '=', orgId).where('email', '=', DEMO_INVITATION.email).executeTakeFirst())) {
    // A real random token, like any invitation: the link is in the demo outbox, nowhere else.
    const token = newLinkToken()
    const expiresAt = new Date(now + 7 * DAY).toISOString()
    const row = await trx
      .insertInto('invitations')
      .values({ org_id: orgId, email: DEMO_INVITATION.email, role: DEMO_INVITATION.role, site_id: invSite.id, token_hash: hashLinkToken(token), invited_by: admin.id, expires_at: expiresAt })
      .returning('id')
      .executeTakeFirstOrThrow()
    await trx.insertInto('audit_log').values({ org_id: orgId, user_id: admin.id, action: 'invitation.created', target_type: 'invitation', target_id: row.id, detail: JSON.stringify({ before: null, after: { email: DEMO_INVITATION.email, role: DEMO_INVITATION.role, siteId: invSite.id, expiresAt } }) }).execute()
    await mail(
      DEMO_INVITATION.email,
      invitationMail({ organisationName: org.name, inviterName: admin.name, roleLabel: ROLE_LABELS[DEMO_INVITATION.role], siteName: invSite.name, link: `${appUrl()}${invitationPath(token)}`, expiresAt }),
      'invitation',
      new Date(now).toISOString(),
    )
    created++
  }
  return created
}
