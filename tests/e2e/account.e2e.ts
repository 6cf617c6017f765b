// Browser journey of a person's own account: sign up, confirm the address with the e-mailed link,
// see the browsers signed in and sign the others out, change the password; and the demo's new
// starter, whose address is not confirmed yet. `npm test` runs it through scripts/e2e.mjs (its own
// server on a fresh demo database, GW_DATABASE_PATH pointing at it so the journey can read the
// outbox, as a person reads their mail). Exits non-zero on the first failed check or on any console
// error, page error or failed request.
import assert from 'node:assert/strict'
import Database from 'better-sqlite3'
import type { Page } from 'playwright-core'
import { DEMO_PENDING_ACCOUNT } from '../../db/demo-scenario'
import { BASE, PASSWORD, expectRefusal, openPage, runJourney, shot } from './journey'

const EMAIL = `ffion.${Date.now().toString(36)}@account-journey.example`
const FIRST_PASSWORD = 'a first long passphrase'
const SECOND_PASSWORD = 'a second long passphrase'

/** The link of the newest e-mail of `kind` to `to`, read from the outbox. */
function linkFromMail(to: string, kind: string, prefix: string): string {
  const path = process.env.GW_DATABASE_PATH
  assert.ok(path, 'GW_DATABASE_PATH names the journey server database')
  const db = new Database(path, { readonly: true })
  try {
    const row = db.prepare('select text from outbox where to_address = ? and kind = ? order by id desc limit 1').get(to, kind) as { text: string } | undefined
    assert.ok(row, `a ${kind} e-mail to ${to}`)
    const token = new RegExp(`${prefix}/([A-Za-z0-9_-]{20,})`).exec(row.text)?.[1]
    assert.ok(token, `the ${kind} e-mail carries its link`)
    return `${BASE}${prefix}/${token}`
  } finally {
    db.close()
  }
}

/** Signs in on "/" and waits for the user menu (a new person has no sites to wait for). */
async function signInAs(page: Page, email: string, password: string) {
  await page.goto(`${BASE}/`)
  await page.fill('#f-email', email)
  await page.fill('#f-password', password)
  await page.click('[data-testid=sign-in-form] button[type=submit]')
  await page.waitForSelector('[data-testid=user-menu]')
}

await runJourney('account', async (browser) => {
  // 1. Sign up: the new account is signed in and asked to confirm its address.
  const laptop = await openPage(browser)
  await laptop.goto(`${BASE}/signup`)
  await laptop.fill('#f-name', 'Ffion Carrow')
  await laptop.fill('#f-email', EMAIL)
  await laptop.fill('#f-password', FIRST_PASSWORD)
  await laptop.fill('#f-organisationName', 'Carrow Hydro (invented)')
  await laptop.click('[data-testid=sign-up-form] button[type=submit]')
  await laptop.waitForSelector('[data-testid=verify-notice]')
  assert.match(await laptop.innerText('[data-testid=verify-notice]'), new RegExp(`Confirm that ${EMAIL.replace(/\./g, '\\.')} is yours`))
  await shot(laptop, 'a01-signed-up-unconfirmed')

  // 2. The link from the e-mail confirms the address; the notice goes.
  await laptop.goto(linkFromMail(EMAIL, 'verify-email', '/verify-email'))
  await laptop.waitForFunction(() => /confirmed/.test(document.querySelector('[data-testid=verify-email]')?.textContent ?? ''))
  await shot(laptop, 'a02-address-confirmed')
  await laptop.goto(`${BASE}/account`)
  await laptop.waitForSelector('[data-testid=account-sessions] tbody tr')
  assert.equal(await laptop.locator('[data-testid=verify-notice]').count(), 0, 'no notice once confirmed')
  assert.match(await laptop.innerText('main'), /address confirmed/)

  // 3. A second browser signs in; the first lists both and signs the other out.
  const phone = await openPage(browser)
  await signInAs(phone, EMAIL, FIRST_PASSWORD)
  await laptop.reload()
  await laptop.waitForFunction(() => document.querySelectorAll('[data-testid=account-sessions] tbody tr').length === 2)
  assert.match(await laptop.innerText('[data-testid=account-sessions]'), /This browser/)
  await shot(laptop, 'a03-two-sessions')
  await laptop.click('[data-testid=end-other-sessions]')
  await laptop.waitForFunction(() => /One other browser was signed out/.test(document.querySelector('[data-testid=account-sessions]')?.textContent ?? ''))
  // The list is read again after the message shows: wait for it to hold this browser only.
  await laptop.waitForFunction(() => document.querySelectorAll('[data-testid=account-sessions] tbody tr').length === 1)
  // The phone's cookie is worth nothing now: the next page load is the sign-in.
  await phone.goto(`${BASE}/account`)
  await phone.waitForSelector('[data-testid=sign-in-form]')

  // 4. Changing the password: a wrong current one is named; the right one works.
  await laptop.fill('#f-current-password', 'not my password at all')
  await laptop.fill('#f-new-password', SECOND_PASSWORD)
  expectRefusal(400)
  await laptop.click('[data-testid=password-form] button[type=submit]')
  await laptop.waitForSelector('#f-current-password-error')
  assert.match(await laptop.innerText('#f-current-password-error'), /is not your current password/)
  await laptop.fill('#f-current-password', FIRST_PASSWORD)
  await laptop.click('[data-testid=password-form] button[type=submit]')
  await laptop.waitForFunction(() => /Your password has been changed/.test(document.querySelector('[data-testid=password-form]')?.textContent ?? ''))
  await shot(laptop, 'a04-password-changed')
  await signInAs(phone, EMAIL, SECOND_PASSWORD)

  // 5. The demo's new starter: signed in, asked to confirm, in no organisation yet.
  const starter = await openPage(browser)
  await signInAs(starter, DEMO_PENDING_ACCOUNT.email, PASSWORD)
  await starter.waitForSelector('[data-testid=verify-notice]')
  await starter.goto(`${BASE}/account`)
  await starter.waitForSelector('[data-testid=account-organisations]')
  assert.match(await starter.innerText('[data-testid=account-organisations]'), /You do not belong to any organisation/)
  await shot(starter, 'a05-new-starter')
})
