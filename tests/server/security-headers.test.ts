// Longer than most files: every header, cookie flag and start-up switch of the security layer, each on its own.
import { request as httpRequest } from 'node:http'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { startBuiltServer, type BuiltServer } from '../../scripts/builtServer.mjs'
import { Client, GOOD_PASSWORD, signUp, uniqueEmail, type UploadFile } from './client'
import { createSite, makeTeam } from './sites-helpers'

// Security headers (nuxt-security, configured in nuxt.config.ts), the session cookie's flags, the
// start-up switches (tile origin in img-src, NUXT_SESSION_COOKIE_SECURE) and how uploaded files are
// served. The browser journeys check that the app works under this CSP; these check what is sent.

/** A CSP header as directive → sources. */
function parseCsp(header: string | null): Map<string, string[]> {
  const map = new Map<string, string[]>()
  for (const part of (header ?? '').split(';')) {
    const [name, ...sources] = part.trim().split(/\s+/)
    if (name) map.set(name, sources)
  }
  return map
}

/** A page as a browser asks for it: HTML, with the client's cookies if any. */
async function page(path: string, cookie = '', base = inject('baseURL')) {
  const res = await fetch(base + path, { headers: { accept: 'text/html', cookie }, redirect: 'manual' })
  return { status: res.status, headers: res.headers, html: await res.text() }
}

/** The `'nonce-…'` value of a CSP's script-src. */
const scriptNonce = (csp: Map<string, string[]>) => /^'nonce-([A-Za-z0-9+/=_-]+)'$/.exec(csp.get('script-src')?.find((s) => s.startsWith("'nonce-")) ?? '')?.[1]

describe('headers on server-rendered pages', () => {
  it('send a CSP whose script nonce is new on every request and is carried by every script of the page', async () => {
    const first = await page('/')
    const second = await page('/')
    expect(first.status).toBe(200)
    expect(first.headers.get('content-type')).toMatch(/^text\/html/)
    const nonces = [first, second].map((p) => scriptNonce(parseCsp(p.headers.get('content-security-policy'))))
    expect(nonces[0]).toMatch(/^[A-Za-z0-9+/=_-]{16,}$/)
    expect(nonces[1]).toMatch(/^[A-Za-z0-9+/=_-]{16,}$/)
    expect(nonces[0]).not.toBe(nonces[1])

    for (const [i, p] of [first, second].entries()) {
      const scripts = p.html.match(/<script\b[^>]*>/g) ?? []
      // Nuxt's entry module, its inline config script and the JSON payload at least.
      expect(scripts.length).toBeGreaterThanOrEqual(3)
      for (const tag of scripts) expect(tag, tag).toContain(`nonce="${nonces[i]}"`)
      expect(p.html).toContain('id="__NUXT_DATA__"')
      // No inline event handlers for script-src-attr 'none' to refuse.
      expect(p.html).not.toMatch(/<[^>]+\son[a-z]+=/i)
    }
  })

  it('never send the nonce placeholder unfilled, also on a redirect', async () => {
    const { client } = await signUp('sec-redirect')
    const login = await client.get('/api/me')
    expect(login.status).toBe(200)
    const cookie = client.cookieHeader()
    // Signed in, /signup sends the visitor home: a redirect rendered without the page's HTML.
    const redirected = await page('/signup', cookie)
    expect(redirected.status).toBe(302)
    expect(redirected.headers.get('content-security-policy')).toBeTruthy()
    expect(redirected.headers.get('content-security-policy')).not.toContain('{{nonce}}')
    const rendered = await page('/account', cookie)
    expect(scriptNonce(parseCsp(rendered.headers.get('content-security-policy')))).toMatch(/^[A-Za-z0-9+/=_-]{16,}$/)
  })

  it('lock down framing, plugins, base and forms, allow the worker, and load nothing from other origins', async () => {
    const { headers } = await page('/')
    const csp = parseCsp(headers.get('content-security-policy'))
    expect(csp.get('frame-ancestors')).toEqual(["'none'"])
    expect(csp.get('object-src')).toEqual(["'none'"])
    expect(csp.get('base-uri')).toEqual(["'none'"])
    expect(csp.get('form-action')).toEqual(["'self'"])
    expect(csp.get('default-src')).toEqual(["'self'"])
    expect(csp.get('connect-src')).toEqual(["'self'"])
    expect(csp.get('font-src')).toEqual(["'self'"])
    expect(csp.get('script-src-attr')).toEqual(["'none'"])
    expect(csp.get('worker-src')).toEqual(["'self'", 'blob:'])
    // No tile URL is configured on the test server: images from this origin, data: and blob: only.
    expect(csp.get('img-src')).toEqual(["'self'", 'data:', 'blob:'])
    const scriptSrc = csp.get('script-src') ?? []
    expect(scriptSrc).toContain("'strict-dynamic'")
    expect(scriptSrc).not.toContain("'unsafe-inline'")
    expect(scriptSrc).not.toContain("'unsafe-eval'")
    expect(scriptSrc.filter((s) => /^https?:$/.test(s))).toEqual([])
    // Served over plain http by the demo: no upgrade to https.
    expect(csp.has('upgrade-insecure-requests')).toBe(false)

    expect(headers.get('x-frame-options')).toBe('DENY')
    expect(headers.get('x-content-type-options')).toBe('nosniff')
    expect(headers.get('referrer-policy')).toBe('no-referrer')
    expect(headers.get('cross-origin-opener-policy')).toBe('same-origin')
    // No COEP: any value but unsafe-none makes the browser refuse the sweep's module worker.
    expect(headers.get('cross-origin-embedder-policy')).toBeNull()
    expect(headers.get('strict-transport-security')).toMatch(/^max-age=\d+/)
    expect(headers.get('x-powered-by')).toBeNull()
  })
})

describe('headers on API responses and assets', () => {
  it('send nosniff, no-referrer, a CSP that allows nothing, and no X-Powered-By', async () => {
    const res = await new Client().get('/api/health')
    expect(res.status).toBe(200)
    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
    expect(res.headers.get('referrer-policy')).toBe('no-referrer')
    expect(res.headers.get('x-frame-options')).toBe('DENY')
    expect(parseCsp(res.headers.get('content-security-policy'))).toEqual(new Map([['default-src', ["'none'"]], ['frame-ancestors', ["'none'"]]]))
    expect(res.headers.get('x-powered-by')).toBeNull()
    const missing = await new Client().get('/api/no-such-route')
    expect(missing.status).toBe(404)
    expect(missing.headers.get('x-content-type-options')).toBe('nosniff')
    expect(missing.headers.get('x-powered-by')).toBeNull()
  })

  it('give other origins no CORS grant, for plain requests or preflights', async () => {
    const base = inject('baseURL')
    const plain = await fetch(`${base}/api/health`, { headers: { origin: 'https://elsewhere.example' } })
    expect(plain.headers.get('access-control-allow-origin')).toBeNull()
    const preflight = await fetch(`${base}/api/auth/login`, {
      method: 'OPTIONS',
      headers: { origin: 'https://elsewhere.example', 'access-control-request-method': 'POST', 'access-control-request-headers': 'content-type' },
    })
    expect(preflight.headers.get('access-control-allow-origin')).toBeNull()
    expect(preflight.headers.get('access-control-allow-credentials')).toBeNull()
  })

  it('serve the built scripts with nosniff', async () => {
    const { html } = await page('/')
    const src = /<script\b[^>]*\bsrc="(\/_nuxt\/[^"]+\.js)"/.exec(html)?.[1]
    expect(src).toBeTruthy()
    const res = await fetch(inject('baseURL') + src!)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/javascript/)
    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
  })
})

describe('request checks of the security module', () => {
  it('leave text that looks like HTML alone: stored as typed, shown escaped', async () => {
    const { client, email, orgId } = await signUp('sec-html')
    const text = 'flow < Q95 at <b>low</b> water & <script>alert(1)</script>'
    const site = await createSite(client, orgId, { name: 'Weir <b>low</b>' })
    const comment = await client.post(`/api/sites/${site.id}/comments`, { body: text })
    expect(comment.status, JSON.stringify(comment.body)).toBe(201)
    const list = await client.get(`/api/sites/${site.id}/comments`)
    expect(list.body.comments.map((c: { body: string }) => c.body)).toContain(text)
    // The signed-in site page renders the name as text (title and heading), never as markup.
    const html = (await page(`/sites/${site.id}`, await sessionCookie(email))).html
    expect(html).toContain('Weir &lt;b&gt;low&lt;/b&gt;')
    expect(html).not.toContain('<b>low</b>')
  })

  it('refuse an upload declared far beyond every house limit with 413 before reading it, on any route', async () => {
    // Sign-in takes no upload and has no size limit of its own: only the module's 64 MB backstop for
    // multipart bodies stops an 80 MB one before it is read. The house limits (10 MB flow CSV, 20 MB
    // attachment, 8 MB engine body) answer first on their own routes with messages naming the field:
    // attachments.test.ts, flow-record.test.ts and engine.test.ts check those.
    const url = new URL(inject('baseURL'))
    const headers = { 'content-type': 'multipart/form-data; boundary=gillwatt', 'content-length': String(80 * 1024 * 1024) }
    const reply = await new Promise<{ status: number; body: string }>((resolve, reject) => {
      const req = httpRequest({ host: url.hostname, port: url.port, path: '/api/auth/login', method: 'POST', headers }, (res) => {
        let body = ''
        res.on('data', (d) => (body += d))
        res.on('end', () => {
          resolve({ status: res.statusCode ?? 0, body })
          req.destroy()
        })
      })
      req.on('error', reject)
      req.write('--gillwatt\r\n')
    })
    expect(reply.status).toBe(413)
    expect(JSON.parse(reply.body)).toMatchObject({ statusCode: 413, statusMessage: 'Payload Too Large' })
  })
})

/** Signs in by hand and returns the session cookie as a Cookie header (a Client keeps its jar to itself). */
async function sessionCookie(email: string): Promise<string> {
  const res = await new Client().post('/api/auth/login', { email, password: GOOD_PASSWORD })
  expect(res.status).toBe(200)
  return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ')
}

describe('session cookie', () => {
  it('is HttpOnly, SameSite=Lax, Secure and site-wide, when set and when cleared', async () => {
    const client = new Client()
    const email = uniqueEmail('sec-cookie')
    const signup = await client.post('/api/auth/signup', { name: 'Cookie Person', email, password: GOOD_PASSWORD, organisationName: 'Cookie org' })
    expect(signup.status).toBe(202)
    // Sign-up itself signs nobody in (its answer must not tell a taken address from a new one).
    expect(signup.headers.getSetCookie()).toEqual([])
    const login = await client.post('/api/auth/login', { email, password: GOOD_PASSWORD })
    expect(login.status).toBe(200)
    const logout = await client.post('/api/auth/logout')
    expect(logout.status).toBe(200)
    for (const [what, res] of [['sign-in', login], ['sign-out', logout]] as const) {
      const cookies = res.headers.getSetCookie()
      expect(cookies.length, what).toBeGreaterThan(0)
      for (const c of cookies) {
        expect(c, what).toMatch(/^gillwatt-session=/)
        expect(c, what).toMatch(/;\s*HttpOnly/i)
        expect(c, what).toMatch(/;\s*Secure/i)
        expect(c, what).toMatch(/;\s*SameSite=Lax/i)
        expect(c, what).toMatch(/;\s*Path=\//i)
      }
    }
  })
})

// A second built server with start-up settings the shared one lacks.
const startServer = (env: Record<string, string>) => startBuiltServer({ prefix: 'gillwatt-sec-', sessionPassword: 'test-only-session-password-0123456789abcdef', env })

describe('start-up switches', () => {
  let tiles: BuiltServer
  let odd: BuiltServer
  beforeAll(async () => {
    tiles = await startServer({ NUXT_PUBLIC_MAP_TILES_URL: 'https://{s}.tiles.example:8443/{z}/{x}/{y}.png', NUXT_SESSION_COOKIE_SECURE: 'false' })
    odd = await startServer({ NUXT_PUBLIC_MAP_TILES_URL: "https://tiles-{s}.example/{z}/{x}/{y}.png'; script-src *" })
  })
  afterAll(async () => {
    await Promise.all([tiles?.close(), odd?.close()])
  })

  it('add the tile origin from NUXT_PUBLIC_MAP_TILES_URL to img-src, with {s} as a subdomain wildcard', async () => {
    const csp = parseCsp((await page('/', '', tiles.baseURL)).headers.get('content-security-policy'))
    expect(csp.get('img-src')).toEqual(["'self'", 'data:', 'blob:', 'https://*.tiles.example:8443'])
    // Only images: scripts and connections stay on this origin.
    expect(csp.get('connect-src')).toEqual(["'self'"])
  })

  it('add nothing for a tile URL whose origin a CSP cannot name, and say so at start', async () => {
    const res = await page('/', '', odd.baseURL)
    expect(res.status).toBe(200)
    const csp = parseCsp(res.headers.get('content-security-policy'))
    expect(csp.get('img-src')).toEqual(["'self'", 'data:', 'blob:'])
    expect(csp.get('script-src')).not.toContain('*')
    expect(odd.output()).toMatch(/NUXT_PUBLIC_MAP_TILES_URL .* map tiles will be blocked/)
  })

  it('drop Secure from the session cookie with NUXT_SESSION_COOKIE_SECURE=false, keeping HttpOnly and SameSite', async () => {
    const plain = new Client(tiles.baseURL)
    const email = uniqueEmail('sec-plain')
    expect((await plain.post('/api/auth/signup', { name: 'Plain Http', email, password: GOOD_PASSWORD, organisationName: 'Plain org' })).status).toBe(202)
    const res = await plain.post('/api/auth/login', { email, password: GOOD_PASSWORD })
    expect(res.status).toBe(200)
    const [cookie] = res.headers.getSetCookie()
    expect(cookie).toMatch(/^gillwatt-session=/)
    expect(cookie).not.toMatch(/;\s*Secure/i)
    expect(cookie).toMatch(/;\s*HttpOnly/i)
    expect(cookie).toMatch(/;\s*SameSite=Lax/i)
  })
})

// Real file heads: a 1×1 PNG, a minimal PDF.
const PNG = Uint8Array.from(Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64'))
const PDF = new TextEncoder().encode('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n')
const HTML = '<!doctype html><html><body><script>alert(document.cookie)</script></body></html>'
const SVG = '<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'

describe('uploaded files', () => {
  let team: Awaited<ReturnType<typeof makeTeam>>
  let siteId: number
  const attach = (file: UploadFile) => team.engineer.upload(`/api/sites/${siteId}/attachments`, { file })
  beforeAll(async () => {
    team = await makeTeam('sec-upload')
    siteId = (await createSite(team.engineer, team.orgId)).id
  })

  it('refuse HTML and SVG with 415 naming the field, whatever name or type they claim', async () => {
    for (const file of [
      { name: 'weir.html', type: 'text/html', data: HTML },
      { name: 'crest.svg', type: 'image/svg+xml', data: SVG },
      { name: 'photo.png', type: 'image/png', data: HTML },
      { name: 'photo.png', type: 'image/png', data: SVG },
      { name: 'drawing.pdf', type: 'application/pdf', data: `  ${HTML}` },
    ]) {
      const res = await attach(file)
      expect(res.status, file.name).toBe(415)
      expect(res.body.message, file.name).toMatch(/^file: /)
    }
  })

  it('serve a real image under an .html name as an inert image that saves with its real extension', async () => {
    // A PNG whose bytes also carry markup after the signature: nosniff keeps it an image.
    const polyglot = new Uint8Array([...PNG, ...new TextEncoder().encode(HTML)])
    const up = await attach({ name: 'notes.html', type: 'text/html', data: polyglot })
    expect(up.status, JSON.stringify(up.body)).toBe(201)
    expect(up.body.contentType).toBe('image/png')
    const file = await team.viewer.download(`/api/attachments/${up.body.id}`)
    expect(file.status).toBe(200)
    expect(file.headers.get('content-type')).toBe('image/png')
    expect(file.headers.get('x-content-type-options')).toBe('nosniff')
    expect(file.headers.get('content-disposition')).toBe(`inline; filename="notes.html.png"; filename*=UTF-8''notes.html.png`)
    expect(file.headers.get('cross-origin-resource-policy')).toBe('same-origin')
    const csp = parseCsp(file.headers.get('content-security-policy'))
    expect(csp.get('default-src')).toEqual(["'none'"])
    expect(csp.has('sandbox')).toBe(true)
    expect(csp.get('sandbox')).toEqual([])
    expect(csp.has('script-src')).toBe(false)
    expect(Buffer.from(file.bytes).equals(Buffer.from(polyglot))).toBe(true)
  })

  it('send PDFs as downloads only, named with .pdf, and keep a name that already fits its type', async () => {
    const pdf = (await attach({ name: 'survey.svg', type: 'image/svg+xml', data: PDF })).body
    const doc = await team.reviewer.download(`/api/attachments/${pdf.id}`)
    expect(doc.headers.get('content-type')).toBe('application/pdf')
    expect(doc.headers.get('content-disposition')).toBe(`attachment; filename="survey.svg.pdf"; filename*=UTF-8''survey.svg.pdf`)
    expect(parseCsp(doc.headers.get('content-security-policy')).has('sandbox')).toBe(true)

    const png = (await attach({ name: 'Crest VIEW.PNG', type: '', data: PNG })).body
    const img = await team.viewer.download(`/api/attachments/${png.id}`)
    expect(img.headers.get('content-disposition')).toBe(`inline; filename="Crest VIEW.PNG"; filename*=UTF-8''Crest%20VIEW.PNG`)
  })
})
