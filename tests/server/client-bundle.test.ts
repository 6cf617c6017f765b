import { readdirSync, readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { runInNewContext } from 'node:vm'
import { describe, expect, it, inject } from 'vitest'
import { Client, GOOD_PASSWORD, signUp } from './client'
import { createSite } from './sites-helpers'

// Nothing secret reaches the browser: not in the built client files under .output/public/_nuxt/,
// not in the HTML and payload of a server-rendered page, and the page's runtime config holds only
// the public keys. The built files are the ones the shared test server (global-setup.ts) serves.

/** The session password global-setup.ts gives the test server: known only at run time. */
const SESSION_PASSWORD = 'test-only-session-password-0123456789abcdef'

/** Names and values that belong to the server alone. */
const SERVER_ONLY = ['NUXT_SESSION_PASSWORD', 'smtpUrl', 'SMTP_URL', 'databasePath', 'DATABASE_PATH', 'UPLOADS_DIR', 'better-sqlite3', 'kysely', 'nodemailer', 'password_hash', 'scrypt', SESSION_PASSWORD]

const CLIENT_DIR = join(process.cwd(), '.output/public/_nuxt')

function filesUnder(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? filesUnder(join(dir, e.name)) : [join(dir, e.name)]))
}

/** Which of SERVER_ONLY occur in `text`. */
const leaks = (text: string) => SERVER_ONLY.filter((s) => text.includes(s))

/** The object the page's inline `window.__NUXT__.config = …` script sets, run in an empty sandbox. */
function pageConfig(html: string): Record<string, unknown> {
  const script = [...html.matchAll(/<script\b[^>]*>([\s\S]*?)<\/script>/g)].map((m) => m[1]!).find((s) => s.includes('window.__NUXT__.config'))
  expect(script, 'inline runtime-config script').toBeTruthy()
  const sandbox: { window: { __NUXT__?: { config?: Record<string, unknown> } } } = { window: {} }
  runInNewContext(script!, sandbox, { timeout: 1000 })
  return sandbox.window.__NUXT__!.config!
}

describe('the built client files', () => {
  it('name no server-only setting, module or secret', () => {
    const files = filesUnder(CLIENT_DIR)
    expect(files.filter((f) => f.endsWith('.js')).length).toBeGreaterThan(10)
    const found: string[] = []
    for (const file of files.filter((f) => !/\.(gz|br)$/.test(f))) {
      for (const s of leaks(readFileSync(file, 'latin1'))) found.push(`${relative(CLIENT_DIR, file)}: ${s}`)
    }
    expect(found).toEqual([])
  })

  it('are sent compressed to a browser that accepts it, and plain to one that does not', async () => {
    const page = await (await fetch(`${inject('baseURL')}/`, { headers: { accept: 'text/html' } })).text()
    const script = /<script[^>]+src="(\/_nuxt\/[^"]+\.js)"/.exec(page)?.[1]
    expect(script, 'the sign-in page loads a script from /_nuxt/').toBeTruthy()
    const gz = await fetch(`${inject('baseURL')}${script}`, { headers: { 'accept-encoding': 'gzip' } })
    expect(gz.headers.get('content-encoding')).toBe('gzip')
    const plain = await fetch(`${inject('baseURL')}${script}`, { headers: { 'accept-encoding': 'identity' } })
    expect(plain.headers.get('content-encoding')).toBeNull()
    expect((await gz.text()).length).toBe((await plain.text()).length)
  })

  it('ship no source maps that would carry server code along', () => {
    expect(filesUnder(join(process.cwd(), '.output/public')).filter((f) => f.endsWith('.map'))).toEqual([])
  })
})

describe('a server-rendered page', () => {
  it('carries no secret in its HTML or payload, signed out or signed in', async () => {
    const { client, email, orgId } = await signUp('bundle')
    const site = await createSite(client, orgId, { name: 'Bundle weir' })
    const login = await new Client().post('/api/auth/login', { email, password: GOOD_PASSWORD })
    expect(login.status).toBe(200)
    const sealed = login.headers.getSetCookie()[0]!.split(';')[0]!
    const base = inject('baseURL')
    for (const [path, cookie] of [['/', ''], [`/sites/${site.id}`, sealed]] as const) {
      const html = await (await fetch(base + path, { headers: { accept: 'text/html', cookie } })).text()
      expect(html, path).toContain('id="__NUXT_DATA__"')
      expect(leaks(html), path).toEqual([])
      // Neither the sealed session nor a stored password hash is echoed into the page.
      expect(html, path).not.toContain(sealed.split('=')[1]!)
      expect(html, path).not.toMatch(/\$scrypt\$|passwordHash|password_hash/)
    }
    // The signed-in page did render the site, so its payload was really checked.
    const signedIn = await (await fetch(`${base}/sites/${site.id}`, { headers: { accept: 'text/html', cookie: sealed } })).text()
    expect(signedIn).toContain('Bundle weir')
  })

  it('has a runtime config with the public keys and the app paths only', async () => {
    const html = await (await fetch(inject('baseURL') + '/', { headers: { accept: 'text/html' } })).text()
    const config = pageConfig(html)
    expect(Object.keys(config).sort()).toEqual(['app', 'public'])
    const pub = config.public as Record<string, unknown>
    expect(Object.keys(pub).sort()).toEqual(['appUrl', 'auth', 'mapTilesAttribution', 'mapTilesUrl'])
    // nuxt-auth-utils' one public setting: when the client loads the session.
    expect(pub.auth).toEqual({ loadStrategy: 'server-first' })
    expect(Object.keys(config.app as object).sort()).toEqual(['baseURL', 'buildAssetsDir', 'buildId', 'cdnURL'])
    expect(leaks(JSON.stringify(config))).toEqual([])
    expect(JSON.stringify(config)).not.toMatch(/session|password|security|smtp|mail/i)
  })
})
