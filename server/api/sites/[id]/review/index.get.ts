import { loadReview } from '~~/server/domain/reviewRecords'
import { ReviewParamsSchema } from '#shared/schemas/review'
import { READER_ROLES } from '#shared/utils/roles'

// A site's review: its state, the assessment under review, the latest decision and every change.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(ReviewParamsSchema, 'params'))
  const { site, role } = await requireSite(event, id, READER_ROLES)
  return loadReview(useDb(), site, role)
})
