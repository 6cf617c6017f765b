// Client-side guard: signed-out visitors go to the sign-in on "/", signed-in ones get their
// organisations loaded. It only redirects; every API route checks access itself.
const PUBLIC_PATHS = ['/', '/signup', '/reset-password']
const PUBLIC_PREFIXES = ['/s/', '/invitations/', '/reset-password/', '/verify-email/']
const isPublic = (path: string) => PUBLIC_PATHS.includes(path) || PUBLIC_PREFIXES.some((p) => path.startsWith(p))

export default defineNuxtRouteMiddleware(async (to) => {
  const { loggedIn, clear } = useUserSession()
  if (!loggedIn.value) {
    if (!isPublic(to.path)) return navigateTo({ path: '/', query: { next: to.fullPath } })
    return
  }
  const org = useOrganisationStore()
  if (!org.me) {
    try {
      await org.load()
    } catch {
      // The cookie outlived its user: start again signed out.
      await clear()
      return navigateTo('/')
    }
  }
  if (to.path === '/signup') return navigateTo('/')
})
