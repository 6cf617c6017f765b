// Browser journey: an engineer switches a demo site from its head table to the weir's hydraulics, is told
// which field is wrong, saves, reloads to find the hydraulics and their preview kept, then stores an
// assessment and sees the heads, tail and throat depth change with the flow in the per-flow table.
// Run: npm run build && node scripts/e2e.mjs tests/e2e/weirHydraulics.e2e.ts
import assert from 'node:assert/strict'
import type { Browser } from 'playwright-core'
import { BASE, openPage, openSiteFromPortfolio, runJourney, shot, signIn } from './journey'

const ENGINEER = 'idris@tarnbeck.example'
const SITE = 'Cragg Foot drop'

async function engineerJourney(browser: Browser) {
  const page = await openPage(browser)
  await signIn(page, ENGINEER)
  const siteId = await openSiteFromPortfolio(page, SITE)
  await page.waitForSelector('[data-testid=site-overview-form] .leaflet-container')

  // 1. Heads from the weir hydraulics: the fields, the caution about weir works, then one bad value named.
  assert.ok(await page.isChecked('[data-testid=heads-from-table]'), 'the demo drop takes its heads from its head table')
  await page.check('[data-testid=heads-from-hydraulics]')
  await page.waitForSelector('[data-testid=weir-works-caution]')
  assert.match(await page.innerText('[data-testid=weir-works-caution]'), /recirculating jump/)
  await page.fill('#f-weir-hydraulics-crestHeight_m', '1.7')
  await page.fill('#f-weir-hydraulics-tail-channelWidth_m', '18')
  await page.fill('#f-weir-hydraulics-tail-bedSlope', '0.001')
  await page.fill('#f-weir-hydraulics-tail-roughnessN', '0.5')
  await page.click('[data-testid=site-overview-form] [data-testid=save]')
  await page.waitForSelector('#f-weir-hydraulics-tail-roughnessN-error')
  assert.equal(await page.innerText('#f-weir-hydraulics-tail-roughnessN-error'), 'must be between 0.01 and 0.2')
  assert.match(await page.innerText('[data-testid=hydraulics-preview]'), /Fill in/, 'no preview while a field is out of range')
  await page.fill('#f-weir-hydraulics-tail-roughnessN', '0.035')
  await page.waitForSelector('[data-testid=hydraulics-preview-row]')
  assert.match(await page.innerText('[data-testid=drowns-above]'), /The weir drowns above [\d.,]+ m³\/s: its aeration then is that of a submerged sluice/)
  await shot(page, 'w01-weir-hydraulics')
  await page.click('[data-testid=site-overview-form] [data-testid=save]')
  await page.waitForSelector('[data-testid=saved]')

  // 2. Reloaded, the choice, the values and the preview are still there.
  await page.goto(`${BASE}/sites/${siteId}`)
  await page.waitForSelector('[data-testid=hydraulics-preview-row]')
  assert.ok(await page.isChecked('[data-testid=heads-from-hydraulics]'))
  assert.equal(await page.inputValue('#f-weir-hydraulics-tail-roughnessN'), '0.035')
  const rows = page.locator('[data-testid=hydraulics-preview-row]')
  assert.equal(await rows.count(), 6)
  assert.match(await rows.last().innerText(), /drowned/)
  assert.match(await rows.first().innerText(), /free/)

  // 3. An assessment stored now takes each flow's heads from the hydraulics.
  await page.click('[data-testid=tab-options]')
  await page.waitForSelector('[data-testid=option-list] tbody tr')
  await page.locator('[data-testid=option-list] tbody tr').first().locator('a').first().click()
  await page.waitForSelector('[data-testid=save-assessment]')
  await page.click('[data-testid=save-assessment]')
  await page.waitForURL(/\/assessments\/\d+$/)
  await page.waitForSelector('[data-testid=perflow-table] [data-testid=gross-head]')
  const heads = await page.locator('[data-testid=perflow-table] [data-testid=gross-head]').allInnerTexts()
  assert.ok(new Set(heads).size > 3, `the gross head varies with the flow: ${heads.join(', ')}`)
  assert.match(await page.innerText('[data-testid=perflow-table]'), /drowned/)
  await shot(page, 'w02-per-flow-heads')
}

await runJourney('weir hydraulics', engineerJourney)
