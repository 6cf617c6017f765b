// Browser journey of a landowner with no account: the demo summary link, and nothing else.
// `npm test` runs it through scripts/e2e.mjs (its own server on a fresh demo database); by hand:
//   DATABASE_PATH=/tmp/ui.sqlite npm run db:seed
//   PORT=3200 NODE_ENV=production NUXT_SESSION_PASSWORD=… DATABASE_PATH=/tmp/ui.sqlite node <copy of .output>/server/index.mjs
//   GW_BASE_URL=http://localhost:3200 node --import tsx tests/e2e/landowner.e2e.ts
// The landowner opens the demo summary link (db/demo-scenario.ts, DEMO_SUMMARY_TOKEN), reads it on
// screen and in print, then tries the signed-in app's pages and API routes from the same browser and
// is turned away from each; a wrong token shows the neutral page. Drives Debian's chromium through
// playwright-core, saves screenshots to tests/e2e/screenshots/ and exits non-zero on the first failed
// check or on any console error, page error or failed request.
import assert from 'node:assert/strict'
import type { Browser, Page } from 'playwright-core'
import { CAUTIONS } from '../../shared/utils/cautions'
import { DEMO_REVIEW, DEMO_SUMMARY_TOKEN } from '../../db/demo-scenario'
import { BASE, expectRefusal, openPage, runJourney, shot, signIn, waitForChart } from './journey'

const ENGINEER = 'idris@tarnbeck.example'
const SITE = 'Hollin Mill weir'
const SUMMARY = `${BASE}/s/${DEMO_SUMMARY_TOKEN}`
// Words that belong to the organisation's data: none may show on a page the landowner is refused.
const PRIVATE_WORDS = [SITE, 'Skelby gauging weir', 'Cragg Foot drop', 'Brackwin Water', 'Tarn & Beck', 'idris@', 'Two units in the old leat']

/** The ids the landowner will try: found by the engineer in a context of their own, then closed. */
async function demoIds(browser: Browser): Promise<{ orgId: number; siteId: number }> {
  const page = await openPage(browser)
  await signIn(page, ENGINEER)
  const ids = await page.evaluate(async (name) => {
    const me = (await (await fetch('/api/me')).json()) as { memberships: { orgId: number }[] }
    const orgId = me.memberships[0]!.orgId
    const { sites } = (await (await fetch(`/api/orgs/${orgId}/sites/map`)).json()) as { sites: { id: number; name: string }[] }
    return { orgId, siteId: sites.find((s) => s.name === name)?.id ?? 0 }
  }, SITE)
  assert.ok(ids.siteId > 0, `${SITE} is a demo site`)
  await page.context().close()
  return ids
}

/** Every key at any depth of a JSON value, as dotted paths (array items as []). */
function keyPaths(value: unknown, prefix = ''): string[] {
  if (Array.isArray(value)) return value.flatMap((v) => keyPaths(v, `${prefix}[]`))
  if (value === null || typeof value !== 'object') return []
  return Object.entries(value).flatMap(([k, v]) => [`${prefix}${k}`, ...keyPaths(v, `${prefix}${k}.`)])
}

/** Asserts the page is the sign-in on "/" and shows nothing of the organisation's data. */
async function assertSignInOnly(page: Page, asked: string) {
  await page.waitForSelector('[data-testid=sign-in-form]')
  const url = new URL(page.url())
  assert.equal(url.pathname, '/', `${asked} lands on the sign-in`)
  const text = await page.innerText('body')
  for (const w of PRIVATE_WORDS) assert.ok(!text.includes(w), `${asked} shows nothing of the organisation (found "${w}")`)
  assert.equal(await page.locator('[data-testid=site-table]').count(), 0, `${asked} shows no site table`)
  assert.equal(await page.locator('[data-testid=org-switcher]').count(), 0, `${asked} shows no organisation switcher`)
}

async function landownerJourney(browser: Browser, ids: { orgId: number; siteId: number }) {
  const page = await openPage(browser)

  // 1. The summary link opens with no account: the site, its map and its chart are drawn.
  const opened = await page.goto(SUMMARY)
  assert.equal(opened?.status(), 200)
  await page.waitForSelector('[data-testid=summary-page]')
  assert.equal(await page.innerText('[data-testid=summary-page] h1'), SITE)
  assert.match(await page.title(), new RegExp(`^${SITE}: site summary`))
  await page.waitForSelector('[data-testid=summary-map] .leaflet-container')
  // The reach (a polyline) and the weir (a circle marker) are both drawn on the map.
  await page.waitForFunction(() => document.querySelectorAll('[data-testid=summary-map] path.leaflet-interactive').length >= 2)
  assert.match(await page.innerText('[data-testid=summary-where-note]'), /The weir is at 54\.5712° N, 2\.6581° W\.[\s\S]*about [\d,]+ m long/)
  assert.ok((await waitForChart(page, '[data-testid=summary-river] [data-testid=oxygen-chart]')) > 500, 'the oxygen chart is drawn')

  // 2. Headline figures, in plain words with their units.
  assert.match(await page.innerText('[data-testid=summary-energy]'), /\d[\d,]* MWh a year[\s\S]*about [\d,]+ homes[\s\S]*Assumption: .*kWh/)
  assert.match(await page.innerText('[data-testid=summary-scheme]'), /2 venturi units set in the weir[\s\S]*0\.55 m throat[\s\S]*2\.4 m at the weir/)
  assert.match(await page.innerText('[data-testid=summary-river]'), /At summer low flow \([A-Z][a-z]+, about \d+\.\d\d m³\/s\)[\s\S]*mg\/L/)
  assert.match(await page.innerText('[data-testid=summary-river-words]'), /With the scheme the river would carry/)
  assert.match(await page.innerText('[data-testid=summary-what-stays]'), /^At least \d+\.\d+ m³\/s always stays in the river over the weir; on a typical day about \d+ % of the river's flow still goes over the weir\./)
  assert.equal(await page.locator('[data-testid=summary-river] [data-testid=oxygen-table] tbody tr').count(), 12, 'one oxygen row a month')

  // 3. The review state, the reason and the conditions, and who to contact.
  const review = await page.innerText('[data-testid=summary-review]')
  assert.match(review, /Accepted with conditions/)
  assert.match(review, /decided \d{1,2} [A-Z][a-z]+ \d{4}/)
  assert.ok(review.includes('Hold the units off from June to September'), 'the conditions are shown')
  assert.match(review, /not a planning permission or a regulator's consent/)
  assert.match(await page.innerText('[data-testid=summary-contact]'), /Prepared by Idris Penrose of Tarn & Beck Renewables/)

  // 4. The cautions of PRODUCT.md: screening only, licensed engineers, river dangers, consents, gas.
  const cautions = await page.innerText('[data-testid=summary-cautions]')
  for (const c of CAUTIONS) assert.ok(cautions.includes(c.title) && cautions.includes(c.text), `the caution "${c.title}" is shown`)
  assert.match(cautions, /licensed or chartered engineer/)
  assert.match(cautions, /drowning/)
  assert.match(cautions, /consents of the local regulator/)
  assert.match(cautions, /supersaturate the water with dissolved gas/)
  assert.match(await page.innerText('footer'), /defers to local codes, the regulator and licensed engineers/)

  // 5. Read-only: no form fields, no buttons but Print (and the map's zoom), no links into the app.
  assert.equal(await page.locator('input, textarea, select, [contenteditable=true], form').count(), 0, 'no form fields on the summary')
  const buttons = await page.locator('button').evaluateAll((bs) => bs.map((b) => b.getAttribute('data-testid') ?? b.textContent?.trim()))
  assert.deepEqual(buttons, ['summary-print'], 'the only button is Print')
  const links = await page.locator('a[href]').evaluateAll((as) => as.map((a) => a.getAttribute('href') ?? ''))
  for (const href of links) assert.ok(href.startsWith('#'), `no link leaves the summary (found ${href})`)
  assert.equal(await page.locator('[data-testid=org-switcher], [data-testid=user-menu], nav').count(), 0, 'no menus or organisation switcher')
  for (const gone of ['[data-testid=review-decision-form]', '[data-testid=review-comment]', '[data-testid=comment-send]', '[data-testid=summary-link-form]']) {
    assert.equal(await page.locator(gone).count(), 0, `no ${gone} on the summary`)
  }
  const text = await page.innerText('body')
  for (const c of DEMO_REVIEW.comments) assert.ok(!text.includes(c.body.slice(0, 40)), 'no review comment is shown')
  assert.ok(!/@[a-z-]+\.example/.test(text), 'no e-mail address is shown')
  // How sure the figures are, in the sentences the server made from the demo run's stored numbers.
  const sure = (await page.locator('[data-testid=summary-how-sure]').innerText()).replace(/\s+/g, ' ')
  assert.match(sure, /In 9 (years|draws) of 10 .*the scheme would make at least [\d.,]+ MWh/, 'the P90 energy is said plainly')
  assert.match(sure, /(the river would|would the river) lose .*oxygen in its worst month/, 'how often the river would lose oxygen is said plainly')
  await shot(page, 'l01-summary')

  // 6. In print the Print button goes and the location note stays beside the map.
  await page.emulateMedia({ media: 'print' })
  assert.equal(await page.isVisible('[data-testid=summary-print]'), false, 'the print button is not printed')
  assert.equal(await page.isVisible('[data-testid=summary-where-note]'), true, 'the location note is printed beside the map')
  assert.equal(await page.isVisible('[data-testid=summary-cautions]'), true, 'the cautions are printed')
  await shot(page, 'l02-summary-print')
  await page.emulateMedia({ media: 'screen' })

  // 7. The summary's JSON holds only the summary: these keys, no ids, no e-mails, no comments.
  const json = await page.evaluate(async (token) => {
    const r = await fetch(`/api/public/summary/${token}`)
    return { status: r.status, cache: r.headers.get('cache-control'), body: (await r.json()) as unknown }
  }, DEMO_SUMMARY_TOKEN)
  assert.equal(json.status, 200)
  assert.equal(json.cache, 'no-store', 'the summary is never cached')
  const body = json.body as Record<string, unknown>
  assert.deepEqual(Object.keys(body).sort(), ['basis', 'cautions', 'commissioning', 'contact', 'energy', 'expiresAt', 'howSure', 'money', 'permissions', 'review', 'river', 'scheme', 'site'])
  const shape = (o: unknown) => Object.keys(o as object).sort()
  assert.deepEqual(shape(body.site), ['grossHead_m', 'location', 'name', 'reach', 'riverName'])
  assert.deepEqual(shape(body.scheme), ['description', 'optionName', 'outletDiameter_m', 'throatDiameter_m', 'units'])
  assert.deepEqual(shape(body.basis), ['assessedAt', 'engineVersion', 'kind'])
  assert.deepEqual(shape(body.energy), ['annualEnergy_MWh', 'annualUsePerHome_kWh', 'assumption', 'baseline', 'homesEquivalent', 'source'])
  assert.deepEqual(shape(body.howSure), ['energyP90_MWh', 'netLossProbability', 'recordP90Energy_MWh', 'sentences'])
  assert.deepEqual(shape(body.river), ['months', 'summary', 'target_mgL', 'whatStays'])
  assert.deepEqual(shape(body.review), ['conditions', 'decidedAt', 'decisionText', 'state', 'stateLabel'])
  assert.deepEqual(shape(body.contact), ['organisationName', 'preparedBy'])
  assert.deepEqual(shape(body.permissions), ['gaugingWarning', 'line'])
  const paths = keyPaths(body)
  assert.deepEqual(paths.filter((p) => /(^|\.)([a-z]*Id|id|email|token|comments?|note|createdBy|version)$/i.test(p)), [], 'no ids, e-mails, tokens, notes or comments at any depth')
  const raw = JSON.stringify(body)
  assert.ok(!raw.includes('@'), 'no e-mail address, and no @mention from a comment, anywhere in the summary')
  for (const c of DEMO_REVIEW.comments) assert.ok(!raw.includes(c.body.slice(0, 40)), 'no comment text in the summary')
  assert.ok(!raw.includes(DEMO_REVIEW.note.slice(0, 40)), 'no submission note in the summary')
  expectRefusal(405)
  const post = await page.evaluate(async (token) => (await fetch(`/api/public/summary/${token}`, { method: 'POST' })).status, DEMO_SUMMARY_TOKEN)
  assert.equal(post, 405, 'a summary is read-only')

  // 8. The signed-in pages all land on the sign-in, from the same browser.
  for (const path of ['/', `/sites/${ids.siteId}`, `/sites/${ids.siteId}?tab=options`, '/admin', '/admin/outbox', '/compare']) {
    await page.goto(`${BASE}${path}`)
    await assertSignInOnly(page, path)
    if (path !== '/') assert.equal(new URL(page.url()).searchParams.get('next'), path, `${path} is kept to return to after signing in`)
  }
  await shot(page, 'l03-refused-to-sign-in')

  // 9. The API routes behind them refuse the browser with 401, and say nothing of the organisation.
  const apis = ['/api/me', `/api/orgs/${ids.orgId}/sites`, `/api/orgs/${ids.orgId}/sites/map`, `/api/sites/${ids.siteId}`, `/api/sites/${ids.siteId}/options`, `/api/sites/${ids.siteId}/comments`, `/api/orgs/${ids.orgId}/summary-links`]
  for (const path of apis) {
    expectRefusal(401)
    const r = await page.evaluate(async (p) => {
      const res = await fetch(p)
      return { status: res.status, text: await res.text() }
    }, path)
    assert.equal(r.status, 401, `${path} refuses a visitor without an account`)
    for (const w of PRIVATE_WORDS) assert.ok(!r.text.includes(w), `${path}'s refusal says nothing of the organisation (found "${w}")`)
  }
  // A write is refused too, and changes nothing.
  expectRefusal(401)
  const write = await page.evaluate(async (id) => (await fetch(`/api/sites/${id}`, { method: 'PATCH', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ version: 1, notes: 'landowner was here' }) })).status, ids.siteId)
  assert.equal(write, 401)

  // 10. A wrong token: the neutral page with a 404, which says nothing about any site.
  // The page itself must answer 404 too (checked last, below); the browser logs that refusal.
  expectRefusal(404)
  const wrong = await page.goto(`${BASE}/s/not-a-real-token`)
  await page.waitForSelector('[data-testid=summary-unavailable]')
  assert.equal(await page.locator('[data-testid=summary-page]').count(), 0)
  assert.match(await page.innerText('[data-testid=summary-unavailable] h1'), /This summary link is no longer available/)
  const neutral = await page.innerText('body')
  for (const w of [...PRIVATE_WORDS, 'Idris', 'expired', 'revoked']) assert.ok(!neutral.includes(w), `the neutral page does not say "${w}"`)
  expectRefusal(404)
  const wrongJson = await page.evaluate(async () => {
    const r = await fetch('/api/public/summary/not-a-real-token')
    return { status: r.status, text: await r.text() }
  })
  assert.equal(wrongJson.status, 404)
  for (const w of PRIVATE_WORDS) assert.ok(!wrongJson.text.includes(w), `the 404 says nothing of any site (found "${w}")`)
  await shot(page, 'l04-wrong-token')

  // 11. The real link still works afterwards: the refusals did not touch it.
  await page.goto(SUMMARY)
  await page.waitForSelector('[data-testid=summary-page]')
  assert.equal(await page.innerText('[data-testid=summary-page] h1'), SITE)
  await page.context().close()

  // 12. Last, so every step above has run: the wrong token's page answered with a 404 status.
  assert.equal(wrong?.status(), 404, 'the page for a wrong token answers 404, not 200')
}

await runJourney('landowner', async (browser) => {
  const ids = await demoIds(browser)
  await landownerJourney(browser, ids)
})
