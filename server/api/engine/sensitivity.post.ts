// Stateless: each key input moved by ±fraction, and what that does to energy and oxygen.
// Signed-in users only, within their sensitivity allowance; the body goes as text to the engine pool.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  rateLimit(event, 'engine-sensitivity', user.id)
  assertEngineRoom(event)
  const body = await readJsonText(event, BODY_LIMITS.engine)
  return respondWithEngine(event, { kind: 'sensitivity', body })
})
