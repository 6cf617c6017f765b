// Browser journey through a site's commissioning checks, against a running, seeded server (run by
// `node scripts/e2e.mjs tests/e2e/commissioning.e2e.ts` after `npm run build`): the engineer sees the
// demo record's verdict, is told about a bad reading and an upstream oxygen at saturation, watches the
// preview, stores a record and finds it again after a reload; the reviewer reads the records without
// a form and sees the latest verdict in the brief; the landowner's summary says it in one line.
// Drives Debian's chromium through playwright-core, saves screenshots to tests/e2e/screenshots/ and
// exits non-zero on the first failed check or on any console error, page error or failed request.
import assert from 'node:assert/strict'
import type { Browser, Page } from 'playwright-core'
import { DEMO_SUMMARY_TOKEN } from '../../db/demo-scenario'
import { BASE, expectRefusal, openPage, runJourney, shot, signIn } from './journey'

const ENGINEER = 'idris@tarnbeck.example'
const REVIEWER = 'elspeth@fellside-agency.example'
const SITE = 'Hollin Mill weir'

async function siteIdOf(page: Page, name: string): Promise<number> {
  const orgs = await page.evaluate(async () => (await (await fetch('/api/me')).json()).memberships as { orgId: number }[])
  const list = await page.evaluate(async (orgId) => (await (await fetch(`/api/orgs/${orgId}/sites/map`)).json()).sites as { id: number; name: string }[], orgs[0]!.orgId)
  const site = list.find((s) => s.name === name)
  assert.ok(site, `${name} is a demo site`)
  return site.id
}

const tab = (id: number) => `${BASE}/sites/${id}?tab=commissioning`

async function engineerJourney(browser: Browser): Promise<number> {
  const page = await openPage(browser)
  await signIn(page, ENGINEER)
  const siteId = await siteIdOf(page, SITE)
  await page.goto(tab(siteId))
  await page.waitForSelector('[data-testid=commissioning-form]')
  // The demo's October measurement performs as assessed.
  const records = page.locator('[data-testid=commissioning-records] article')
  assert.equal(await records.count(), 1)
  assert.match(await records.first().innerText(), /Cerys Dunmoor/)
  assert.match(await records.first().locator('[data-testid=flow-verdict]').innerText(), /performs as assessed/)
  // The cautions stand beside the fields where a person takes the readings.
  assert.match(await page.innerText('#caution-manometer'), /confined space/)
  assert.match(await page.innerText('#caution-oxygen'), /drowns/)
  await shot(page, 'c01-commissioning-tab')

  await page.fill('#f-measuredAt', '2026-11-20T10:15')
  await page.fill('#f-measuredBy', 'Cerys Dunmoor')
  await page.fill('#f-riverFlow_m3s', '5.8')
  await page.fill('#f-waterTemp_C', '8.5')
  await page.fill('#f-reading_m', '0')
  await page.fill('#f-upstreamOxygen_mgL', '10.4')
  await page.fill('#f-downstreamOxygen_mgL', '11.0')
  await page.selectOption('#f-oxygenMeasuredAt', 'below-weir')
  await page.click('[data-testid=commissioning-save]')
  await page.waitForSelector('#f-reading_m-error')
  assert.match(await page.innerText('#f-reading_m-error'), /must be more than 0/)

  // The preview works the figures out as they are typed.
  await page.fill('#f-reading_m', '0.85')
  await page.waitForSelector('[data-testid=preview-flow]')
  assert.match(await page.innerText('[data-testid=preview-flow]'), /^\d\.\d{3} m³\/s$/)
  assert.match(await page.innerText('[data-testid=preview-transfer]'), /%$/)
  // A head "in metres of water" read on mercury is warned about.
  await page.selectOption('#f-readingUnit', 'm-of-water')
  await page.waitForSelector('[data-testid=preview-warning]')
  assert.match(await page.innerText('[data-testid=preview-warning]'), /metres of water/)
  await page.selectOption('#f-readingUnit', 'm-of-manometer-fluid')
  await shot(page, 'c02-commissioning-preview')

  // Upstream oxygen past saturation: the preview says so and the server refuses the field.
  await page.fill('#f-upstreamOxygen_mgL', '13')
  await page.waitForSelector('[data-testid=commissioning-preview] [role=alert]')
  expectRefusal(422)
  await page.click('[data-testid=commissioning-save]')
  await page.waitForSelector('#f-upstreamOxygen_mgL-error')
  assert.match(await page.innerText('#f-upstreamOxygen_mgL-error'), /at or above saturation/)

  await page.fill('#f-upstreamOxygen_mgL', '10.4')
  await page.click('[data-testid=commissioning-save]')
  await page.waitForFunction(() => document.querySelectorAll('[data-testid=commissioning-records] article').length === 2)
  const newest = records.first()
  assert.match(await newest.innerText(), /2026-11-20 10:15 · Cerys Dunmoor/)
  assert.match(await newest.locator('[data-testid=flow-verdict]').innerText(), /performs as assessed|below by \d+ %|above by \d+ %/)
  assert.match(await newest.locator('[data-testid=oxygen-verdict]').innerText(), /performs as assessed|below by \d+ %|above by \d+ %/)
  const stored = await newest.innerText()
  await shot(page, 'c03-commissioning-stored')

  await page.reload()
  await page.waitForSelector('[data-testid=commissioning-records] article')
  assert.equal(await records.count(), 2)
  assert.equal(await records.first().innerText(), stored)
  await page.context().close()
  return siteId
}

async function reviewerJourney(browser: Browser, siteId: number) {
  const page = await openPage(browser)
  await signIn(page, REVIEWER)
  await page.goto(tab(siteId))
  await page.waitForSelector('[data-testid=commissioning-records] article')
  assert.equal(await page.locator('[data-testid=commissioning-records] article').count(), 2)
  assert.equal(await page.locator('[data-testid=commissioning-form]').count(), 0, 'reviewers get no form')
  assert.equal(await page.locator('[data-testid=commissioning-records] button', { hasText: 'Remove' }).count(), 0, 'reviewers cannot remove records')
  assert.equal(await page.isEnabled('[data-testid=commissioning-csv]'), true, 'reviewers can download the records')
  await shot(page, 'c04-commissioning-reviewer')
  await page.goto(`${BASE}/sites/${siteId}?tab=review`)
  await page.waitForSelector('[data-testid=brief-commissioning]')
  assert.match(await page.innerText('[data-testid=brief-commissioning]'), /Measured on 20 November 2026/)
  await page.context().close()
}

/** The landowner's summary (no sign-in) says the latest measurement in one plain line. */
async function landownerLine(browser: Browser) {
  const page = await openPage(browser)
  await page.goto(`${BASE}/s/${DEMO_SUMMARY_TOKEN}`)
  await page.waitForSelector('[data-testid=summary-commissioning]')
  assert.match(await page.innerText('[data-testid=summary-commissioning]'), /Measured on 20 November 2026: /)
  await shot(page, 'c05-commissioning-landowner')
  await page.context().close()
}

await runJourney('commissioning', async (browser) => {
  const siteId = await engineerJourney(browser)
  await reviewerJourney(browser, siteId)
  await landownerLine(browser)
})
