import { loadAssessmentDetail } from '~~/server/domain/options'
import { AssessmentParamsSchema } from '#shared/schemas/assessment'
import { READER_ROLES } from '#shared/utils/roles'

// One stored assessment: its exact input and whole result as stored, never recomputed, with `stale`
// set when it was computed by another engine version than this server's.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(AssessmentParamsSchema, 'params'))
  await requireAssessment(event, id, READER_ROLES)
  return (await loadAssessmentDetail(useDb(), id))!
})
