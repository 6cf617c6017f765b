import { compareOptions } from '~~/server/domain/options'
import { CompareQuerySchema, type CompareDto } from '#shared/schemas/compare'

// 2 to 6 options side by side, from any sites of any organisations the user belongs to (any role):
// each option's design and settings, its site and its latest assessment. 404 naming the first option
// that is missing, deleted or not visible (ids do not leak across organisations).
export default defineEventHandler(async (event): Promise<CompareDto> => {
  const user = await requireUser(event)
  const { options: ids } = await getValidatedQuery(event, validator(CompareQuerySchema, 'query'))
  return compareOptions(useDb(), user.id, ids)
})
