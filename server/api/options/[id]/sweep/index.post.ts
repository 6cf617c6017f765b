import { sweep } from '../../../../../shared/engine/sweep'
import { ENGINE_VERSION } from '../../../../../shared/engine/version'
import { OptionParamsSchema, OptionSweepSchema, type OptionSweepDto } from '../../../../../shared/schemas/option'
import { READER_ROLES } from '../../../../../shared/utils/roles'

// A design sweep of an option at its site (throat diameter × units × submergence), run on the server
// and answered whole; nothing is stored. Every role may look; saving a point needs an editor.
export default defineEventHandler(async (event): Promise<OptionSweepDto> => {
  const { id } = await getValidatedRouterParams(event, validator(OptionParamsSchema, 'params'))
  const { site, option } = await requireOption(event, id, READER_ROLES)
  const { grid } = await readValidatedBody(event, validator(OptionSweepSchema, 'body'))
  const input = await assessmentInputFor(site, option)
  const result = runEngine(() => sweep(input, grid))
  return { optionId: option.id, engineVersion: ENGINE_VERSION, ...result }
})
