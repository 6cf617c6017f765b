// Adds the map tile origin to the pages' CSP img-src as the server starts. The tile URL comes from
// NUXT_PUBLIC_MAP_TILES_URL at run time, so nuxt.config.ts cannot list it; nuxt-security calls its
// `nuxt-security:routeRules` hook once at start-up (its plugins run after this one) with the rules
// it will apply. An empty setting, or a same-origin path such as /tiles/{z}/{x}/{y}.png, adds nothing.

/** A host with an optional leading `*.` wildcard and port, as a CSP host-source allows it. */
const HOST_SOURCE = /^(\*\.)?[a-z0-9-]+(\.[a-z0-9-]+)*(:\d{1,5})?$/

/**
 * The CSP source for a Leaflet tile URL template: `https://{s}.tiles.example/{z}/{x}/{y}.png` gives
 * `https://*.tiles.example`. Null when nothing needs adding (empty or same-origin), undefined when the
 * template's origin cannot be written as a CSP source (a placeholder inside the host, a stray quote).
 */
export function tileImageSource(template: string): string | null | undefined {
  const url = template.trim()
  if (!url || (url.startsWith('/') && !url.startsWith('//'))) return null
  const match = /^(?:(https?):)?\/\/([^/?#]+)/i.exec(url)
  if (!match) return undefined
  // A subdomain placeholder ({s}, or any {name}) as the first label becomes the `*.` wildcard.
  const host = match[2]!.toLowerCase().replace(/^\{[^}]*\}\./, '*.')
  if (!HOST_SOURCE.test(host)) return undefined
  // A protocol-relative template (//tiles.example/…) follows the page's scheme, as a bare host-source does.
  return match[1] ? `${match[1].toLowerCase()}://${host}` : host
}

export default defineNitroPlugin((nitroApp) => {
  const template = String(useRuntimeConfig().public.mapTilesUrl ?? '')
  const source = tileImageSource(template)
  if (source === undefined) {
    console.warn(`[gillwatt] NUXT_PUBLIC_MAP_TILES_URL "${template}" has no origin a content security policy can name; map tiles will be blocked.`)
    return
  }
  if (source === null) return
  nitroApp.hooks.hook('nuxt-security:routeRules', (routeRules) => {
    for (const rules of Object.values(routeRules)) {
      const csp = rules.headers ? rules.headers.contentSecurityPolicy : undefined
      if (!csp || typeof csp !== 'object') continue
      const current = csp['img-src']
      if (current === undefined || current === false) continue
      const sources = typeof current === 'string' ? current.split(/\s+/).filter(Boolean) : [...current]
      if (!sources.includes(source)) csp['img-src'] = [...sources, source]
    }
  })
})
