import { listComments } from '~~/server/domain/reviewRecords'
import { CommentListQuerySchema, ReviewParamsSchema, type CommentListDto } from '#shared/schemas/review'
import { READER_ROLES } from '#shared/utils/roles'

// A site's comment thread, oldest first, paged.
export default defineEventHandler(async (event): Promise<CommentListDto> => {
  const { id } = await getValidatedRouterParams(event, validator(ReviewParamsSchema, 'params'))
  const { site } = await requireSite(event, id, READER_ROLES)
  const { page, pageSize } = await getValidatedQuery(event, validator(CommentListQuerySchema, 'query'))
  return { page, pageSize, ...(await listComments(useDb(), site.id, page, pageSize)) }
})
