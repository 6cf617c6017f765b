// Stateless: the design grid over throat diameter × units × submergence, and the best safe point.
// Signed-in users only, within their sweep allowance; the body goes as text to the engine pool.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  rateLimit(event, 'engine-sweep', user.id)
  assertEngineRoom(event)
  const body = await readJsonText(event, BODY_LIMITS.engine)
  return respondWithEngine(event, { kind: 'sweep', body })
})
