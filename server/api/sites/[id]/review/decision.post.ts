import { reviewDecidedMail } from '../../../../mail/templates/reviewDecided'
import { REVIEW_DECIDE_ROLES, REVIEW_STATE_LABELS, ReviewDecisionSchema, ReviewParamsSchema, siteReviewPath, type ReviewChangeDto } from '../../../../../shared/schemas/review'

// Reviewers (a single-site reviewer on their site) and admins decide a submitted review with a
// reason, and conditions when accepting with conditions; the submitter and the site's engineers
// get an e-mail. Any state but `submitted` answers 409 naming it.
export default defineEventHandler(async (event): Promise<ReviewChangeDto> => {
  const { id } = await getValidatedRouterParams(event, validator(ReviewParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, REVIEW_DECIDE_ROLES)
  const { decision, reason, conditions } = await readValidatedJson(event, ReviewDecisionSchema, BODY_LIMITS.form)
  const db = useDb()
  const at = nowIso()
  const done = await db.transaction().execute(async (trx) => {
    const current = await trx.selectFrom('site_reviews').selectAll().where('site_id', '=', site.id).executeTakeFirst()
    const step = reviewTransition(current?.state ?? 'draft', { kind: 'decide', decision })
    if (!step.ok || !current) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: step.ok ? 'review: the review is draft' : step.message, data: { state: step.from } })
    await trx
      .updateTable('site_reviews')
      .set({ state: step.to, decided_by: user.id, decided_at: at, reason, conditions: conditions ?? null, updated_at: at })
      .where('site_id', '=', site.id)
      .execute()
    const row = await trx
      .insertInto('review_events')
      .values({ site_id: site.id, org_id: site.org_id, kind: 'decided', from_state: step.from, to_state: step.to, user_id: user.id, assessment_id: current.assessment_id, reason, conditions: conditions ?? null, created_at: at })
      .returningAll()
      .executeTakeFirstOrThrow()
    return { row, submittedBy: current.submitted_by }
  })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'review.decided',
    targetType: 'site',
    targetId: site.id,
    detail: { before: { state: done.row.from_state }, after: { state: done.row.to_state, reason, conditions: conditions ?? null }, assessmentId: done.row.assessment_id, reviewEventId: done.row.id },
  })

  const engineers = await membersWithRoles(site.org_id, ['engineer'])
  const submitter = done.submittedBy === null ? [] : await db.selectFrom('users').select(['id', 'name', 'email']).where('id', '=', done.submittedBy).execute()
  const to = uniquePeople([...submitter, ...engineers]).filter((p) => p.id !== user.id)
  const mail = reviewDecidedMail({
    siteName: site.name,
    deciderName: user.name,
    decisionLabel: REVIEW_STATE_LABELS[decision],
    reason,
    conditions: conditions ?? null,
    link: appLink(siteReviewPath(site.id)),
  })
  await sendMails(to.map((p) => ({ to: p.email, ...mail, kind: 'review-decided' as const, orgId: site.org_id })))

  return { state: done.row.to_state, event: reviewEventDto(done.row, new Map([[user.id, user.name]])) }
})
