// Ends this browser's session (its row too, so a copy of the cookie stops working); signing out
// twice is harmless. Open to anyone, no body.
export default defineEventHandler(async (event) => {
  await endCurrentSession(event)
  return { ok: true }
})
