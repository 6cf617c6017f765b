// Browser journey of the project engineer through design options, results, the design sweep and the
// comparison, against a running, seeded server. `npm test` runs it through scripts/e2e.mjs (its own
// server on a fresh demo database); by hand:
//   DATABASE_PATH=/tmp/ui.sqlite npm run db:seed
//   PORT=3200 NODE_ENV=production NUXT_SESSION_PASSWORD=… DATABASE_PATH=/tmp/ui.sqlite node <copy of .output>/server/index.mjs
//   GW_BASE_URL=http://localhost:3200 node --import tsx tests/e2e/options.e2e.ts
// At Hollin Mill weir (the demo site with a twelve-year daily record) the engineer makes a new option,
// watches the live preview follow the fields, saves and assesses it, reads the charts, flags and CSV
// of the stored run, sweeps the design in a Web Worker, saves a picked cell as an option and compares
// the two. Drives Debian's chromium through playwright-core, saves screenshots to
// tests/e2e/screenshots/ and exits non-zero on the first failed check or on any console error, page
// error or failed request.
import assert from 'node:assert/strict'
import { readFileSync } from 'node:fs'
import type { Browser, Page } from 'playwright-core'
import { CAUTIONS } from '../../shared/utils/cautions'
import { BASE, openPage, runJourney, shot, signIn, waitForChart } from './journey'

const ENGINEER = 'idris@tarnbeck.example'
const SITE = 'Hollin Mill weir'
const NEW_OPTION = 'Wide throat in the leat'
const SWEPT_OPTION = 'Sweep pick for the leat'

/** The number in a preview figure (`[data-testid=preview-<key>]`), read once the preview is up to date. */
async function previewFigure(page: Page, key: string): Promise<string> {
  await page.waitForFunction(() => document.querySelector('[data-testid=preview-status]')?.textContent?.trim() === 'Up to date')
  return (await page.innerText(`[data-testid=preview-${key}] dd >> nth=0`)).trim()
}

/** Waits until the live preview has recomputed and the figure differs from `before`; answers the new text. */
async function previewMoves(page: Page, key: string, before: string): Promise<string> {
  await page.waitForFunction(
    ({ key, before }) =>
      document.querySelector('[data-testid=preview-status]')?.textContent?.trim() === 'Up to date' &&
      document.querySelector(`[data-testid=preview-${key}] dd`)?.textContent?.trim() !== before,
    { key, before },
  )
  return previewFigure(page, key)
}

/** The leading number of a figure's text ("1,234.5 MWh/yr" → 1234.5). */
const numberOf = (text: string) => Number(/^[+−-]?[\d,]+(\.\d+)?/.exec(text.replace('−', '-'))?.[0].replace(/,/g, ''))

async function engineerJourney(browser: Browser) {
  const page = await openPage(browser)
  await signIn(page, ENGINEER)

  // 1. The demo site with a record, its options tab: the two demo options with their figures.
  await page.locator('[data-testid=site-table] tbody tr', { hasText: SITE }).locator('a').first().click()
  await page.waitForURL(/\/sites\/\d+$/)
  const siteId = Number(new URL(page.url()).pathname.split('/').pop())
  // Tabs switched before the overview's map has finished drawing raise no error: a map torn down
  // while Leaflet was still building it is quietly let go (plugins/leafletTeardown.client.ts).
  for (let i = 0; i < 4; i++) {
    await page.goto(`${BASE}/sites/${siteId}`)
    await page.click('[data-testid=tab-options]')
    await page.waitForTimeout(300)
    await page.click('[data-testid=tab-overview]')
    await page.waitForTimeout(100 * i)
    await page.click('[data-testid=tab-options]')
    await page.waitForSelector('[data-testid=option-list] tbody tr')
  }
  await page.click('[data-testid=tab-overview]')
  // The overview's map is built before the tab changes (as a person would see it drawn first).
  await page.waitForSelector('[data-testid=site-overview-form] .leaflet-container .leaflet-marker-icon')
  await page.click('[data-testid=tab-options]')
  await page.waitForSelector('[data-testid=option-list] tbody tr')
  const demoRows = page.locator('[data-testid=option-list] tbody tr')
  assert.equal(await demoRows.count(), 2, 'Hollin Mill weir has two demo options')
  assert.match(await demoRows.filter({ hasText: 'Two units in the old leat' }).innerText(), /2 × 0\.55 m throat[\s\S]*\d[\d,]*\.\d/)
  await shot(page, 'o01-site-options')

  // 2. A new option: the preview runs in the browser on the starting design, and follows the throat.
  await page.click('[data-testid=new-option]')
  await page.waitForURL(`${BASE}/sites/${siteId}/options/new`)
  await page.waitForSelector('[data-testid=preview-figures]')
  const energyStart = await previewFigure(page, 'energy')
  const ratedStart = await previewFigure(page, 'rated')
  assert.ok(numberOf(energyStart) > 0, `the starting design makes energy (${energyStart})`)
  await page.fill('#opt-name', NEW_OPTION)
  await page.fill('#opt-design-throatDiameter_m', '0.65')
  await page.fill('#opt-design-outletDiameter_m', '1.3')
  const energyWide = await previewMoves(page, 'energy', energyStart)
  assert.notEqual(await previewFigure(page, 'rated'), ratedStart, 'the rated power follows the throat')
  assert.notEqual(numberOf(energyWide), numberOf(energyStart), `the annual energy moved: ${energyStart} → ${energyWide}`)
  // A bad value names its field, and the last good figures stay (dimmed) beside it.
  await page.fill('#opt-design-throatDiameter_m', '-1')
  await page.waitForSelector('[data-testid=preview-error]')
  assert.match(await page.innerText('[data-testid=preview-error]'), /Throat diameter[\s\S]*showing the last figures/)
  assert.equal((await page.innerText('[data-testid=preview-energy] dd >> nth=0')).trim(), energyWide, 'the last good energy stays on screen')
  await shot(page, 'o02-new-option-error')
  await page.fill('#opt-design-throatDiameter_m', '0.65')
  await page.waitForSelector('[data-testid=preview-error]', { state: 'detached' })
  assert.equal(await previewFigure(page, 'energy'), energyWide)
  await page.click('[data-testid=option-save]')
  await page.waitForURL(/\/options\/\d+$/)
  const optionId = Number(new URL(page.url()).pathname.split('/').pop())
  assert.equal(await page.innerText('[data-testid=option-title]'), NEW_OPTION)

  // 3. The editor: a longer air pipe moves the preview; save, then store an assessment.
  await page.waitForSelector('[data-testid=preview-figures]')
  assert.equal(await page.inputValue('#opt-design-throatDiameter_m'), '0.65', 'the throat was stored')
  assert.equal(await previewFigure(page, 'energy'), energyWide, 'the editor previews the stored option the same way')
  await page.fill('#opt-design-air-pipeLength_m', '60')
  await page.fill('#opt-design-air-pipeDiameter_m', '0.2')
  const energyLongPipe = await previewMoves(page, 'energy', energyWide)
  assert.ok(numberOf(energyLongPipe) < numberOf(energyWide), `a long thin air pipe costs energy: ${energyWide} → ${energyLongPipe}`)
  await shot(page, 'o03-editor-preview')
  await page.click('[data-testid=option-save]')
  await page.waitForSelector('[data-testid=option-saved]')
  const stored = await page.evaluate(async (id) => (await (await fetch(`/api/options/${id}`)).json()) as { design: { air: { pipeLength_m: number; pipeDiameter_m: number } } }, optionId)
  assert.deepEqual([stored.design.air.pipeLength_m, stored.design.air.pipeDiameter_m], [60, 0.2])
  assert.equal(await page.innerText('[data-testid=save-assessment]'), 'Save assessment')
  await page.click('[data-testid=save-assessment]')
  await page.waitForURL(/\/assessments\/\d+$/)
  const assessmentId = Number(new URL(page.url()).pathname.split('/').pop())

  // 4. The results: the stored run agrees with the browser's preview, every chart is drawn.
  await page.waitForSelector('[data-testid=headline-cards]')
  assert.match(await page.innerText('[data-testid=assessment-title]'), new RegExp(`Assessment ${assessmentId} · ${NEW_OPTION}`))
  const cardEnergy = (await page.innerText('[data-testid=card-energy] dd >> nth=0')).trim()
  assert.equal(cardEnergy, energyLongPipe, 'the server computes what the browser previewed')
  for (const chart of ['chart-fdc', 'chart-power-air', 'chart-suction', 'chart-energy-months', 'chart-oxygen-months', 'chart-tornado-energy']) {
    const painted = await waitForChart(page, `[data-testid=${chart}]`)
    assert.ok(painted > 500, `${chart} is drawn (${painted} painted pixels)`)
  }
  await page.click('[data-testid=tornado-oxygen]')
  assert.ok((await waitForChart(page, '[data-testid=chart-tornado-oxygen]')) > 500, 'the oxygen sensitivity is drawn')

  // 5. Flags, each in words, raised or clear; then the cautions every screening carries.
  const flags = page.locator('[data-testid=assessment-flags] li[data-testid^=flag-]')
  assert.equal(await flags.count(), 5, 'every flag is listed, raised or clear')
  for (const text of await flags.allInnerTexts()) assert.match(text, /^(Raised · safety|Raised|Clear)\s+\S[\s\S]*\n\S/, 'each flag says its state and its reason')
  const cautions = await page.innerText('[data-testid=assessment-cautions]')
  for (const c of CAUTIONS) assert.ok(cautions.includes(c.title) && cautions.includes(c.text), `the caution "${c.title}" is shown`)
  assert.equal(await page.locator('[data-testid=month-table] tbody tr').count(), 12)
  await shot(page, 'o04-results')

  // 6. CSV: the server's response is text/csv with units in the header; the browser downloads it.
  const href = (await page.getAttribute('[data-testid=csv-months]', 'href')) ?? ''
  assert.equal(href, `/api/assessments/${assessmentId}/export/months.csv`)
  const res = await page.context().request.get(`${BASE}${href}`)
  assert.equal(res.status(), 200)
  assert.match(res.headers()['content-type'] ?? '', /^text\/csv/)
  assert.match(res.headers()['content-disposition'] ?? '', new RegExp(`attachment; filename="gillwatt-assessment-${assessmentId}-Wide-throat-in-the-leat-months\\.csv"`))
  const months = (await res.text()).split('\r\n')
  assert.equal(months.length, 13, 'a header and twelve months')
  assert.match(months[0]!, /^Month \(-\),Water temperature \(°C\),Flow \(m³\/s\),/)
  assert.match(months[1]!, /^Jan,/)
  assert.match(months[12]!, /^Dec,/)
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid=csv-summary]')])
  assert.equal(download.suggestedFilename(), `gillwatt-assessment-${assessmentId}-Wide-throat-in-the-leat-summary.csv`)
  const path = await download.path()
  assert.ok(path, 'the summary CSV was saved')
  const summary = readFileSync(path, 'utf8').split('\r\n')
  assert.equal(summary[0], 'Figure,Value,Unit')
  const energyRow = summary.find((l) => l.startsWith('Annual energy,')) ?? ''
  assert.ok(energyRow.endsWith(',MWh/yr'), 'the summary CSV gives the energy with its unit')
  assert.equal(Number(energyRow.split(',')[1]).toFixed(1), numberOf(cardEnergy).toFixed(1), 'the CSV holds the figure on the card')
  assert.equal(summary.filter((l) => l.startsWith('Flag: ')).length, 5)

  // 7. The sweep of the option runs in a Web Worker (no server sweep), then draws the heatmap.
  await page.goto(`${BASE}/sites/${siteId}/options/${optionId}`)
  await page.click('[data-testid=link-sweep]')
  await page.waitForURL(`${BASE}/sites/${siteId}/options/${optionId}/sweep`)
  await page.waitForSelector('[data-testid=sweep-form]')
  // The form starts around the option; the grid is set to reach the deep, narrow corner where the
  // demo weir's one safe design lies: 5 throats (0.3–0.7 m) × 1, 2, 3 units × 3 depths (3–5 m).
  assert.equal(await page.inputValue('[data-testid=sweep-throatFrom]'), '0.44', 'the throat range starts three steps below the option')
  assert.equal(await page.inputValue('[data-testid=sweep-depthFrom]'), '1.5', 'the depth range starts 1 m above the option')
  await page.fill('[data-testid=sweep-throatFrom]', '0.3')
  await page.fill('[data-testid=sweep-throatTo]', '0.7')
  await page.fill('[data-testid=sweep-throatStep]', '0.1')
  await page.fill('[data-testid=sweep-units]', '1, 2, 3')
  await page.fill('[data-testid=sweep-depthFrom]', '3')
  await page.fill('[data-testid=sweep-depthTo]', '5')
  await page.fill('[data-testid=sweep-depthStep]', '1')
  await page.waitForFunction(() => /^45 points/.test(document.querySelector('[data-testid=sweep-count]')?.textContent?.trim() ?? ''))
  const workers: string[] = []
  const serverSweeps: string[] = []
  page.on('worker', (w) => workers.push(w.url()))
  page.on('request', (r) => {
    if (/\/api\/options\/\d+\/sweep$/.test(new URL(r.url()).pathname) || r.url().includes('/api/engine/sweep')) serverSweeps.push(r.url())
  })
  await page.click('[data-testid=sweep-run]')
  await page.waitForSelector('[data-testid=sweep-summary]')
  // A worker that cannot start falls back to the server without a word: both are checked.
  assert.equal(workers.length, 1, 'the sweep started one Web Worker')
  assert.match(workers[0]!, /\/_nuxt\/sweep\.worker/)
  assert.deepEqual(serverSweeps, [], 'the sweep ran in the browser, not on the server')
  assert.equal(await page.locator('[data-testid=sweep-error]').count(), 0)
  const cells = page.locator('[data-testid=sweep-heatmap] button[data-safe]')
  assert.equal(await cells.count(), 45, 'one heatmap cell a point')
  assert.equal(await page.locator('[data-testid=sweep-heatmap] caption').count(), 3, 'one table per number of units')
  const points = (await cells.evaluateAll((bs) => bs.map((b) => ({ label: b.getAttribute('aria-label') ?? '', safe: b.getAttribute('data-safe') === 'true', text: b.textContent ?? '' })))).map((c) => ({
    ...c,
    energy: Number(/: ([\d,]+\.\d) MWh\/yr/.exec(c.label)?.[1]?.replace(/,/g, '')),
  }))
  assert.ok(points.every((c) => Number.isFinite(c.energy) && /\d/.test(c.text)), 'every cell shows its energy')
  assert.ok(points.every((c) => c.safe === !c.text.includes('unsafe:')), 'unsafe cells say so in words, not colour alone')
  const safe = points.filter((c) => c.safe && c.energy > 0)
  assert.ok(safe.length >= 1, 'the grid reaches a safe design')
  assert.match(await page.innerText('[data-testid=sweep-summary]'), new RegExp(`^45 points; ${safe.length} make energy with every safety flag clear\\.`))
  // The best safe point is starred, is the most energy among the safe cells, and has its panel.
  const starred = points.filter((c) => c.label.endsWith(', best safe point'))
  assert.equal(starred.length, 1, 'one cell is the best safe point')
  assert.equal(starred[0]!.energy, Math.max(...safe.map((c) => c.energy)))
  assert.ok(starred[0]!.text.startsWith('★'))
  await page.waitForSelector('section[aria-label="Best safe point"]')
  await shot(page, 'o05-sweep')

  // 8. Pick the cell with the most energy (an unsafe one at this weir), and save it as a new option.
  const pick = points.reduce((best, c, i) => (c !== starred[0] && c.energy > points[best]!.energy ? i : best), points.findIndex((c) => c !== starred[0]))
  const chosen = points[pick]!
  const [, units, throat, depth] = /^(\d+) units, throat ([\d.]+) m at ([\d.]+) m:/.exec(chosen.label) ?? []
  assert.ok(units && throat && depth, `the cell says its point (${chosen.label})`)
  await cells.nth(pick).click()
  assert.equal(await cells.nth(pick).getAttribute('aria-pressed'), 'true')
  const panel = page.locator('section[aria-label="Picked point"]')
  await panel.waitFor()
  assert.equal(await panel.locator('h2').innerText(), `Picked point: ${units} × ${throat} m throat at ${depth} m`)
  assert.match(await panel.innerText(), new RegExp(`Annual energy\\s+${chosen.energy.toLocaleString('en-GB', { minimumFractionDigits: 1 }).replace('.', '\\.')} MWh/yr`))
  if (!chosen.safe) assert.match(await panel.locator('[role=note]').innerText(), /^Unsafe: .+\.$/, 'an unsafe pick says which flags it raises')
  await panel.locator('input').fill(SWEPT_OPTION)
  await shot(page, 'o06-sweep-picked')
  await panel.locator('[data-testid=sweep-save]').click()
  await page.waitForURL((u) => /\/options\/\d+$/.test(u.pathname) && !u.pathname.endsWith(`/${optionId}`))
  const sweptId = Number(new URL(page.url()).pathname.split('/').pop())
  await page.waitForSelector('[data-testid=option-form]')
  assert.equal(await page.innerText('[data-testid=option-title]'), SWEPT_OPTION)
  assert.equal(Number(await page.inputValue('#opt-design-units')), Number(units))
  assert.equal(Number(await page.inputValue('#opt-design-throatDiameter_m')), Number(throat))
  assert.equal(Number(await page.inputValue('#opt-design-throatDepth_m')), Number(depth))
  assert.equal(Number(await page.inputValue('#opt-design-air-pipeLength_m')), 60, 'the rest of the design is copied from the swept option')

  // 9. Both new options are on the site's list; ticked, they open side by side.
  await page.goto(`${BASE}/sites/${siteId}?tab=options`)
  await page.waitForSelector(`[data-testid=option-row-${sweptId}]`)
  assert.equal(await page.locator('[data-testid=option-list] tbody tr').count(), 4, 'two demo options and the two new ones')
  assert.match(await page.innerText(`[data-testid=option-row-${optionId}]`), new RegExp(`${NEW_OPTION}[\\s\\S]*2 × 0\\.65 m throat`))
  assert.match(await page.innerText(`[data-testid=option-row-${sweptId}]`), /Not assessed yet/)
  await page.check(`[aria-label="Pick ${NEW_OPTION} to compare"]`)
  await page.check(`[aria-label="Pick ${SWEPT_OPTION} to compare"]`)
  await page.click('[data-testid=compare-picked]')
  await page.waitForURL(`${BASE}/compare?options=${optionId},${sweptId}`)
  await page.waitForSelector('[data-testid=compare-table]')
  assert.deepEqual(
    (await page.locator('[data-testid=compare-table] thead th[scope=col] >> a:first-child').allInnerTexts()).map((t) => t.trim()),
    [NEW_OPTION, SWEPT_OPTION],
  )
  const row = async (key: string) => (await page.locator(`[data-testid=compare-row-${key}] td`).allInnerTexts()).map((t) => t.trim())
  assert.deepEqual(await row('site'), [`${SITE} (Brackwin Water)`, `${SITE} (Brackwin Water)`])
  assert.deepEqual((await row('throat')).map(Number), [0.65, Number(throat)])
  assert.deepEqual(await row('pipeLength'), ['60.0', '60.0'])
  const energy = await row('energy')
  assert.equal(numberOf(energy[0]!), numberOf(cardEnergy), 'the stored assessment leads the comparison')
  assert.equal(energy[1], '–', 'the swept option has no assessment yet')
  assert.equal(await page.getAttribute('[data-testid=compare-row-throat]', 'data-differs'), 'true', 'the grid holds no 0.65 m throat, so the throats differ')
  assert.ok(await page.isChecked(`[data-testid=pick-${optionId}]`) && await page.isChecked(`[data-testid=pick-${sweptId}]`), 'the picker shows both picked')
  await shot(page, 'o07-compare')
  await page.context().close()
}

await runJourney('options', async (browser) => {
  await engineerJourney(browser)
})
