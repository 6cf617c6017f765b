import { loadReviewBrief } from '~~/server/domain/reviewRecords'
import { ReviewParamsSchema, type ReviewBriefDto } from '#shared/schemas/review'
import { READER_ROLES } from '#shared/utils/roles'

// What the reviewer judges, read from the stored result of the assessment under review (never
// recomputed): reserved flow kept, oxygen by month with and without the scheme against the target,
// net gain at summer low flow, and the gas-supersaturation flag with its reason. 409 while draft.
export default defineEventHandler(async (event): Promise<ReviewBriefDto> => {
  const { id } = await getValidatedRouterParams(event, validator(ReviewParamsSchema, 'params'))
  const { site } = await requireSite(event, id, READER_ROLES)
  return loadReviewBrief(useDb(), site)
})
