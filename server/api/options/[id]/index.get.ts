import { loadOptionDto } from '~~/server/domain/options'
import { OptionParamsSchema } from '#shared/schemas/option'
import { READER_ROLES } from '#shared/utils/roles'

// One design option with its newest assessment, for every role of its organisation; 404 for anyone else.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(OptionParamsSchema, 'params'))
  const { option } = await requireOption(event, id, READER_ROLES)
  return loadOptionDto(useDb(), option)
})
