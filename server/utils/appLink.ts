// Links into the app as people reach it (NUXT_PUBLIC_APP_URL), for e-mails and summary links.

/** The app's public base URL (NUXT_PUBLIC_APP_URL, default http://localhost:3000), no trailing slash. */
export function appBaseUrl(): string {
  const url = useRuntimeConfig().public.appUrl || 'http://localhost:3000'
  return String(url).replace(/\/+$/, '')
}

/** An absolute link into the app. */
export const appLink = (path: string) => `${appBaseUrl()}${path.startsWith('/') ? path : `/${path}`}`
