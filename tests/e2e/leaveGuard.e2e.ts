// Browser journey: unsaved edits are never thrown away without a question. The demo engineer edits a
// site's overview and tries another tab (asked; staying keeps the edit, leaving drops it), edits an
// option and follows a link away, then tries to close the browser tab on an unsaved edit.
// Run: npm run build && node scripts/e2e.mjs tests/e2e/leaveGuard.e2e.ts
import assert from 'node:assert/strict'
import type { Browser, Dialog, Page } from 'playwright-core'
import { LEAVE_QUESTION } from '../../utils/formState'
import { BASE, openPage, openSiteFromPortfolio, runJourney, shot, signIn } from './journey'

const ENGINEER = 'idris@tarnbeck.example'
const SITE = 'Cragg Foot drop'

/** Runs `act`, answering the one dialog it must raise with `accept`; answers the dialog seen. */
async function answering(page: Page, accept: boolean, act: () => Promise<void>): Promise<Dialog> {
  const seen = new Promise<Dialog>((resolve) => page.once('dialog', (d) => {
    resolve(d)
    void (accept ? d.accept() : d.dismiss())
  }))
  await act()
  return seen
}

async function engineerJourney(browser: Browser) {
  const page = await openPage(browser)
  await signIn(page, ENGINEER)
  const siteId = await openSiteFromPortfolio(page, SITE)
  await page.waitForSelector('[data-testid=site-overview-form]')

  // 1. Nothing edited: the tabs change without a question.
  await page.click('[data-testid=tab-hydrology]')
  await page.waitForURL(`${BASE}/sites/${siteId}?tab=hydrology`)
  await page.click('[data-testid=tab-overview]')
  await page.waitForSelector('[data-testid=site-overview-form]')

  // 2. An unsaved edit: another tab asks; staying keeps the edit where it was.
  await page.fill('#f-notes', 'A note not yet saved.')
  const stay = await answering(page, false, () => page.click('[data-testid=tab-months]'))
  assert.equal(stay.type(), 'confirm')
  assert.equal(stay.message(), LEAVE_QUESTION)
  await page.waitForTimeout(300)
  assert.equal(new URL(page.url()).search, '', 'still on the overview')
  assert.equal(await page.inputValue('#f-notes'), 'A note not yet saved.', 'the edit is still there')
  await shot(page, 'l01-asked-to-leave')

  // 3. Leaving on purpose drops it: the months tab opens, and the overview comes back as stored.
  await answering(page, true, () => page.click('[data-testid=tab-months]'))
  await page.waitForURL(`${BASE}/sites/${siteId}?tab=months`)
  await page.click('[data-testid=tab-overview]')
  await page.waitForSelector('[data-testid=site-overview-form]')
  assert.notEqual(await page.inputValue('#f-notes'), 'A note not yet saved.', 'the unsaved note was let go')

  // 4. The option editor asks too before a link takes the user away.
  await page.click('[data-testid=tab-options]')
  await page.locator('[data-testid=option-list] tbody tr a').first().click()
  await page.waitForURL(/\/options\/\d+$/)
  await page.waitForSelector('[data-testid=option-form]')
  const optionUrl = page.url()
  await page.fill('#opt-design-units', '3')
  await answering(page, false, () => page.locator('header a', { hasText: 'Portfolio' }).click())
  await page.waitForTimeout(300)
  assert.equal(page.url(), optionUrl, 'staying on the option keeps the edit')
  assert.equal(await page.inputValue('#opt-design-units'), '3')

  // 5. Closing the browser tab on an unsaved edit raises the browser's own question.
  const closing = await answering(page, true, () => page.close({ runBeforeUnload: true }))
  assert.equal(closing.type(), 'beforeunload')
  await page.context().close()
}

await runJourney('leave guard', engineerJourney)
