import { submitReview } from '~~/server/domain/reviewRecords'
import { REVIEW_SUBMIT_ROLES, ReviewParamsSchema, ReviewSubmitSchema, type ReviewChangeDto } from '#shared/schemas/review'

// Engineers and admins submit a site for review with one of its assessments (again after it was
// returned); its reviewers get an e-mail. Any other state answers 409 naming it.
export default defineEventHandler(async (event): Promise<ReviewChangeDto> => {
  const { id } = await getValidatedRouterParams(event, validator(ReviewParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, REVIEW_SUBMIT_ROLES)
  const { assessmentId, note } = await readValidatedJson(event, ReviewSubmitSchema, BODY_LIMITS.form)
  const { before, ...change } = await submitReview(useDb(), { site, user, assessmentId, note: note || null, now: nowIso(), mailer: useMailer() })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'review.submitted',
    targetType: 'site',
    targetId: site.id,
    detail: { before, after: { state: change.state, assessmentId }, note: note || null, reviewEventId: change.event.id },
  })
  return change
})
