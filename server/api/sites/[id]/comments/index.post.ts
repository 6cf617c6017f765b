import { commentMentionMail } from '../../../../mail/templates/commentMention'
import { COMMENT_ROLES, CommentInputSchema, ReviewParamsSchema, siteReviewPath, type CommentDto } from '../../../../../shared/schemas/review'

// Adds a comment to a site's thread; it may point at one of the site's assessments, a month or a
// flag. Members and single-site reviewers mentioned as @e-mail or @full name get an e-mail.
export default defineEventHandler(async (event): Promise<CommentDto> => {
  const { id } = await getValidatedRouterParams(event, validator(ReviewParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, COMMENT_ROLES)
  rateLimit(event, 'comments', user.id)
  const input = await readValidatedJson(event, CommentInputSchema, BODY_LIMITS.form)
  if (input.assessmentId !== undefined && !(await reviewAssessmentRef(site.id, input.assessmentId))) {
    throw createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message: 'assessmentId: is not an assessment of this site' })
  }
  const mentioned = findMentions(input.body, await siteReaders(site)).filter((p) => p.id !== user.id)
  const row = await useDb()
    .insertInto('comments')
    .values({
      site_id: site.id,
      org_id: site.org_id,
      user_id: user.id,
      body: input.body,
      assessment_id: input.assessmentId ?? null,
      month: input.month ?? null,
      flag_id: input.flagId ?? null,
      mentions: JSON.stringify(mentioned.map((p) => p.id)),
    })
    .returningAll()
    .executeTakeFirstOrThrow()
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'comment.added',
    targetType: 'site',
    targetId: site.id,
    detail: {
      before: null,
      after: { commentId: row.id, assessmentId: row.assessment_id, month: row.month, flagId: row.flag_id, mentions: mentioned.map((p) => p.id), length: row.body.length },
    },
  })
  const link = appLink(siteReviewPath(site.id))
  const pointsAt = commentPointsAt({ assessmentId: row.assessment_id, month: row.month, flagId: input.flagId ?? null })
  const mail = commentMentionMail({ siteName: site.name, authorName: user.name, body: row.body, pointsAt, link })
  await sendMails(mentioned.map((p) => ({ to: p.email, ...mail, kind: 'comment-mention' as const, orgId: site.org_id })))
  setResponseStatus(event, 201)
  return (await commentDtos([row]))[0]!
})
