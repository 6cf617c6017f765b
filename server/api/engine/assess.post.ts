// Stateless: one engine run on the posted input, nothing stored. Signed-in users only, within their
// assessment allowance; the body (at most BODY_LIMITS.engine) goes as text to the engine pool, which
// parses and checks it off the request thread.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  rateLimit(event, 'engine-assess', user.id)
  assertEngineRoom(event)
  const body = await readJsonText(event, BODY_LIMITS.engine)
  return respondWithEngine(event, { kind: 'assess', body })
})
