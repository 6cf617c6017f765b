import { sql } from 'kysely'
import type { AssessResult } from '../../../../../shared/engine/assess'
import { ReviewParamsSchema, type ReviewBriefDto } from '../../../../../shared/schemas/review'
import type { ReservedFlow } from '../../../../../shared/schemas/site'
import { READER_ROLES } from '../../../../../shared/utils/roles'

// What the reviewer judges, read from the stored result of the assessment under review (never
// recomputed): reserved flow kept, oxygen by month with and without the scheme against the target,
// net gain at summer low flow, and the gas-supersaturation flag with its reason. 409 while draft.
export default defineEventHandler(async (event): Promise<ReviewBriefDto> => {
  const { id } = await getValidatedRouterParams(event, validator(ReviewParamsSchema, 'params'))
  const { site } = await requireSite(event, id, READER_ROLES)
  const db = useDb()
  const current = await db.selectFrom('site_reviews').select(['state', 'assessment_id']).where('site_id', '=', site.id).executeTakeFirst()
  if (!current) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'review: the review is draft (not yet submitted): there is no assessment under review', data: { state: 'draft' } })
  }
  const assessment = current.assessment_id === null ? null : await reviewAssessmentRef(site.id, current.assessment_id)
  const payload =
    assessment &&
    (await db
      .selectFrom('assessment_payloads')
      .select(['result_json', sql<string>`json_extract(input_json, '$.reservedFlow')`.as('reserved_json')])
      .where('assessment_id', '=', assessment.id)
      .executeTakeFirst())
  if (!assessment || !payload) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `review: the assessment under review no longer exists (the review is ${current.state}); submit another`, data: { state: current.state } })
  }
  const result = JSON.parse(payload.result_json) as AssessResult
  const setting = (payload.reserved_json ? JSON.parse(payload.reserved_json) : JSON.parse(site.reserved_flow)) as ReservedFlow
  return { siteId: site.id, siteName: site.name, assessment, ...reviewBrief(result, setting) }
})
