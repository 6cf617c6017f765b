// The signed-in person and the organisations they belong to, with their role in each.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  return { user, memberships: await membershipsOf(user.id) }
})
