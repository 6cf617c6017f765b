import { decideReview } from '~~/server/domain/reviewRecords'
import { REVIEW_DECIDE_ROLES, ReviewDecisionSchema, ReviewParamsSchema, type ReviewChangeDto } from '#shared/schemas/review'

// Reviewers (a single-site reviewer on their site) and admins decide a submitted review with a
// reason, and conditions when accepting with conditions; the submitter and the site's engineers
// get an e-mail. Any state but `submitted` answers 409 naming it.
export default defineEventHandler(async (event): Promise<ReviewChangeDto> => {
  const { id } = await getValidatedRouterParams(event, validator(ReviewParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, REVIEW_DECIDE_ROLES)
  const { decision, reason, conditions, requiredConsents } = await readValidatedJson(event, ReviewDecisionSchema, BODY_LIMITS.form)
  const change = await decideReview(useDb(), { site, user, decision, reason, conditions: conditions ?? null, requiredConsents, now: nowIso(), mailer: useMailer() })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'review.decided',
    targetType: 'site',
    targetId: site.id,
    detail: { before: { state: change.event.from }, after: { state: change.event.to, reason, conditions: conditions ?? null, requiredConsents }, assessmentId: change.event.assessmentId, reviewEventId: change.event.id },
  })
  return change
})
