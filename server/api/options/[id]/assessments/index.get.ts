import { listAssessments } from '~~/server/domain/options'
import { OptionParamsSchema } from '#shared/schemas/option'
import { AssessmentListQuerySchema, type AssessmentListDto } from '#shared/schemas/assessment'
import { READER_ROLES } from '#shared/utils/roles'

// The stored assessments of an option, newest first, without their tables; every role reads.
export default defineEventHandler(async (event): Promise<AssessmentListDto> => {
  const { id } = await getValidatedRouterParams(event, validator(OptionParamsSchema, 'params'))
  await requireOption(event, id, READER_ROLES)
  const query = await getValidatedQuery(event, validator(AssessmentListQuerySchema, 'query'))
  return listAssessments(useDb(), id, query)
})
