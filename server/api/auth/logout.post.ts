// Ends the session; signing out twice is harmless.
export default defineEventHandler(async (event) => {
  await clearUserSession(event)
  return { ok: true }
})
