// Client JavaScript a page loads: Debian's Chromium (headless, through playwright-core) opens the
// built server's pages on the demo database with an empty cache and records every JavaScript response
// until the network is idle, lazily loaded chunks included. Sizes are each body gzipped here at level 9
// (node:zlib gzipSync): the built server sends JavaScript uncompressed, so Content-Length would give
// raw bytes; a response that did arrive compressed is counted the same way and named in the figure.
// A script counts against the page's budget when Chromium parsed it (DevTools Debugger.scriptParsed:
// the entry, its imports, modulepreloads, lazy chunks opened on load); one fetched but never parsed
// came from a `<link rel="prefetch">` hint for a later page and is reported beside it.
// Pages: the sign-in page "/" signed out, and a demo site's page "/sites/<id>" (its overview tab, with
// the site map) signed in as the demo engineer. Leaflet and Chart.js are recognised by strings their
// builds keep after minification.
import { gzipSync } from 'node:zlib'
import { chromium, type Browser, type Response } from 'playwright-core'
import { DEMO_PASSWORD } from '../../db/demo-scenario'
import type { BenchFigure } from './harness'
import { type BenchServer, type BenchSession, signInSession, startBenchServer } from './server'

const CHROMIUM = process.env.CHROMIUM_PATH || '/usr/bin/chromium'
const ENGINEER = 'idris@tarnbeck.example'
const SITE_NAME = 'Hollin Mill weir'
const SIGN_IN_BUDGET_KB = 200
const SITE_BUDGET_KB = 450

const MARKERS = { leaflet: 'leafletjs.com', chartjs: 'Canvas is already in use' } as const

interface Script {
  url: string
  /** Fetched (a `<link rel="prefetch">` hint, for a later page or a lazy part) but never parsed on this page. */
  prefetch: boolean
  raw: number
  gzip: number
  encoded: boolean
  leaflet: boolean
  chartjs: boolean
}

interface PageLoad {
  /** Scripts the page runs: its entry, imports, modulepreloads and lazy chunks it loads on open. */
  scripts: Script[]
  gzipKb: number
  leaflet: boolean
  chartjs: boolean
  /** Scripts only prefetched at idle time. */
  prefetched: Script[]
  prefetchKb: number
  prefetchLeaflet: boolean
  prefetchChartjs: boolean
}

const isScript = (r: Response) => r.request().resourceType() === 'script' || /javascript/i.test(r.headers()['content-type'] ?? '')

/** Opens `path` in a fresh context (signed in when `session` is given) and measures its scripts. */
async function measure(browser: Browser, server: BenchServer, path: string, session: BenchSession | null, waitFor?: string): Promise<PageLoad> {
  const context = await browser.newContext({ viewport: { width: 1360, height: 1000 } })
  try {
    if (session) await context.addCookies([{ ...session.sessionCookie, url: server.baseURL, httpOnly: true, sameSite: 'Lax' }])
    const page = await context.newPage()
    // Which scripts Chromium actually parsed: a fetched chunk it never parsed was only prefetched.
    const parsed = new Set<string>()
    const cdp = await context.newCDPSession(page)
    cdp.on('Debugger.scriptParsed', (e) => parsed.add(e.url))
    await cdp.send('Debugger.enable')
    const pending: Promise<Script | null>[] = []
    const problems: string[] = []
    page.on('pageerror', (e) => problems.push(e.message))
    page.on('response', (r) => {
      if (!isScript(r)) return
      pending.push(
        r.body().then(
          (body) => {
            const text = body.toString('utf8')
            return { url: r.url(), prefetch: false, raw: body.length, gzip: gzipSync(body, { level: 9 }).length, encoded: !!r.headers()['content-encoding'], leaflet: text.includes(MARKERS.leaflet), chartjs: text.includes(MARKERS.chartjs) }
          },
          () => null,
        ),
      )
    })
    const res = await page.goto(server.baseURL + path, { waitUntil: 'networkidle' })
    if (!res || res.status() !== 200) throw new Error(`GET ${path} answered ${res?.status()}`)
    if (waitFor) {
      await page.waitForSelector(waitFor, { timeout: 20_000 })
      await page.waitForLoadState('networkidle')
    }
    if (problems.length) throw new Error(`page errors on ${path}: ${problems.join('; ')}`)
    // A chunk asked for twice (a modulepreload, then its import) is one download: count each URL once.
    const byUrl = new Map<string, Script>()
    for (const s of await Promise.all(pending)) if (s && !byUrl.has(s.url)) byUrl.set(s.url, { ...s, prefetch: !parsed.has(s.url) })
    const scripts = [...byUrl.values()].filter((s) => !s.prefetch)
    const prefetched = [...byUrl.values()].filter((s) => s.prefetch)
    if (scripts.length === 0) throw new Error(`${path} loaded no JavaScript: the measurement saw nothing`)
    const kb = (xs: Script[]) => xs.reduce((n, s) => n + s.gzip, 0) / 1024
    return {
      scripts,
      gzipKb: kb(scripts),
      leaflet: scripts.some((s) => s.leaflet),
      chartjs: scripts.some((s) => s.chartjs),
      prefetched,
      prefetchKb: kb(prefetched),
      prefetchLeaflet: prefetched.some((s) => s.leaflet),
      prefetchChartjs: prefetched.some((s) => s.chartjs),
    }
  } finally {
    await context.close()
  }
}

const biggest = (load: PageLoad) =>
  [...load.scripts]
    .sort((a, b) => b.gzip - a.gzip)
    .slice(0, 3)
    .map((s) => `${new URL(s.url).pathname.split('/').pop()} ${(s.gzip / 1024).toFixed(0)} KB`)
    .join(', ')

export async function bundleBench(): Promise<BenchFigure[]> {
  const server = await startBenchServer({ demo: true })
  let browser: Browser | undefined
  try {
    const engineer = await signInSession(server.baseURL, ENGINEER, DEMO_PASSWORD)
    const list = await fetch(`${server.baseURL}/api/orgs/${engineer.orgId}/sites`, { headers: { accept: 'application/json', cookie: engineer.cookie } })
    const { sites } = (await list.json()) as { sites: { id: number; name: string }[] }
    const site = sites.find((s) => s.name === SITE_NAME)
    if (!site) throw new Error(`the demo organisation has no site named "${SITE_NAME}"`)

    browser = await chromium.launch({ executablePath: CHROMIUM, headless: true })
    const signIn = await measure(browser, server, '/', null, '[data-testid=sign-in-form]')
    const sitePage = await measure(browser, server, `/sites/${site.id}`, engineer, '[data-testid=map-site-editor] .leaflet-container')
    const compressed = [...signIn.scripts, ...sitePage.scripts].some((s) => s.encoded)
    const how = compressed ? 'gzip -9 of each decoded body; some arrived compressed' : 'gzip -9 of each body; sent uncompressed'
    const yesNo = (b: boolean) => (b ? 'yes' : 'no')
    if (process.env.GILLWATT_BENCH_VERBOSE) {
      for (const [name, load] of [['sign-in', signIn], ['site', sitePage]] as const) {
        for (const s of [...load.scripts, ...load.prefetched]) console.log(`  ${name} ${s.prefetch ? 'prefetch' : 'run     '} ${new URL(s.url).pathname} ${(s.gzip / 1024).toFixed(1)} KB gz${s.leaflet ? ' Leaflet' : ''}${s.chartjs ? ' Chart.js' : ''}`)
      }
    }
    const prefetchedNote = (load: PageLoad) =>
      `${load.prefetched.length} chunks${load.prefetchLeaflet ? ', Leaflet among them' : ''}${load.prefetchChartjs ? ', Chart.js among them' : ''}`
    return [
      {
        name: `sign-in page "/" signed out: ${signIn.scripts.length} scripts parsed (${how}; largest ${biggest(signIn)})`,
        value: signIn.gzipKb,
        unit: 'KB gz',
        target: `< ${SIGN_IN_BUDGET_KB} KB`,
        pass: signIn.gzipKb < SIGN_IN_BUDGET_KB,
      },
      {
        name: `site page "/sites/${site.id}" (${SITE_NAME}, overview with map) signed in: ${sitePage.scripts.length} scripts parsed (largest ${biggest(sitePage)})`,
        value: sitePage.gzipKb,
        unit: 'KB gz',
        target: `< ${SITE_BUDGET_KB} KB`,
        pass: sitePage.gzipKb < SITE_BUDGET_KB,
      },
      { name: `sign-in page: JavaScript only prefetched at idle for later pages, never parsed here (${prefetchedNote(signIn)})`, value: signIn.prefetchKb, unit: 'KB gz', target: '(reported)', pass: true },
      { name: `site page: JavaScript only prefetched, never parsed (${prefetchedNote(sitePage)})`, value: sitePage.prefetchKb, unit: 'KB gz', target: '(reported)', pass: true },
      { name: 'sign-in page loads Leaflet', value: Number(signIn.leaflet), unit: '', display: yesNo(signIn.leaflet), target: 'no', pass: !signIn.leaflet },
      { name: 'sign-in page loads Chart.js', value: Number(signIn.chartjs), unit: '', display: yesNo(signIn.chartjs), target: 'no', pass: !signIn.chartjs },
      // The site overview draws its map, so Leaflet must be seen there: this proves the detector works.
      { name: 'site page (overview) loads Leaflet (the detector sees it where it is used)', value: Number(sitePage.leaflet), unit: '', display: yesNo(sitePage.leaflet), target: 'yes', pass: sitePage.leaflet },
      { name: 'site page (overview) loads Chart.js (charts sit on other tabs)', value: Number(sitePage.chartjs), unit: '', display: yesNo(sitePage.chartjs), target: '(reported)', pass: true },
    ]
  } finally {
    await browser?.close()
    await server.stop()
  }
}
