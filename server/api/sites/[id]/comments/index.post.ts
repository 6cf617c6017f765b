import { addComment } from '~~/server/domain/reviewRecords'
import { COMMENT_ROLES, CommentInputSchema, ReviewParamsSchema, type CommentDto } from '#shared/schemas/review'

// Adds a comment to a site's thread; it may point at one of the site's assessments, a month or a
// flag. Members and single-site reviewers mentioned as @e-mail or @full name get an e-mail.
export default defineEventHandler(async (event): Promise<CommentDto> => {
  const { id } = await getValidatedRouterParams(event, validator(ReviewParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, COMMENT_ROLES)
  rateLimit(event, 'comments', user.id)
  const input = await readValidatedJson(event, CommentInputSchema, BODY_LIMITS.form)
  const { comment, mentions } = await addComment(useDb(), { site, user, input, mailer: useMailer() })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'comment.added',
    targetType: 'site',
    targetId: site.id,
    detail: {
      before: null,
      after: { commentId: comment.id, assessmentId: comment.assessmentId, month: comment.month, flagId: comment.flagId, mentions, length: comment.body.length },
    },
  })
  setResponseStatus(event, 201)
  return comment
})
