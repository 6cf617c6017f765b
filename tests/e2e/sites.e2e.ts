// Browser journey through sites, maps, hydrology and attachments, against a running, seeded server.
// `npm test` runs it through scripts/e2e.mjs (its own server on a fresh demo database); by hand:
//   DATABASE_PATH=/tmp/ui.sqlite npm run db:seed
//   PORT=3200 NODE_ENV=production NUXT_SESSION_PASSWORD=… DATABASE_PATH=/tmp/ui.sqlite node <copy of .output>/server/index.mjs
//   GW_BASE_URL=http://localhost:3200 node --import tsx tests/e2e/sites.e2e.ts
// Drives Debian's chromium through playwright-core, saves screenshots to tests/e2e/screenshots/ and
// exits non-zero on the first failed check or on any console error, page error or failed request.
// Longer than most files: one journey through every site screen, in the order a person takes them.
import assert from 'node:assert/strict'
import { readFileSync } from 'node:fs'
import type { Browser, Page } from 'playwright-core'
import { expectRefusal, openPage, runJourney, shot, signIn } from './journey'

const ENGINEER = 'idris@tarnbeck.example'
const VIEWER = 'tobias@brackwin-farm.example'
const ADMIN = 'morwenna@tarnbeck.example'



/** Clicks the Leaflet map at a fraction of its width and height. */
async function clickMap(page: Page, fx: number, fy: number) {
  const box = await page.locator('[data-testid=map-site-editor] .leaflet-container').boundingBox()
  assert.ok(box, 'the site map is on the page')
  await page.mouse.click(box.x + box.width * fx, box.y + box.height * fy)
}

/** Clicks a download button or link and answers the file the browser was given. */
async function downloadOf(page: Page, selector: string): Promise<{ name: string; lines: string[] }> {
  const [download] = await Promise.all([page.waitForEvent('download'), page.click(selector)])
  const path = await download.path()
  assert.ok(path, `the download from ${selector} was saved`)
  const text = readFileSync(path, 'utf8')
  assert.ok(text.endsWith('\r\n'), 'the CSV ends with a line end')
  return { name: download.suggestedFilename(), lines: text.slice(0, -2).split('\r\n') }
}

function csv(lines: string[]): { name: string; mimeType: string; buffer: Buffer } {
  return { name: 'gauge.csv', mimeType: 'text/csv', buffer: Buffer.from(lines.join('\n') + '\n') }
}

/** Three years of invented daily flows with a dry summer. */
function goodRecord(): string[] {
  const lines = ['date,flow']
  const start = Date.UTC(2019, 0, 1)
  for (let i = 0; i < 3 * 365; i++) {
    const day = new Date(start + i * 86_400_000).toISOString().slice(0, 10)
    const flow = 3 + 2.2 * Math.cos((2 * Math.PI * i) / 365) + (i % 17 === 0 ? 6 : 0)
    lines.push(`${day},${i === 400 ? '' : flow.toFixed(3)}`)
  }
  return lines
}

// An 8×8 PNG, lichen green.
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAgAAAAICAIAAABLbSncAAAAEUlEQVR4nGPYc9YVK2IYWhIAPytzgeCkFAcAAAAASUVORK5CYII=',
  'base64',
)

async function engineerJourney(browser: Browser) {
  const page = await openPage(browser)
  await signIn(page, ENGINEER)
  await page.waitForSelector('[data-testid=map-sites] .leaflet-interactive')
  await shot(page, '01-portfolio')

  // Sorting and filtering are done by the server.
  const names = async () => page.locator('[data-testid=site-table] tbody tr td:first-child').allInnerTexts()
  const before = await names()
  await page.click('[data-testid=sort-name]')
  await page.waitForFunction((first) => document.querySelector('[data-testid=site-table] tbody tr td')?.textContent?.trim() !== first, before[0])
  assert.deepEqual(await names(), [...before].reverse(), 'a second press on Site sorts descending')
  await page.fill('[data-testid=site-filter]', 'mill')
  await page.waitForFunction(() => document.querySelectorAll('[data-testid=site-table] tbody tr').length === 1)
  assert.match((await names())[0]!, /mill/i)
  await page.fill('[data-testid=site-filter]', '')
  await page.waitForFunction((n) => document.querySelectorAll('[data-testid=site-table] tbody tr').length === n, before.length)

  // Headline figures of each latest assessment, units in the headers, and the review state in words.
  const head = ((await page.locator('[data-testid=site-table] thead').textContent()) ?? '').replace(/\s+/g, ' ')
  for (const h of ['Annual energy (MWh/yr)', 'Capacity factor (%)', 'Net O₂ gain at summer low flow (mg/L)', 'LCOE (£/MWh)', 'NPV (£)', 'Capital cost (£)', 'P90 energy (MWh/yr)', 'Chance of a net O₂ loss (%)', 'Flags raised (count)', 'Review']) {
    assert.ok(head.includes(h), `the header shows ${h}`)
  }
  const hollin = page.locator('[data-testid=site-table] tbody tr', { hasText: 'Hollin Mill weir' })
  assert.equal(await hollin.locator('[data-testid=cell-review]').innerText(), 'Accepted with conditions', 'the demo review decision is shown in words')
  assert.match(await hollin.locator('[data-testid=cell-energy]').innerText(), /^\d[\d,]*(\.\d)?$/)
  assert.match(await hollin.locator('[data-testid=cell-capacity]').innerText(), /^\d+(\.\d)?$/)
  assert.match(await hollin.locator('[data-testid=cell-energyP90]').innerText(), /^\d[\d,]*(\.\d)?$/, 'the demo run\'s Monte Carlo P90 energy is shown')
  assert.match(await hollin.locator('[data-testid=cell-netLossChance]').innerText(), /^(<1|>99|\d+)$/, 'its chance of a net oxygen loss is shown in per cent')
  assert.match(await hollin.locator('[data-testid=cell-oxygen]').innerText(), /^([+−]\d+(\.\d+)?|0)$/, 'the oxygen gain is signed')
  assert.match(await hollin.locator('[data-testid=cell-flags]').innerText(), /^\d+$/)
  // Sorting by a figure is done by the server: energies come back in order.
  const energies = async () => (await page.locator('[data-testid=site-table] tbody [data-testid=cell-energy]').allInnerTexts()).map((t) => Number(t.replace(/,/g, '')))
  await Promise.all([
    page.waitForResponse((r) => r.url().includes('/portfolio?') && r.url().includes('sort=annualEnergy_MWh') && r.ok()),
    page.click('[data-testid=sort-annualEnergy_MWh]'),
  ])
  await page.waitForSelector('th[aria-sort=ascending] [data-testid=sort-annualEnergy_MWh]')
  // The old page may still be on screen for a frame: wait (bounded by the step's timeout) for the rows to settle in order.
  await page.waitForFunction(() => {
    const v = [...document.querySelectorAll('[data-testid=site-table] tbody [data-testid=cell-energy]')].map((c) => Number((c.textContent ?? '').replace(/,/g, '')))
    return v.length > 1 && v.every((x, i) => i === 0 || v[i - 1]! <= x)
  })
  const sortedUp = await energies()
  assert.ok(sortedUp.length > 1, 'several sites have an annual energy')
  assert.deepEqual(sortedUp, [...sortedUp].sort((a, b) => a - b), 'annual energy sorts ascending')
  // The review-state filter, and the CSV download of the same filter.
  await page.selectOption('[data-testid=review-filter]', 'accepted-with-conditions')
  await page.waitForFunction(() => document.querySelectorAll('[data-testid=site-table] tbody tr').length === 1)
  assert.deepEqual(await names(), ['Hollin Mill weir'])
  const csvHref = (await page.getAttribute('[data-testid=portfolio-csv]', 'href')) ?? ''
  assert.match(csvHref, /format=csv/)
  assert.match(csvHref, /reviewState=accepted-with-conditions/)
  const portfolioCsv = await downloadOf(page, '[data-testid=portfolio-csv]')
  assert.equal(portfolioCsv.lines.length, 2, 'the CSV holds the one filtered site')
  assert.ok(portfolioCsv.lines[0]!.includes('Annual energy (MWh/yr)') && portfolioCsv.lines[0]!.endsWith('Review state'))
  assert.match(portfolioCsv.lines[1]!, /,Hollin Mill weir,.*,accepted-with-conditions$/)
  await page.selectOption('[data-testid=review-filter]', '')
  await page.waitForFunction((n) => document.querySelectorAll('[data-testid=site-table] tbody tr').length === n, before.length)

  // The map is coloured by the chosen figure; the legend states range and units, the popup the value.
  assert.match(await page.locator('[data-testid=map-legend-range]').innerText(), /MWh\/yr.*MWh\/yr/s, 'the energy range has its unit')
  await page.selectOption('[data-testid=map-colour]', 'netOxygenGainSummerLowFlow_mgL')
  await page.waitForFunction(() => /mg\/L/.test(document.querySelector('[data-testid=map-legend]')?.textContent ?? ''))
  await page.selectOption('[data-testid=map-colour]', 'reviewState')
  await page.waitForFunction(() => (document.querySelector('[data-testid=map-legend]')?.textContent ?? '').includes('Accepted with conditions'))
  const accepted = page.locator('[data-testid=map-sites] path.leaflet-interactive[fill="#bccd45"]')
  await accepted.first().waitFor()
  assert.equal(await accepted.count(), 1, 'one marker takes the accepted-with-conditions colour')
  await accepted.first().click()
  const openNote = page.locator('[data-testid=map-sites] .leaflet-popup-content [data-testid=map-popup-note]')
  await openNote.waitFor()
  assert.equal(await openNote.innerText(), 'Review: Accepted with conditions', 'the open popup says the state in words')
  await shot(page, '01b-portfolio-by-review')

  // New site: required fields are reported per field before anything is sent.
  await page.click('[data-testid=new-site]')
  await page.waitForSelector('[data-testid=site-new-form] .leaflet-container')
  await page.click('[data-testid=site-new-form] [data-testid=save]')
  await page.waitForSelector('#f-name-error')
  assert.match(await page.innerText('[data-testid=location-error]'), /Place the site/)
  await shot(page, '02-new-site-errors')

  await page.fill('#f-name', 'Thornwaite sluice')
  await page.fill('#f-riverName', 'Brackwin Water')
  await clickMap(page, 0.5, 0.5)
  assert.notEqual(await page.inputValue('#f-location-lat'), '', 'a map click fills in the latitude')
  await page.click('[data-testid=map-mode-reach]')
  await clickMap(page, 0.3, 0.3)
  await clickMap(page, 0.45, 0.45)
  await clickMap(page, 0.6, 0.55)
  await clickMap(page, 0.8, 0.7)
  assert.match(await page.innerText('[data-testid=reach-summary]'), /4 points/)
  await page.click('[data-testid=map-undo]')
  assert.match(await page.innerText('[data-testid=reach-summary]'), /3 points/)
  // The same reach by keyboard: a typed point joins the outfall end, a corrected one moves, bad text is refused.
  await page.click('[data-testid=reach-points] summary')
  const lastLat = Number(await page.inputValue('#reach-2-lat'))
  const lastLng = Number(await page.inputValue('#reach-2-lng'))
  await page.fill('#reach-new-lat', 'north')
  await page.fill('#reach-new-lng', String(lastLng))
  await page.click('[data-testid=reach-point-add]')
  assert.match(await page.innerText('#reach-new-lat-error'), /Latitude must be a number/)
  await page.fill('#reach-new-lat', (lastLat - 0.0004).toFixed(6))
  await page.fill('#reach-new-lng', (lastLng + 0.0006).toFixed(6))
  await page.press('#reach-new-lng', 'Enter')
  await page.waitForFunction(() => /4 points/.test(document.querySelector('[data-testid=reach-summary]')?.textContent ?? ''))
  assert.equal(await page.inputValue('#reach-3-lat'), String(Number((lastLat - 0.0004).toFixed(6))))
  const lengthBefore = await page.innerText('[data-testid=reach-summary]')
  await page.fill('#reach-0-lat', String(Number(await page.inputValue('#reach-0-lat')) + 0.001))
  await page.press('#reach-0-lat', 'Enter')
  await page.waitForFunction((before) => document.querySelector('[data-testid=reach-summary]')?.textContent?.trim() !== before, lengthBefore)
  assert.equal(await page.locator('[data-testid=map-site-editor] .leaflet-marker-icon').count(), 5, 'four reach points and the site on the map')
  await page.fill('#f-weir-grossHead_m', '1.8')
  await page.fill('#f-weir-crestWidth_m', '11.5')
  // The head table can be started on the new-site form; a wrong row holds the form back.
  await page.click('[data-testid=head-add]')
  await page.fill('#head-0-flow', '1')
  await page.fill('#head-0-head', '-1.8')
  await page.fill('#f-months-6-waterTemp_C', '17.5')
  await page.click('[data-testid=site-new-form] [data-testid=save]')
  await page.waitForSelector('#head-0-head-error')
  assert.match(await page.innerText('[data-testid=site-new-form] [data-testid=form-error]'), /head table/)
  await page.fill('#head-0-head', '1.8')
  await shot(page, '03-new-site-filled')
  await page.click('[data-testid=site-new-form] [data-testid=save]')
  await page.waitForURL(/\/sites\/\d+$/)
  await page.waitForSelector('[data-testid=site-overview-form] .leaflet-container')
  assert.equal(await page.innerText('[data-testid=site-name]'), 'Thornwaite sluice')
  const siteUrl = page.url()
  const siteId = Number(siteUrl.split('/').pop())
  assert.equal(await page.inputValue('#head-0-head'), '1.8', 'the head row entered on the new-site form was stored')

  // Save a change, then lose a race against another save and reload.
  await page.fill('#f-notes', 'Sluice gate on the right bank.')
  await page.click('[data-testid=site-overview-form] [data-testid=save]')
  await page.waitForSelector('[data-testid=saved]')
  await page.evaluate(async (id) => {
    const site = await (await fetch(`/api/sites/${id}`)).json()
    await fetch(`/api/sites/${id}`, { method: 'PATCH', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ version: site.version, notes: 'Changed elsewhere.' }) })
  }, siteId)
  await page.fill('#f-name', 'Thornwaite sluice gate')
  expectRefusal(409)
  await page.click('[data-testid=site-overview-form] [data-testid=save]')
  await page.waitForSelector('[data-testid=conflict-notice]')
  await shot(page, '04-conflict')
  await page.click('[data-testid=conflict-reload]')
  await page.waitForSelector('[data-testid=conflict-notice]', { state: 'detached' })
  assert.equal(await page.inputValue('#f-notes'), 'Changed elsewhere.')
  assert.equal(await page.inputValue('#f-name'), 'Thornwaite sluice')
  assert.match(await page.innerText('[data-testid=reach-summary]'), /4 points/, 'the typed reach points were stored')

  // Head against flow: more rows, checked row by row, sorted, saved with the overview, then downloaded.
  for (const [q, h] of [['20', '1.1'], ['10', '1,5']]) {
    await page.click('[data-testid=head-add]')
    await page.fill(`#head-${(await page.locator('[data-testid=head-table] tbody tr[data-testid]').count()) - 1}-flow`, q!)
    await page.fill(`#head-${(await page.locator('[data-testid=head-table] tbody tr[data-testid]').count()) - 1}-head`, h!)
  }
  await page.click('[data-testid=site-overview-form] [data-testid=save]')
  await page.waitForSelector('#head-2-flow-error')
  assert.match(await page.innerText('#head-2-flow-error'), /must rise down the table/)
  assert.match(await page.innerText('[data-testid=site-overview-form] [data-testid=form-error]'), /head table/)
  await page.locator('[data-testid=head-table]').scrollIntoViewIfNeeded()
  await shot(page, '04b-head-table-errors')
  await page.click('[data-testid=head-sort]')
  await page.waitForSelector('#head-2-flow-error', { state: 'detached' })
  await page.click('[data-testid=site-overview-form] [data-testid=save]')
  await page.waitForSelector('[data-testid=site-overview-form] [data-testid=saved]')
  const stored = await page.evaluate(async (id) => (await (await fetch(`/api/sites/${id}`)).json()).headTable, siteId)
  assert.deepEqual(stored, [{ flow: 1, head: 1.8 }, { flow: 10, head: 1.5 }, { flow: 20, head: 1.1 }])
  const headCsv = await downloadOf(page, '[data-testid=head-table-csv]')
  assert.equal(headCsv.name, 'Thornwaite-sluice-head-table.csv')
  assert.deepEqual(headCsv.lines, ['flow_m3s,gross_head_m', '1,1.8', '10,1.5', '20,1.1'])
  await shot(page, '04c-head-table-saved')

  // Hydrology: FDC rows are checked row by row, then saved and charted.
  await page.click('[data-testid=tab-hydrology]')
  await page.waitForSelector('[data-testid=fdc-editor]')
  for (const [e, f] of [['10', '6'], ['50', '7'], ['40', '1']]) {
    await page.click('[data-testid=fdc-add]')
    const row = page.locator('[data-testid=fdc-editor] tbody tr').last()
    await row.locator('input').nth(0).fill(e!)
    await row.locator('input').nth(1).fill(f!)
  }
  await page.click('[data-testid=fdc-editor] [data-testid=save]')
  await page.waitForSelector('#fdc-1-flow-error')
  assert.match(await page.innerText('#fdc-2-exceedance-error'), /must rise/)
  await shot(page, '05-fdc-errors')
  await page.fill('#fdc-1-flow', '3.2')
  await page.fill('#fdc-2-exceedance', '95')
  await page.click('[data-testid=fdc-editor] [data-testid=save]')
  await page.waitForSelector('[data-testid=fdc-editor] [data-testid=saved]')
  await page.waitForSelector('[data-testid=fdc-chart] canvas')
  assert.match(await page.innerText('[data-testid=hydrology-stats]'), /Entered FDC, 3 points/)
  const fdcCsv = await downloadOf(page, '[data-testid=fdc-points-csv]')
  assert.deepEqual(fdcCsv.lines, ['exceedance_pct,flow_m3s', '10,6', '50,3.2', '95,1'])
  await shot(page, '06-fdc-chart')

  // Upload: refused lines are listed, ambiguous columns are asked for, a good file is stored.
  await page.setInputFiles('[data-testid=flow-file]', csv(['date,flow', '2020-01-01,2.5', '2020-01-02,-1', '2020-13-40,3', '2020-01-04,lots']))
  expectRefusal(422)
  await page.click('[data-testid=flow-upload-send]')
  await page.waitForSelector('[data-testid=flow-upload-errors]')
  assert.ok((await page.locator('[data-testid=flow-upload-errors] tbody tr').count()) >= 3, 'each bad line has a row')
  await shot(page, '07-upload-line-errors')
  await page.setInputFiles('[data-testid=flow-file]', csv(['when,reading,other', '2020-01-01,2.5,1', '2020-01-02,2.4,1', '2020-01-03,2.3,1']))
  expectRefusal(422)
  await page.click('[data-testid=flow-upload-send]')
  await page.waitForSelector('[data-testid=column-picker]')
  await page.selectOption('#f-dateColumn', 'when')
  await page.selectOption('#f-flowColumn', 'reading')
  await shot(page, '08-upload-columns')
  await page.click('[data-testid=column-picker-send]')
  await page.waitForSelector('[data-testid=flow-record-card]')
  await page.setInputFiles('[data-testid=flow-file]', csv(goodRecord()))
  await page.click('[data-testid=flow-upload-send]')
  await page.waitForSelector('[data-testid=flow-upload-summary]')
  await page.waitForFunction(() => /1,095 days/.test(document.querySelector('[data-testid=flow-record-card]')?.textContent ?? ''))
  await page.waitForSelector('[data-testid=hydrograph] canvas')
  assert.match(await page.innerText('[data-testid=hydrology-stats]'), /Daily flow record/)
  // The whole record downloads from the server, one line a day, the gap (day 400) an empty cell.
  const recordCsv = await downloadOf(page, '[data-testid=record-csv]')
  assert.equal(recordCsv.name, 'Thornwaite-sluice-daily-flows.csv')
  assert.equal(recordCsv.lines[0], 'date,flow_m3s')
  assert.equal(recordCsv.lines.length, 1 + 3 * 365)
  assert.equal(recordCsv.lines[1 + 400], '2020-02-05,')
  await page.click('details:has([data-testid=hydrology-monthly]) summary')
  const monthlyCsv = await downloadOf(page, '[data-testid=monthly-csv]')
  assert.equal(monthlyCsv.lines[0], 'month,days_with_flow,q95_m3s,q50_m3s,q10_m3s,mean_m3s')
  assert.equal(monthlyCsv.lines.length, 13)
  assert.match(monthlyCsv.lines[2]!, /^February,84,/, 'February: 28 + 29 + 28 days with a flow, less the gap on 5 February 2020')
  await shot(page, '09-record-uploaded')

  // Months.
  await page.click('[data-testid=tab-months]')
  await page.waitForSelector('[data-testid=months-table]')
  assert.equal(await page.inputValue('#f-months-6-waterTemp_C'), '17.5')
  await page.fill('#f-months-0-upstreamOxygen-value', '45')
  await page.selectOption('#f-months-0-upstreamOxygen-unit', 'mg/L')
  await page.click('[data-testid=site-months-form] [data-testid=save]')
  await page.waitForSelector('#f-months-0-upstreamOxygen-value-error')
  await page.fill('#f-months-0-upstreamOxygen-value', '11.2')
  await page.click('[data-testid=site-months-form] [data-testid=save]')
  await page.waitForSelector('[data-testid=site-months-form] [data-testid=saved]')
  const monthsCsv = await downloadOf(page, '[data-testid=months-csv]')
  assert.equal(monthsCsv.lines[0], 'month,water_temp_c,upstream_oxygen_value,upstream_oxygen_unit,upstream_oxygen_measured,mean_flow_m3s')
  assert.equal(monthsCsv.lines[1], 'January,10,11.2,mg/L,yes,')
  assert.equal(monthsCsv.lines[7], 'July,17.5,100,%sat,yes,')
  await shot(page, '10-months')

  // Attachments: upload with progress, list, refuse a non-image, remove.
  await page.click('[data-testid=tab-attachments]')
  await page.waitForSelector('[data-testid=attachment-upload]')
  await page.setInputFiles('[data-testid=attachment-file]', { name: 'weir-crest.png', mimeType: 'image/png', buffer: PNG })
  await page.waitForSelector('[data-testid=attachments] tbody tr')
  expectRefusal(415)
  await page.setInputFiles('[data-testid=attachment-file]', { name: 'notes.png', mimeType: 'image/png', buffer: Buffer.from('not an image at all') })
  await page.waitForSelector('[data-testid=attachment-error]')
  await shot(page, '11-attachments')
  const rows = page.locator('[data-testid=attachments] tbody tr')
  await rows.first().getByRole('button', { name: /Remove/ }).click()
  await rows.first().getByRole('button', { name: 'Remove it' }).click()
  await page.waitForSelector('text=No photos or documents yet.')

  // Delete, with the confirm dialog; the portfolio says an admin can restore it.
  await page.click('[data-testid=delete-site]')
  await page.waitForSelector('[data-testid=delete-dialog][open]')
  await shot(page, '12-delete-dialog')
  await page.click('[data-testid=confirm-delete]')
  await page.waitForSelector('[data-testid=deleted-notice]')
  assert.equal(await page.locator('[data-testid=site-table] a', { hasText: 'Thornwaite sluice' }).count(), 0)
  await page.context().close()
  return siteId
}

/** The engineer enters a seasonal profile of 12 month mean flows on a demo FDC site and saves it. */
async function seasonalProfileJourney(browser: Browser) {
  const page = await openPage(browser)
  await signIn(page, ENGINEER)
  await page.locator('[data-testid=site-table] tbody a', { hasText: 'Skelby gauging weir' }).click()
  await page.waitForSelector('[data-testid=tab-months]')
  await page.click('[data-testid=tab-months]')
  await page.waitForSelector('[data-testid=months-table]')
  assert.equal(await page.inputValue('#f-months-0-flow_m3s'), '12', 'the demo profile is shown, January first')
  assert.match(await page.innerText('[data-testid=months-flow-hint]'), /shape an entered flow-duration curve.*ignored when the site has a daily record/s)

  // A gap is said to stop the profile; a negative flow is refused, naming the month's field.
  await page.fill('#f-months-7-flow_m3s', '')
  await page.waitForFunction(() => /11 of 12 entered/.test(document.querySelector('[data-testid=months-flow-hint]')?.textContent ?? ''))
  const flows = [14, 12.5, 10, 7.5, 5, 3.2, 2.5, 2.2, 3, 6.5, 10, 13]
  for (const [i, q] of flows.entries()) await page.fill(`#f-months-${i}-flow_m3s`, i === 3 ? '-4' : String(q))
  await page.click('[data-testid=site-months-form] [data-testid=save]')
  assert.match(await page.innerText('#f-months-3-flow_m3s-error'), /0 or more/)
  await page.fill('#f-months-3-flow_m3s', '7.5')
  // One month's oxygen was not measured: the value stands, marked.
  await page.click('[data-testid=month-measured-0]')
  await page.waitForSelector('[data-testid=month-not-measured-0]')
  await page.click('[data-testid=site-months-form] [data-testid=save]')
  await page.waitForSelector('[data-testid=site-months-form] [data-testid=saved]')
  await shot(page, '10b-seasonal-profile')

  // Stored as entered, and shown again after a fresh load.
  const id = Number(/\/sites\/(\d+)/.exec(page.url())?.[1])
  const stored = await page.evaluate(async (siteId) => (await (await fetch(`/api/sites/${siteId}`)).json()) as { months: { flow_m3s: number, upstreamOxygen: { measured: boolean } }[] }, id)
  assert.deepEqual(stored.months.map((m) => m.flow_m3s), flows)
  assert.deepEqual(stored.months.map((m) => m.upstreamOxygen.measured), flows.map((_, i) => i !== 0))
  await page.goto(page.url())
  await page.click('[data-testid=tab-months]')
  await page.waitForSelector('[data-testid=months-table]')
  assert.equal(await page.inputValue('#f-months-11-flow_m3s'), '13')
  assert.equal(await page.locator('[data-testid=month-not-measured-0]').count(), 1)
  await page.context().close()
}

async function viewerJourney(browser: Browser) {
  const page = await openPage(browser)
  await signIn(page, VIEWER)
  assert.equal(await page.locator('[data-testid=new-site]').count(), 0, 'viewers get no New site button')
  await page.locator('[data-testid=site-table] tbody a').first().click()
  await page.waitForSelector('[data-testid=site-overview-form] .leaflet-container')
  assert.equal(await page.locator('[data-testid=save]').count(), 0, 'viewers get no Save')
  assert.equal(await page.locator('[data-testid=delete-site]').count(), 0, 'viewers get no Delete')
  assert.equal(await page.locator('[data-testid=map-mode-reach]').count(), 0, 'viewers get no map tools')
  assert.equal(await page.getAttribute('#f-name', 'readonly'), '')
  // The viewer reads the head table (the first site by name has one) and may download it, not change it.
  assert.equal(await page.locator('[data-testid=head-add]').count(), 0, 'viewers get no head-table editing')
  const rowsShown = await page.locator('[data-testid=head-table] tbody tr[data-testid]').count()
  assert.ok(rowsShown > 0, 'the demo head table is shown')
  const viewerCsv = await downloadOf(page, '[data-testid=head-table-csv]')
  assert.equal(viewerCsv.lines.length, 1 + rowsShown)
  await page.click('[data-testid=reach-points] summary')
  assert.equal(await page.locator('[data-testid=reach-point-add]').count(), 0, 'viewers cannot add reach points')
  assert.equal(await page.getAttribute('#reach-0-lat', 'readonly'), '', 'viewers read the reach points')
  await shot(page, '13-viewer-site')
  await page.click('[data-testid=tab-hydrology]')
  await page.waitForSelector('[data-testid=fdc-chart] canvas')
  assert.equal(await page.locator('[data-testid=flow-upload]').count(), 0, 'viewers get no upload')
  await shot(page, '14-viewer-hydrology')
  await page.context().close()
}

async function adminRestores(browser: Browser, siteId: number) {
  const page = await openPage(browser)
  await signIn(page, ADMIN)
  await page.click('[data-testid=deleted-sites] summary')
  await page.click(`[data-testid=restore-${siteId}]`)
  await page.waitForSelector(`[data-testid=site-row-${siteId}]`)
  // The restored site has never been assessed: one "not assessed" cell across the figures.
  assert.equal(await page.locator(`[data-testid=site-row-${siteId}] [data-testid=cell-not-assessed]`).innerText(), 'not assessed')
  assert.equal(await page.locator(`[data-testid=site-row-${siteId}] [data-testid=cell-energy]`).count(), 0)
  await page.context().close()
}

await runJourney('sites', async (browser) => {
  const siteId = await engineerJourney(browser)
  await seasonalProfileJourney(browser)
  await viewerJourney(browser)
  await adminRestores(browser, siteId)
})
