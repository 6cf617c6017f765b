import { assess } from '../../../shared/engine/assess'
import { AssessInputSchema } from '../../../shared/schemas/assess'

// Stateless: one engine run on the posted input, nothing stored. Signed-in users only.
export default defineEventHandler(async (event) => {
  await requireUser(event)
  assertBodyWithin(event, ENGINE_BODY_LIMIT)
  const input = await readValidatedBody(event, validator(AssessInputSchema, 'body'))
  return runEngine(() => assess(input))
})
