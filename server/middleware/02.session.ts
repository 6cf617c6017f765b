// Every request that carries a session cookie is checked against the `sessions` table
// (server/domain/sessions.ts). A cookie whose session has ended (sign-out, a password change or
// reset, "sign out everywhere else", a deleted account) is cleared and removed from the request, so
// every route and page after this sees a signed-out visitor.
export default defineEventHandler(async (event) => {
  const COOKIE_NAME = String(useRuntimeConfig().session?.name || 'nuxt-session')
  const cookies = getRequestHeader(event, 'cookie')
  if (!cookies || !cookies.includes(`${COOKIE_NAME}=`)) return
  const session = await getUserSession(event)
  if (!session.user) return
  const found = await sessionOfCookie(session.user.id, session.secure?.sessionKey)
  if (found) {
    event.context.gillwattSession = found
    // The client's own sign-out (nuxt-auth-utils' DELETE /api/_auth/session) ends the row too.
    if (event.method === 'DELETE' && event.path.split('?')[0] === '/api/_auth/session') await endCurrentSession(event)
    return
  }
  await clearUserSession(event)
  const rest = cookies
    .split(';')
    .map((c) => c.trim())
    .filter((c) => c && !c.startsWith(`${COOKIE_NAME}=`))
    .join('; ')
  if (rest) event.node.req.headers.cookie = rest
  else delete event.node.req.headers.cookie
})
