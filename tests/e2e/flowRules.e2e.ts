// Browser journey through the flow rules: the demo engineer opens a demo site, picks a preset, edits
// one of its values (the preset turns custom), saves, reloads and sees the values kept; then runs an
// assessment and finds the depleted reach on the results page. Run by scripts/e2e.mjs:
//   npm run build && node scripts/e2e.mjs tests/e2e/flowRules.e2e.ts
import assert from 'node:assert/strict'
import type { Browser } from 'playwright-core'
import { BASE, openPage, openSiteFromPortfolio, runJourney, shot, signIn, waitForChart } from './journey'

const ENGINEER = 'idris@tarnbeck.example'
// An FDC site of the demo with no flow rules yet (Hollin Mill weir has the low-sensitivity preset).
const SITE = 'Skelby gauging weir'

async function engineerJourney(browser: Browser) {
  const page = await openPage(browser)
  await signIn(page, ENGINEER)
  const siteId = await openSiteFromPortfolio(page, SITE)
  await page.waitForSelector('[data-testid=site-overview-form] [data-testid=flow-rules]')
  assert.equal(await page.inputValue('#f-flowRules-preset'), 'none', 'the demo site starts with the hands-off flow only')

  // A preset fills the hands-off flow and every rule.
  await page.selectOption('#f-flowRules-preset', 'high-sensitivity')
  assert.ok(await page.isChecked('input[name=reservedKind][value=percentile]'), 'the preset sets the hands-off flow by exceedance')
  assert.equal(await page.inputValue('#f-reservedFlow-exceedance'), '80')
  assert.equal(await page.inputValue('#f-flowRules-maxTake-kind'), 'mean-multiple')
  assert.equal(await page.inputValue('#f-flowRules-maxTake-multiple'), '1')
  assert.equal(await page.inputValue('#f-flowRules-keptShare_pct'), '50')
  assert.match(await page.innerText('[data-testid=flow-rules]'), /regulator sets these/)
  await shot(page, 'fr01-preset-chosen')

  // Editing one value turns the preset into the user's own.
  await page.fill('#f-flowRules-keptShare_pct', '40')
  await page.waitForFunction(() => (document.querySelector('#f-flowRules-preset') as HTMLSelectElement | null)?.value === 'custom')
  await page.fill('#f-flowRules-passFlow_m3s', '0.15')
  await page.click('[data-testid=site-overview-form] [data-testid=save]')
  await page.waitForSelector('[data-testid=site-overview-form] [data-testid=saved]')
  const stored = await page.evaluate(async (id) => (await (await fetch(`/api/sites/${id}`)).json()) as { flowRules: unknown; reservedFlow: unknown }, siteId)
  assert.deepEqual(stored.flowRules, { preset: 'custom', maxTake: { kind: 'mean-multiple', multiple: 1 }, keptShare_pct: 40, passFlow_m3s: 0.15 })
  assert.deepEqual(stored.reservedFlow, { kind: 'percentile', exceedance: 80 })

  // Loaded afresh, the form shows what was stored.
  await page.goto(`${BASE}/sites/${siteId}`)
  await page.waitForSelector('[data-testid=site-overview-form] [data-testid=flow-rules]')
  assert.equal(await page.inputValue('#f-flowRules-preset'), 'custom')
  assert.equal(await page.inputValue('#f-flowRules-keptShare_pct'), '40')
  assert.equal(await page.inputValue('#f-flowRules-passFlow_m3s'), '0.15')
  assert.equal(await page.inputValue('#f-reservedFlow-exceedance'), '80')
  await shot(page, 'fr02-custom-saved')

  // A fresh assessment of one of the site's options (stored as the option page's "Save assessment"
  // stores it) shows the depleted reach.
  const assessmentId = await page.evaluate(async (id) => {
    const optionId = ((await (await fetch(`/api/sites/${id}/options`)).json()) as { options: { id: number }[] }).options[0]!.id
    const res = await fetch(`/api/options/${optionId}/assessments`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{}' })
    return ((await res.json()) as { id: number }).id
  }, siteId)
  await page.goto(`${BASE}/assessments/${assessmentId}`)
  await page.waitForSelector('[data-testid=assessment-depleted-reach]')
  assert.match(await page.innerText('[data-testid=depleted-reach-rules]'), /Custom \(your values\): hands-off flow [\d.]+ m³\/s, maximum take [\d.]+ m³\/s, 40 % of the flow above the hands-off flow kept in the river, fish\/eel pass flow 0\.15 m³\/s\./)
  assert.match(await page.innerText('[data-testid=depleted-reach-days]'), /^0 d\/yr$/, 'with 40 % kept the river never runs at the hands-off flow alone')
  assert.equal(await page.locator('[data-testid=depleted-reach-table] tbody tr').count(), 13)
  await page.locator('[data-testid=assessment-depleted-reach]').scrollIntoViewIfNeeded()
  assert.ok((await waitForChart(page, '[data-testid=chart-depleted-reach]')) > 500, 'the depleted reach is drawn')
  await shot(page, 'fr03-depleted-reach')
}

await runJourney('Flow rules', engineerJourney)
