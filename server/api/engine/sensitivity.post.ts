import { sensitivity } from '../../../shared/engine/sensitivity'
import { SensitivityRequestSchema } from '../../../shared/schemas/engineRequests'

// Stateless: each key input moved by ±fraction, and what that does to energy and oxygen.
export default defineEventHandler(async (event) => {
  await requireUser(event)
  assertBodyWithin(event, ENGINE_BODY_LIMIT)
  const { input, fraction } = await readValidatedBody(event, validator(SensitivityRequestSchema, 'body'))
  return runEngine(() => sensitivity(input, fraction))
})
