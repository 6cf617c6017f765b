import { storedResult } from '~~/server/domain/assessments'
import { assessmentCsv } from '~~/server/domain/assessmentCsv'
import { organisationCurrency } from '~~/server/domain/organisations'
import { AssessmentExportParamsSchema } from '#shared/schemas/assessment'
import { READER_ROLES } from '#shared/utils/roles'

// GET /api/assessments/[id]/export/perFlow.csv | months.csv | summary.csv | depletedReach.csv: one table of the stored
// result as CSV with units in the header, as a download. Every role of the organisation may export.
export default defineEventHandler(async (event) => {
  const { id, table } = await getValidatedRouterParams(event, validator(AssessmentExportParamsSchema, 'params'))
  const { assessment, option } = await requireAssessment(event, id, READER_ROLES)
  const csv = assessmentCsv(await storedResult(useDb(), assessment.id), table, await organisationCurrency(useDb(), option.org_id))
  const safeName = option.name.replace(/[^A-Za-z0-9-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'option'
  setResponseHeader(event, 'Content-Type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'Content-Disposition', `attachment; filename="gillwatt-assessment-${id}-${safeName}-${table}.csv"`)
  return csv
})
