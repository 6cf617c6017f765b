// Browser journey of the consents list: the engineer edits a permission at Skelby gauging weir (a
// decision date before the application date is refused naming the field, the fixed row is saved and
// kept over a reload), sets the nearest dwelling and sees the gauging warning; the reviewer sees the
// consents block in the brief and records a decision requiring the flood-risk permit; the landowner's
// summary shows the permissions line. `npm test` runs it through scripts/e2e.mjs on a fresh demo
// database; by hand after `npm run build`: node scripts/e2e.mjs tests/e2e/consents.e2e.ts
import assert from 'node:assert/strict'
import type { Browser, Page } from 'playwright-core'
import { DEMO_SUMMARY_TOKEN } from '../../db/demo-scenario'
import { BASE, openPage, runJourney, shot, signIn } from './journey'

const ENGINEER = 'idris@tarnbeck.example'
const REVIEWER = 'elspeth@fellside-agency.example'
const SITE = 'Skelby gauging weir'

async function siteIdOf(page: Page, name: string): Promise<number> {
  return page.evaluate(async (name) => {
    const me = (await (await fetch('/api/me')).json()) as { memberships: { orgId: number }[] }
    const { sites } = (await (await fetch(`/api/orgs/${me.memberships[0]!.orgId}/sites/map`)).json()) as { sites: { id: number; name: string }[] }
    return sites.find((s) => s.name === name)?.id ?? 0
  }, name)
}

async function engineerJourney(browser: Browser): Promise<number> {
  const page = await openPage(browser)
  await signIn(page, ENGINEER)
  const siteId = await siteIdOf(page, SITE)
  assert.ok(siteId > 0, `${SITE} is a demo site`)
  await page.goto(`${BASE}/sites/${siteId}?tab=consents`)
  await page.waitForSelector('[data-testid=consents-table]')
  assert.equal(await page.locator('[data-testid=consents-table] tbody tr[data-testid^=consent-row-]').count(), 11, 'every kind of permission is listed')
  assert.match(await page.innerText('[data-testid=consents-gauging-warning]'), /gauging station[\s\S]*alters its rating/)
  assert.match(await page.innerText('[data-testid=consent-row-gauging-station]'), /Applied for/)

  // A decision before the application: refused in the form, naming the field.
  await page.click('[data-testid=consent-edit-flood-risk-permit]')
  const form = '[data-testid=consent-form-flood-risk-permit]'
  await page.selectOption(`${form} [data-testid=consent-status-select]`, 'granted-with-conditions')
  await page.fill(`${form} [data-testid=consent-reference]`, 'FRA/FRP/2026/0977')
  await page.fill(`${form} [data-testid=consent-applied]`, '2026-09-01')
  await page.fill(`${form} [data-testid=consent-decided]`, '2026-08-01')
  await page.click(`${form} [data-testid=consent-save]`)
  await page.waitForSelector('#consent-flood-risk-permit-decidedOn-error')
  assert.match(await page.innerText('#consent-flood-risk-permit-decidedOn-error'), /must not be before the application date \(2026-09-01\)/)
  await shot(page, 'c01-consent-date-error')

  // Fixed and saved: the row shows the new status, reference and dates.
  await page.fill(`${form} [data-testid=consent-decided]`, '2026-10-12')
  await page.fill(`${form} [data-testid=consent-conditions]`, 'No plant in the channel from October to March.')
  await page.click(`${form} [data-testid=consent-save]`)
  await page.waitForSelector(form, { state: 'detached' })
  const row = '[data-testid=consent-row-flood-risk-permit]'
  await page.waitForFunction((sel) => document.querySelector(sel)?.textContent?.includes('FRA/FRP/2026/0977'), row)

  // The nearest dwelling, for the noise check (this option gives no sound power: it says what is missing).
  await page.fill('[data-testid=constraints-distance]', '250')
  await page.click('[data-testid=consents-noise] [data-testid=save]')
  await page.waitForSelector('[data-testid=consents-noise] [data-testid=saved]')
  assert.match(await page.innerText('[data-testid=noise-result]'), /sound power level/)

  // Kept over a reload.
  await page.goto(`${BASE}/sites/${siteId}?tab=consents`)
  await page.waitForSelector('[data-testid=consents-table]')
  const text = await page.innerText(row)
  assert.match(text, /Granted with conditions/)
  assert.match(text, /FRA\/FRP\/2026\/0977/)
  assert.match(text, /1 Sep 2026/)
  assert.match(text, /12 Oct 2026/)
  assert.equal(await page.inputValue('[data-testid=constraints-distance]'), '250')
  await shot(page, 'c02-consents-saved')

  // Submitted for review, so the reviewer has something to decide.
  await page.goto(`${BASE}/sites/${siteId}?tab=review`)
  await page.waitForSelector('[data-testid=review-submit-form] select option', { state: 'attached' })
  await page.click('[data-testid=review-submit]')
  await page.waitForSelector('[data-testid=review-state][data-state=submitted]')
  await page.context().close()
  return siteId
}

async function reviewerJourney(browser: Browser, siteId: number) {
  const page = await openPage(browser)
  await signIn(page, REVIEWER)
  await page.goto(`${BASE}/sites/${siteId}?tab=review`)
  await page.waitForSelector('[data-testid=brief-consents]')
  const block = await page.innerText('[data-testid=brief-consents]')
  assert.match(block, /Permissions: 1 of 11 granted, 1 applied for/)
  assert.match(block, /Still to get:.*Abstraction licence/)
  assert.match(block, /gauging station/)
  await page.check('[data-testid=decision-accepted]')
  await page.check('[data-testid=require-flood-risk-permit]')
  await page.fill('#f-decision-reason', 'Acceptable once the flood-risk permit is in hand.')
  await page.click('[data-testid=decision-send]')
  await page.waitForSelector('[data-testid=decision-confirm]')
  assert.match(await page.innerText('[data-testid=decision-confirm]'), /requires: flood-risk permit granted/, 'the confirmation shows the permissions it will require')
  await page.click('[data-testid=decision-confirm-send]')
  await page.waitForSelector('[data-testid=review-decision-requires]')
  assert.equal(await page.innerText('[data-testid=review-decision-requires]'), 'requires: flood-risk permit granted')
  await shot(page, 'c03-decision-requires')
  // A reviewer reads the list but cannot edit it.
  await page.goto(`${BASE}/sites/${siteId}?tab=consents`)
  await page.waitForSelector('[data-testid=consents-table]')
  assert.equal(await page.locator('[data-testid^=consent-edit-]').count(), 0, 'reviewers get no edit buttons')
  await page.context().close()
}

async function landownerJourney(browser: Browser) {
  const page = await openPage(browser)
  await page.goto(`${BASE}/s/${DEMO_SUMMARY_TOKEN}`)
  await page.waitForSelector('[data-testid=summary-permissions]')
  assert.equal(await page.innerText('[data-testid=summary-permissions-line]'), 'Permissions: 3 of 10 granted, 2 applied for, 1 refused (grid connection).')
  await shot(page, 'c04-summary-permissions')
  await page.context().close()
}

await runJourney('consents', async (browser) => {
  const siteId = await engineerJourney(browser)
  await reviewerJourney(browser, siteId)
  await landownerJourney(browser)
})
