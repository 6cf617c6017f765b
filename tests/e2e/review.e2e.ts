// Browser journey through review, making and revoking summary links, invitations, password reset
// and administration, against a running, seeded server (what a landowner sees behind a summary link
// is tests/e2e/landowner.e2e.ts):
//   DATABASE_PATH=/tmp/ui.sqlite npm run db:seed
//   PORT=3200 NODE_ENV=production NUXT_SESSION_PASSWORD=… DATABASE_PATH=/tmp/ui.sqlite node <copy of .output>/server/index.mjs
//   GW_BASE_URL=http://localhost:3200 GW_DATABASE_PATH=/tmp/ui.sqlite node --import tsx tests/e2e/review.e2e.ts
// The review and sharing panels are opened at GW_REVIEW_PATH and GW_SHARING_PATH ({id} is the site id;
// by default the site page's review and sharing tabs). GW_DATABASE_PATH is read only to find the
// password-reset link, which by design never shows in any organisation's outbox.
// Drives Debian's chromium through playwright-core, saves screenshots to tests/e2e/screenshots/ and
// exits non-zero on the first failed check or on any console error, page error or failed request.
import assert from 'node:assert/strict'
import Database from 'better-sqlite3'
import type { Browser, Page } from 'playwright-core'
import { BASE, expectRefusal, openPage, runJourney, shot, signIn } from './journey'

const DB_PATH = process.env.GW_DATABASE_PATH ?? ''
const REVIEW_PATH = process.env.GW_REVIEW_PATH ?? '/sites/{id}?tab=review'
const SHARING_PATH = process.env.GW_SHARING_PATH ?? '/sites/{id}?tab=sharing'
const ADMIN = 'morwenna@tarnbeck.example'
const ENGINEER = 'idris@tarnbeck.example'
const REVIEWER = 'elspeth@fellside-agency.example'
const VIEWER = 'tobias@brackwin-farm.example'
const INVITED = 'bryony@fellside-agency.example'
// The demo's draft site (Hollin Mill weir is already decided in the demo scenario).
const SITE = 'Skelby gauging weir'



const at = (path: string, id: number) => `${BASE}${path.replace('{id}', String(id))}`

async function siteIdOf(page: Page, name: string): Promise<number> {
  const orgs = await page.evaluate(async () => (await (await fetch('/api/me')).json()).memberships as { orgId: number }[])
  const list = await page.evaluate(async (orgId) => (await (await fetch(`/api/orgs/${orgId}/sites/map`)).json()).sites as { id: number; name: string }[], orgs[0]!.orgId)
  const site = list.find((s) => s.name === name)
  assert.ok(site, `${name} is a demo site`)
  return site.id
}

/** The engineer submits the site for review and shares a summary link; answers the link's URL. */
async function engineerJourney(browser: Browser, siteId: number): Promise<string> {
  const page = await openPage(browser, { clipboard: true })
  await signIn(page, ENGINEER)
  await page.goto(at(REVIEW_PATH, siteId))
  await page.waitForSelector('[data-testid=review-submit-form] select option', { state: 'attached' })
  assert.equal(await page.getAttribute('[data-testid=review-state]', 'data-state'), 'draft')
  assert.match(await page.innerText('#f-review-assessment'), /MWh\/yr · [+-]?\d+\.\d\d mg\/L at summer low flow/)
  assert.equal(await page.locator('[data-testid=review-decision-form]').count(), 0, 'engineers get no decision form')
  await shot(page, 'r01-engineer-submit')
  await page.fill('#f-review-note', 'Pair below the gauging section; reserved flow kept at Q95.')
  await page.click('[data-testid=review-submit]')
  await page.waitForSelector('[data-testid=review-state][data-state=submitted]')
  await page.waitForSelector('[data-testid=review-history] li')
  assert.match(await page.innerText('[data-testid=review-history]'), /Submitted by Idris Penrose/)

  await page.goto(at(SHARING_PATH, siteId))
  await page.waitForSelector('[data-testid=summary-link-form]')
  await page.fill('#f-link-days', '0')
  await page.click('[data-testid=summary-link-create]')
  await page.waitForSelector('#f-link-days-error')
  await page.fill('#f-link-days', '14')
  await page.fill('#f-link-note', 'For Tobias at Brackwin Farm')
  await page.click('[data-testid=summary-link-create]')
  await page.waitForSelector('[data-testid=summary-link-created]')
  const url = await page.inputValue('[data-testid=summary-link-url]')
  assert.match(url, /\/s\/[A-Za-z0-9_-]{20,}$/)
  await page.click('[data-testid=summary-link-copy]')
  await page.waitForFunction(() => document.querySelector('[data-testid=summary-link-copy]')?.textContent?.trim() === 'Copied')
  assert.equal(await page.evaluate(() => navigator.clipboard.readText()), url)
  await page.waitForSelector('[data-testid=summary-link-table] tbody tr')
  assert.match(await page.innerText('[data-testid=summary-link-table] tbody tr'), /For Tobias at Brackwin Farm[\s\S]*Open[\s\S]*14 days left/)
  await shot(page, 'r02-summary-link-created')
  await page.context().close()
  // The new link opens the summary without an account (the admin revokes it below; what the
  // summary shows a landowner is checked in landowner.e2e.ts).
  const visitor = await openPage(browser, { clipboard: true })
  await visitor.goto(url)
  await visitor.waitForSelector('[data-testid=summary-page]')
  assert.equal(await visitor.innerText('[data-testid=summary-page] h1'), SITE)
  await visitor.context().close()
  return url
}

/** The reviewer reads the brief, is refused without conditions, decides with conditions, comments. */
async function reviewerJourney(browser: Browser, siteId: number) {
  const page = await openPage(browser, { clipboard: true })
  await signIn(page, REVIEWER)
  await page.goto(at(REVIEW_PATH, siteId))
  await page.waitForSelector('[data-testid=review-brief]')
  await page.waitForSelector('[data-testid=oxygen-chart] canvas')
  // The brief leads: it comes before the decision form, and says what is judged with units.
  const order = await page.evaluate(() => {
    const brief = document.querySelector('[data-testid=review-brief]')!
    const form = document.querySelector('[data-testid=review-decision-form]')!
    return brief.compareDocumentPosition(form) & Node.DOCUMENT_POSITION_FOLLOWING
  })
  assert.ok(order, 'the brief comes before the decision form')
  // Its first block is the finding: the raised flags (the demo scheme does not pay), the worst month, the upstream oxygen's status.
  const lead = await page.evaluate(() => document.querySelector('[data-testid=review-brief] [data-testid^=brief-]')?.getAttribute('data-testid'))
  assert.equal(lead, 'brief-lead', 'the brief leads with its finding')
  const flagsShown = await page.locator('[data-testid=brief-lead-flag]').allInnerTexts()
  assert.ok(flagsShown.some((t) => /^Does not pay: revenue/.test(t)), `the raised money flag is in the lead (${flagsShown.join(' | ')})`)
  assert.match(await page.innerText('[data-testid=brief-lead]'), new RegExp(`^${flagsShown.length} flags? (is|are) raised:`))
  assert.ok(flagsShown.every((t) => !/^(.+?)\. \1/.test(t)), 'no flag repeats its own title')
  assert.match(await page.innerText('[data-testid=brief-lead-worst]'), /^Worst month for the river: [A-Z][a-z]{2}, [+−]?\d+\.\d\d mg\/L with the scheme/)
  assert.match(await page.innerText('[data-testid=brief-lead-upstream]'), /^Upstream oxygen: measured in (all 12 months|\d+ of 12 months; in .+ a value nobody measured stands in)/)
  assert.match(await page.innerText('[data-testid=brief-reserved]'), /\d\.\d\d m³\/s always left in the river/)
  assert.match(await page.innerText('[data-testid=brief-gain]'), /[+-]?\d+\.\d\d mg\/L/)
  assert.match(await page.innerText('[data-testid=brief-gas]'), /(Flag raised|Clear) · \d+ % total dissolved gas/)
  assert.equal(await page.locator('[data-testid=oxygen-table] tbody tr').count(), 12)
  assert.equal(await page.locator('[data-testid=review-submit-form]').count(), 0, 'reviewers get no submit form')

  await page.click('[data-testid=decision-send]')
  await page.waitForSelector('#f-decision-error')
  await page.check('[data-testid=decision-accepted-with-conditions]')
  await page.fill('#f-decision-reason', 'Oxygen gain is real in the dry months; gas stays under the limit.')
  await page.click('[data-testid=decision-send]')
  await page.waitForSelector('#f-decision-conditions-error')
  assert.match(await page.innerText('#f-decision-conditions-error'), /required/)
  await shot(page, 'r03-reviewer-brief-errors')
  await page.fill('#f-decision-conditions', 'Keep the reserved flow at all times.\nMeasure dissolved gas below the weir through the first summer.')
  await page.click('[data-testid=decision-send]')
  // Nothing is recorded yet: the form shows what will be sent and waits for a second, explicit press.
  await page.waitForSelector('[data-testid=decision-confirm]')
  assert.equal(await page.innerText('[data-testid=decision-confirm-decision]'), 'Accept with conditions')
  assert.match(await page.innerText('[data-testid=decision-confirm]'), /Measure dissolved gas below the weir/)
  // Going back to change it, then changing the form, takes the summary away until it is checked again.
  await page.click('[data-testid=decision-confirm-back]')
  assert.equal(await page.locator('[data-testid=decision-confirm]').count(), 0)
  await page.click('[data-testid=decision-send]')
  await page.fill('#f-decision-reason', 'Oxygen gain is real in the dry months; gas stays under the limit (checked twice).')
  assert.equal(await page.locator('[data-testid=decision-confirm]').count(), 0, 'an edit after the check asks for a new check')
  await page.click('[data-testid=decision-send]')
  await page.click('[data-testid=decision-confirm-send]')
  await page.waitForSelector('[data-testid=review-state][data-state=accepted-with-conditions]')
  assert.match(await page.innerText('[data-testid=review-decision]'), /Measure dissolved gas/)

  await page.fill('#f-comment-body', 'Thanks @Idris Penrose, please send the August gas readings when you have them.')
  await page.selectOption('#f-comment-month', '8')
  await page.selectOption('#f-comment-flag', 'gas-supersaturation')
  await page.click('[data-testid=comment-send]')
  await page.waitForSelector('[data-testid=review-comment]')
  const comment = await page.innerText('[data-testid=review-comment]')
  assert.match(comment, /August/)
  assert.match(comment, /Gas supersaturation/)
  assert.match(comment, /Notified: Idris Penrose/)
  await shot(page, 'r04-reviewer-decided')
  await page.context().close()
}

/** The admin invites a single-site reviewer, revokes the link, filters the audit trail and reads the outbox. */
async function adminJourney(browser: Browser, siteId: number, summaryUrl: string): Promise<string> {
  const page = await openPage(browser, { clipboard: true })
  await signIn(page, ADMIN)
  await page.goto(`${BASE}/admin`)
  await page.waitForSelector('[data-testid=invite-form]')
  await page.fill('#f-invite-email', 'not an address')
  await page.click('[data-testid=invite-send]')
  await page.waitForSelector('#f-invite-email-error')
  await page.fill('#f-invite-email', INVITED)
  await page.selectOption('#f-invite-role', 'reviewer')
  await page.selectOption('#f-invite-site', String(siteId))
  await page.click('[data-testid=invite-send]')
  await page.waitForSelector('[data-testid=invite-done]')
  // The list reloads after the answer: wait for the new invitation at its head (a busy machine was seen reading the list before it).
  await page.locator('[data-testid=invitation-table] tbody tr').first().filter({ hasText: INVITED }).waitFor()
  assert.match(await page.innerText('[data-testid=invitation-table] tbody tr'), new RegExp(`${INVITED}[\\s\\S]*Reviewer[\\s\\S]*${SITE}[\\s\\S]*Waiting`))

  // The organisation's summary links: revoke the landowner's, with a confirm.
  const row = page.locator('[data-testid=admin-summary-links] tbody tr', { hasText: 'For Tobias at Brackwin Farm' })
  await row.locator('[data-testid=link-revoke]').click()
  await row.locator('[data-testid=link-revoke-confirm]').click()
  await page.waitForFunction(() => !document.querySelector('[data-testid=admin-summary-links]')?.textContent?.includes('For Tobias at Brackwin Farm'))
  await page.selectOption('[data-testid=link-state-filter]', 'revoked')
  await page.waitForFunction(() => {
    const rows = [...document.querySelectorAll('[data-testid=admin-summary-links] tbody tr')]
    return rows.length > 0 && rows.every((r) => r.textContent?.includes('Revoked'))
  })
  assert.match(await page.innerText('[data-testid=admin-summary-links] tbody'), /For Tobias at Brackwin Farm[\s\S]*Revoked/)

  // Audit trail: filter by action prefix and person; a backwards date range is refused by name.
  await page.fill('#f-audit-action', 'review.')
  await page.click('[data-testid=audit-apply]')
  await page.waitForFunction(() => [...document.querySelectorAll('[data-testid=audit-row]')].every((r) => r.textContent?.includes('review.')))
  assert.ok((await page.locator('[data-testid=audit-row]').count()) >= 2, 'at least this submission and this decision')
  assert.match(await page.innerText('[data-testid=audit-row] >> nth=0'), /review\.decided[\s\S]*submitted[\s\S]*→[\s\S]*accepted-with-conditions/)
  await page.fill('#f-audit-action', '')
  await page.selectOption('#f-audit-user', { label: 'Elspeth Garrow' })
  await page.click('[data-testid=audit-apply]')
  await page.waitForFunction(() => [...document.querySelectorAll('[data-testid=audit-row] > td:nth-child(2)')].every((c) => c.textContent?.trim() === 'Elspeth Garrow'))
  await page.selectOption('#f-audit-user', '')
  await page.fill('#f-audit-from', '2030-01-10')
  await page.fill('#f-audit-to', '2030-01-01')
  expectRefusal(400)
  await page.click('[data-testid=audit-apply]')
  await page.waitForSelector('text=To must not be before from')
  await shot(page, 'r07-admin')

  // Outbox: the invitation is there; its HTML is drawn in a sandbox with nothing allowed.
  await page.goto(`${BASE}/admin/outbox`)
  await page.waitForSelector('[data-testid=outbox-item]')
  await page.selectOption('[data-testid=outbox-kind]', 'invitation')
  await page.waitForFunction((to) => document.querySelector('[data-testid=outbox-message]')?.textContent?.includes(to), INVITED)
  const text = await page.innerText('[data-testid=outbox-text]')
  const token = /\/(?:invite|invitations)\/([A-Za-z0-9_-]{20,})/.exec(text)?.[1]
  assert.ok(token, 'the invitation e-mail carries its link')
  await page.click('[data-testid=outbox-view-html]')
  assert.equal(await page.getAttribute('[data-testid=outbox-html]', 'sandbox'), '')
  await shot(page, 'r08-outbox')
  await page.context().close()

  // The revoked link now shows the neutral page.
  const visitor = await openPage(browser, { clipboard: true })
  expectRefusal(404)
  await visitor.goto(summaryUrl)
  await visitor.waitForSelector('[data-testid=summary-unavailable]')
  await visitor.context().close()
  return token
}

/** The invited reviewer creates an account from the link and lands on the one site. */
async function invitedJourney(browser: Browser, token: string, siteId: number) {
  const page = await openPage(browser, { clipboard: true })
  expectRefusal(404)
  await page.goto(`${BASE}/invitations/not-a-real-invitation-token`)
  await page.waitForSelector('[data-testid=invitation-closed]')
  await page.goto(`${BASE}/invitations/${token}`)
  await page.waitForSelector('[data-testid=invitation-form]')
  assert.match(await page.innerText('[data-testid=invitation-what]'), new RegExp(`${INVITED}[\\s\\S]*Reviewer[\\s\\S]*${SITE} only`))
  await page.fill('#f-invite-name', 'Bryony Askew')
  await page.fill('#f-invite-password', 'short')
  await page.click('[data-testid=invitation-accept]')
  await page.waitForSelector('#f-invite-password-error')
  await shot(page, 'r09-invitation')
  await page.fill('#f-invite-password', 'a-long-enough-password')
  await page.click('[data-testid=invitation-accept]')
  await page.waitForURL(`${BASE}/sites/${siteId}`)
  await page.context().close()

  const again = await openPage(browser, { clipboard: true })
  expectRefusal(410)
  await again.goto(`${BASE}/invitations/${token}`)
  await again.waitForSelector('[data-testid=invitation-closed]')
  assert.match(await again.innerText('[data-testid=invitation-closed] h1'), /already been used/)
  await shot(again, 'r12-invitation-used')
  await again.context().close()
}

/** The landowner forgets their password, asks for a link and sets a new one. */
async function resetJourney(browser: Browser) {
  const page = await openPage(browser, { clipboard: true })
  await page.goto(`${BASE}/`)
  await page.click('[data-testid=forgot-password]')
  await page.waitForURL(`${BASE}/reset-password`)
  await page.fill('#f-reset-email', VIEWER)
  await page.click('[data-testid=reset-request-form] button[type=submit]')
  await page.waitForSelector('[data-testid=reset-requested]')
  assert.match(await page.innerText('[data-testid=reset-requested]'), /If an account exists/)

  assert.ok(DB_PATH, 'GW_DATABASE_PATH names the server\'s database (to read the reset e-mail)')
  const db = new Database(DB_PATH, { readonly: true })
  const mail = db.prepare("select text from outbox where kind = 'password-reset' and to_address = ? order by id desc limit 1").get(VIEWER) as { text: string } | undefined
  db.close()
  const token = /\/reset-password\/([A-Za-z0-9_-]{20,})/.exec(mail?.text ?? '')?.[1]
  assert.ok(token, 'the reset e-mail carries its link')

  await page.goto(`${BASE}/reset-password/${token}`)
  await page.fill('#f-new-password', 'brackwin-new-2026')
  await page.fill('#f-repeat-password', 'brackwin-new-2027')
  await page.click('[data-testid=reset-form] button[type=submit]')
  await page.waitForSelector('#f-repeat-password-error')
  await page.fill('#f-repeat-password', 'brackwin-new-2026')
  await page.click('[data-testid=reset-form] button[type=submit]')
  await page.waitForSelector('[data-testid=reset-done]')
  await shot(page, 'r10-reset-done')
  await signIn(page, VIEWER, 'brackwin-new-2026')

  expectRefusal(410)
  await page.goto(`${BASE}/reset-password/${token}`)
  await page.fill('#f-new-password', 'brackwin-again-2026')
  await page.fill('#f-repeat-password', 'brackwin-again-2026')
  await page.click('[data-testid=reset-form] button[type=submit]')
  await page.waitForSelector('[data-testid=reset-dead]')
  assert.match(await page.innerText('[data-testid=reset-dead]'), /already been used/)
  await shot(page, 'r13-reset-used')
  await page.context().close()
}

await runJourney('review', async (browser) => {
  const probe = await openPage(browser, { clipboard: true })
  await signIn(probe, ENGINEER)
  const siteId = await siteIdOf(probe, SITE)
  await probe.context().close()
  const url = await engineerJourney(browser, siteId)
  await reviewerJourney(browser, siteId)
  const token = await adminJourney(browser, siteId, url)
  await invitedJourney(browser, token, siteId)
  await resetJourney(browser)
})
