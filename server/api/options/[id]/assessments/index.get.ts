import { AssessmentListQuerySchema, OptionParamsSchema, type AssessmentListDto } from '../../../../../shared/schemas/option'
import { READER_ROLES } from '../../../../../shared/utils/roles'

// The stored assessments of an option, newest first, without their tables; every role reads.
export default defineEventHandler(async (event): Promise<AssessmentListDto> => {
  const { id } = await getValidatedRouterParams(event, validator(OptionParamsSchema, 'params'))
  await requireOption(event, id, READER_ROLES)
  const query = await getValidatedQuery(event, validator(AssessmentListQuerySchema, 'query'))
  const db = useDb()
  const [rows, total] = await Promise.all([
    db
      .selectFrom('assessments')
      .select(selectAssessmentSummary)
      .where('assessments.option_id', '=', id)
      .orderBy('assessments.id', 'desc')
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize)
      .execute(),
    db.selectFrom('assessments').select((eb) => eb.fn.countAll<number>().as('n')).where('option_id', '=', id).executeTakeFirstOrThrow(),
  ])
  return { optionId: id, page: query.page, pageSize: query.pageSize, total: Number(total.n), assessments: rows.map(assessmentDto) }
})
