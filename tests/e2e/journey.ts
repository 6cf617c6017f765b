// What every browser journey shares: the server address, the demo password, screenshots, a page
// that records every console error, page error and failed request, refusals provoked on purpose,
// sign-in, full page loads that wait for Nuxt's hydration, and the run of a journey itself.
import assert from 'node:assert/strict'
import { mkdirSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { chromium, type Browser, type Page } from 'playwright-core'

export const BASE = process.env.GW_BASE_URL ?? 'http://localhost:3200'
export const SHOTS = fileURLToPath(new URL('./screenshots/', import.meta.url))
export const PASSWORD = 'brackwin-demo-2026'

/** Console errors, page errors and failed requests seen so far; a journey ends by asserting none. */
export const problems: string[] = []

/** Refusals the journey provokes on purpose (status → how many): the browser logs each one. */
const provoked = new Map<number, number>()

/** Announces a refusal with this status that the next step provokes on purpose. */
export function expectRefusal(status: number) {
  provoked.set(status, (provoked.get(status) ?? 0) + 1)
}

/** Refusals announced with `expectRefusal` that the browser never logged, as "status ×count" (empty when all were seen). */
export function unseenRefusals(): string[] {
  return [...provoked].filter(([, n]) => n > 0).map(([status, n]) => `${status} ×${n}`)
}

/** True (and counted off) when a console line is the browser's log of a refusal provoked on purpose. */
function wasProvoked(text: string): boolean {
  const status = Number(/Failed to load resource: the server responded with a status of (\d{3})/.exec(text)?.[1])
  const left = provoked.get(status) ?? 0
  if (!left) return false
  provoked.set(status, left - 1)
  return true
}

/**
 * Makes every full page load of `page` wait until Nuxt reports hydration done. A server-rendered
 * form is on screen before Vue hydrates it, and what a journey types before then is lost.
 */
function waitForHydrationOnLoad(page: Page): void {
  const goto = page.goto.bind(page)
  page.goto = (async (url: string, options?: Parameters<Page['goto']>[1]) => {
    const response = await goto(url, options)
    await page.waitForFunction(() => {
      type NuxtRoot = Element & { __vue_app__?: { config: { globalProperties: { $nuxt?: { isHydrating?: boolean } } } } }
      const app = (document.querySelector('#__nuxt') as NuxtRoot | null)?.__vue_app__
      return app?.config.globalProperties.$nuxt?.isHydrating === false
    })
    return response
  }) as Page['goto']
}

/** A fresh browser context and page that record every problem into `problems`. */
export async function openPage(browser: Browser, opts: { clipboard?: boolean } = {}): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1360, height: 1000 } })
  if (opts.clipboard) await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: BASE })
  const page = await context.newPage()
  waitForHydrationOnLoad(page)
  page.on('console', (m) => {
    if ((m.type() === 'error' || m.type() === 'warning') && !wasProvoked(m.text())) problems.push(`console ${m.type()} on ${page.url()}: ${m.text()}`)
  })
  page.on('pageerror', (e) => problems.push(`page error on ${page.url()}: ${e.message}`))
  page.on('requestfailed', (r) => {
    // A download link opened in a new tab may be cancelled by the browser; nothing else may fail.
    if (!/net::ERR_ABORTED/.test(r.failure()?.errorText ?? '')) problems.push(`request failed: ${r.url()} ${r.failure()?.errorText}`)
  })
  return page
}

/** A full-page screenshot into tests/e2e/screenshots/ (git-ignored). */
export async function shot(page: Page, name: string) {
  await page.waitForTimeout(300)
  await page.screenshot({ path: `${SHOTS}${name}.png`, fullPage: true })
}

/** Signs in on "/" and waits for the portfolio table. */
export async function signIn(page: Page, email: string, password = PASSWORD) {
  await page.goto(`${BASE}/`)
  await page.fill('#f-email', email)
  await page.fill('#f-password', password)
  await page.click('[data-testid=sign-in-form] button[type=submit]')
  await page.waitForSelector('[data-testid=site-table] tbody tr')
}

/** Opens a site from the portfolio table by its name (as a user clicks it) and answers its id. */
export async function openSiteFromPortfolio(page: Page, siteName: string): Promise<number> {
  await page.locator('[data-testid=site-table] tbody tr', { hasText: siteName }).locator('a').first().click()
  await page.waitForURL(/\/sites\/\d+$/)
  return Number(new URL(page.url()).pathname.split('/').pop())
}

/**
 * Waits until the first canvas inside `selector` has at least `min` painted (not fully transparent)
 * pixels and answers how many it has: a chart that mounted but drew nothing never passes.
 */
export async function waitForChart(page: Page, selector: string, min = 500): Promise<number> {
  const handle = await page.waitForFunction(
    ({ canvas, min }) => {
      const el = document.querySelector(canvas) as HTMLCanvasElement | null
      if (!el || el.width === 0 || el.height === 0) return false
      // Read a copy, so the chart's own canvas is never read back (Chrome warns when one is read often).
      const copy = document.createElement('canvas')
      copy.width = el.width
      copy.height = el.height
      const ctx = copy.getContext('2d', { willReadFrequently: true })
      if (!ctx) return false
      ctx.drawImage(el, 0, 0)
      const data = ctx.getImageData(0, 0, copy.width, copy.height).data
      let n = 0
      for (let i = 3; i < data.length; i += 4) if (data[i]! > 0) n++
      return n >= min ? n : false
    },
    { canvas: `${selector} canvas`, min },
  )
  return (await handle.jsonValue()) as number
}

/**
 * Runs a journey: launches headless Chromium (CHROMIUM_PATH, else Debian's), runs `steps`, closes
 * the browser, then requires that nothing went wrong in any page and that every refusal provoked on
 * purpose was seen. A failed step or check throws, so the journey's process exits non-zero.
 */
export async function runJourney(name: string, steps: (browser: Browser) => Promise<void>): Promise<void> {
  mkdirSync(SHOTS, { recursive: true })
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  })
  try {
    await steps(browser)
  } finally {
    await browser.close()
  }
  assert.deepEqual(problems, [], 'no console errors, page errors or failed requests')
  assert.deepEqual(unseenRefusals(), [], 'every refusal provoked on purpose was seen')
  console.log(`${name} journey passed; screenshots in ${SHOTS}`)
}
