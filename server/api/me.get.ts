// The signed-in person, whether their address is confirmed, the organisation they last chose, and
// the organisations they belong to with their role in each. Signed-in only.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  return meOf(user.id)
})
