import { reviewSubmittedMail } from '../../../../mail/templates/reviewSubmitted'
import { REVIEW_SUBMIT_ROLES, ReviewParamsSchema, ReviewSubmitSchema, siteReviewPath, type ReviewChangeDto } from '../../../../../shared/schemas/review'

// Engineers and admins submit a site for review with one of its assessments (again after it was
// returned); its reviewers get an e-mail. Any other state answers 409 naming it.
export default defineEventHandler(async (event): Promise<ReviewChangeDto> => {
  const { id } = await getValidatedRouterParams(event, validator(ReviewParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, REVIEW_SUBMIT_ROLES)
  const { assessmentId, note } = await readValidatedJson(event, ReviewSubmitSchema, BODY_LIMITS.form)
  const assessment = await reviewAssessmentRef(site.id, assessmentId)
  if (!assessment) {
    throw createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message: 'assessmentId: is not an assessment of this site' })
  }
  const db = useDb()
  const at = nowIso()
  const event_ = await db.transaction().execute(async (trx) => {
    const current = await trx.selectFrom('site_reviews').selectAll().where('site_id', '=', site.id).executeTakeFirst()
    const step = reviewTransition(current?.state ?? 'draft', { kind: 'submit' })
    if (!step.ok) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: step.message, data: { state: step.from } })
    const values = { state: step.to, assessment_id: assessmentId, submitted_by: user.id, submitted_at: at, decided_by: null, decided_at: null, reason: null, conditions: null, updated_at: at }
    if (current) await trx.updateTable('site_reviews').set(values).where('site_id', '=', site.id).execute()
    else await trx.insertInto('site_reviews').values({ site_id: site.id, org_id: site.org_id, ...values }).execute()
    const row = await trx
      .insertInto('review_events')
      .values({ site_id: site.id, org_id: site.org_id, kind: 'submitted', from_state: step.from, to_state: step.to, user_id: user.id, assessment_id: assessmentId, note: note || null, created_at: at })
      .returningAll()
      .executeTakeFirstOrThrow()
    return { row, before: current ? { state: current.state, assessmentId: current.assessment_id } : { state: 'draft' as const, assessmentId: null } }
  })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'review.submitted',
    targetType: 'site',
    targetId: site.id,
    detail: { before: event_.before, after: { state: event_.row.to_state, assessmentId }, note: note || null, reviewEventId: event_.row.id },
  })

  const org = await db.selectFrom('organisations').select('name').where('id', '=', site.org_id).executeTakeFirstOrThrow()
  const reviewers = (await siteReviewers(site)).filter((r) => r.id !== user.id)
  const mail = reviewSubmittedMail({
    siteName: site.name,
    organisationName: org.name,
    submitterName: user.name,
    optionName: assessment.optionName,
    resubmitted: event_.before.state === 'returned',
    note: note || null,
    link: appLink(siteReviewPath(site.id)),
  })
  await sendMails(reviewers.map((r) => ({ to: r.email, ...mail, kind: 'review-submitted' as const, orgId: site.org_id })))

  return { state: event_.row.to_state, event: reviewEventDto(event_.row, new Map([[user.id, user.name]])) }
})
