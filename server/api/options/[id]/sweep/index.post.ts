import { assessmentInputFor } from '~~/server/domain/assessments'
import { ENGINE_VERSION } from '#shared/engine/version'
import { OptionParamsSchema, OptionSweepSchema, type OptionSweepDto } from '#shared/schemas/option'
import { READER_ROLES } from '#shared/utils/roles'

// A design sweep of an option at its site (throat diameter × units × submergence), run on the server
// and answered whole; nothing is stored. Every role may look, within their sweep allowance (shared
// with POST /api/engine/sweep); saving a point needs an editor. The engine runs in the worker pool.
export default defineEventHandler(async (event): Promise<OptionSweepDto> => {
  const { id } = await getValidatedRouterParams(event, validator(OptionParamsSchema, 'params'))
  const { user, site, option } = await requireOption(event, id, READER_ROLES)
  rateLimit(event, 'engine-sweep', user.id)
  const { grid } = await readValidatedJson(event, OptionSweepSchema, BODY_LIMITS.form)
  assertEngineRoom(event)
  const input = await assessmentInputFor(useDb(), site, option)
  const result = await runEngine(event, { kind: 'sweep-input', input, grid })
  return { optionId: option.id, engineVersion: ENGINE_VERSION, ...result }
})
