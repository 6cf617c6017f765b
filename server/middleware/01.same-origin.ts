// A request that changes something (POST, PUT, PATCH, DELETE) sent by a page of another site is
// refused with 403 before any route sees it: the browser says where it came from in `Origin` (and
// `Sec-Fetch-Site`). The session cookie is SameSite=Lax, which already keeps it off most such
// requests; this also covers sites on a sibling subdomain and requests that need no cookie (sign-up,
// links). Requests without either header (scripts, curl, the tests) are let through: no browser
// would leave both out.
const CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

/** The origins this server answers on: the request's own host, and NUXT_PUBLIC_APP_URL. */
function ownOrigins(host: string | undefined): Set<string> {
  const origins = new Set<string>()
  if (host) {
    origins.add(`http://${host}`.toLowerCase())
    origins.add(`https://${host}`.toLowerCase())
  }
  try {
    origins.add(new URL(String(useRuntimeConfig().public.appUrl)).origin.toLowerCase())
  } catch {
    // no app URL set: the host alone
  }
  return origins
}

export default defineEventHandler((event) => {
  if (!CHANGING.has(event.method)) return
  const site = getRequestHeader(event, 'sec-fetch-site')
  const origin = getRequestHeader(event, 'origin')
  const trustProxy = Boolean(useRuntimeConfig().trustProxy)
  const host = getRequestHost(event, { xForwardedHost: trustProxy })
  const foreignOrigin = origin !== undefined && origin !== 'null' && !ownOrigins(host).has(origin.toLowerCase())
  if (site === 'cross-site' || site === 'same-site' || foreignOrigin || origin === 'null') {
    throw createError({
      statusCode: 403,
      statusMessage: 'Forbidden',
      message: `origin: requests that change something must come from Gillwatt's own pages${origin ? ` (this one came from ${origin.slice(0, 100)})` : ''}`,
    })
  }
})
