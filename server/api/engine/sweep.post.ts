import { sweep } from '../../../shared/engine/sweep'
import { SweepRequestSchema } from '../../../shared/schemas/engineRequests'

// Stateless: the design grid over throat diameter × units × submergence, and the best safe point.
export default defineEventHandler(async (event) => {
  await requireUser(event)
  assertBodyWithin(event, ENGINE_BODY_LIMIT)
  const { input, grid } = await readValidatedBody(event, validator(SweepRequestSchema, 'body'))
  return runEngine(() => sweep(input, grid))
})
