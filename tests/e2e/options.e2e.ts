// Longer than most files: one journey through every option screen, in the order a person takes them.
// Browser journey of the project engineer through design options, results, the design sweep and the
// comparison, against a running, seeded server. `npm test` runs it through scripts/e2e.mjs (its own
// server on a fresh demo database); by hand:
//   DATABASE_PATH=/tmp/ui.sqlite npm run db:seed
//   PORT=3200 NODE_ENV=production NUXT_SESSION_PASSWORD=… DATABASE_PATH=/tmp/ui.sqlite node <copy of .output>/server/index.mjs
//   GW_BASE_URL=http://localhost:3200 node --import tsx tests/e2e/options.e2e.ts
// At Hollin Mill weir (the demo site with a twelve-year daily record) the engineer makes a new option,
// watches the live preview follow the fields, closes July with the keyboard, saves and assesses it,
// reads the charts, flags, operating rule, closed month and CSV of the stored run, sweeps the design
// in a Web Worker, saves a picked cell as an option and compares the two. Drives Debian's chromium through playwright-core, saves screenshots to
// tests/e2e/screenshots/ and exits non-zero on the first failed check or on any console error, page
// error or failed request.
import assert from 'node:assert/strict'
import { readFileSync } from 'node:fs'
import type { Browser, Page } from 'playwright-core'
import { CAUTIONS } from '../../shared/utils/cautions'
import { BASE, openPage, openSiteFromPortfolio, runJourney, shot, signIn, waitForChart } from './journey'

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

  // 1. The demo site with a record, its options tab: the three demo options with their figures.
  const siteId = await openSiteFromPortfolio(page, SITE)
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
  assert.equal(await demoRows.count(), 3, 'Hollin Mill weir has three demo options')
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
  // A shallower throat (cheaper to dig) holds the bubbles at less pressure: the preview moves again.
  await page.fill('#opt-design-throatDepth_m', '0.8')
  const energyShallow = await previewMoves(page, 'energy', energyLongPipe)
  // How the units are run: the mode and the closed months each carry a caution; July is closed with
  // the keyboard (Tab to its checkbox, Space), as a consent might ask, and the preview follows.
  const closedField = page.locator('[data-testid="field-design.operation.closedMonths"]')
  assert.match(await closedField.locator('legend').innerText(), /^Closed months$/)
  assert.match(await closedField.locator('[role=note]').innerText(), /^Caution: Closed months are usually a condition of a consent[\s\S]*regulator/)
  assert.match(await page.locator('[data-testid="field-design.operation.mode"] [role=note]').innerText(), /^Caution: River first may cost energy/)
  assert.equal(await closedField.locator('input[type=checkbox]').count(), 12, 'a checkbox for each month')
  assert.equal(await closedField.locator('input:checked').count(), 0, 'no month is closed at first')
  await page.focus('#opt-design-operation-closedMonths-6')
  await page.keyboard.press('Tab')
  assert.equal(await page.evaluate(() => document.activeElement?.id), 'opt-design-operation-closedMonths-7', 'Tab moves from June to July')
  await page.keyboard.press('Space')
  assert.ok(await page.isChecked('#opt-design-operation-closedMonths-7'), 'Space ticks July')
  await page.waitForFunction(() => document.querySelector('[data-testid=preview-status]')?.textContent?.trim() === 'Updating…')
  const energyClosed = await previewFigure(page, 'energy')
  assert.ok(numberOf(energyClosed) <= numberOf(energyShallow), `closing July makes no more energy: ${energyShallow} → ${energyClosed}`)
  assert.deepEqual(await closedField.locator('input:checked').evaluateAll((bs) => bs.map((b) => b.id)), ['opt-design-operation-closedMonths-7'])
  await shot(page, 'o03-editor-preview')
  await page.click('[data-testid=option-save]')
  await page.waitForSelector('[data-testid=option-saved]')
  const stored = await page.evaluate(async (id) => (await (await fetch(`/api/options/${id}`)).json()) as { design: { air: { pipeLength_m: number; pipeDiameter_m: number }; operation: { closedMonths: number[] } } }, optionId)
  assert.deepEqual([stored.design.air.pipeLength_m, stored.design.air.pipeDiameter_m], [60, 0.2])
  assert.deepEqual(stored.design.operation.closedMonths, [7], 'July is stored as a closed month')
  // Loaded afresh (the server renders the form, the browser fills it), July alone shows closed.
  await page.goto(page.url())
  await page.waitForSelector('[data-testid=preview-figures]')
  assert.ok(await page.isChecked('#opt-design-operation-closedMonths-7') && !(await page.isChecked('#opt-design-operation-closedMonths-8')), 'the stored option shows July alone closed')
  assert.equal(await page.evaluate(() => getComputedStyle(document.querySelector('label[for=opt-design-operation-closedMonths-7]')!).color), 'rgb(255, 255, 255)', 'the ticked month looks ticked')
  assert.equal(await page.innerText('[data-testid=save-assessment]'), 'Save assessment')
  await page.click('[data-testid=save-assessment]')
  await page.waitForURL(/\/assessments\/\d+$/)
  const assessmentId = Number(new URL(page.url()).pathname.split('/').pop())

  // 4. The results: the stored run agrees with the browser's preview, every chart is drawn.
  await page.waitForSelector('[data-testid=headline-cards]')
  assert.match(await page.innerText('[data-testid=assessment-title]'), new RegExp(`Assessment ${assessmentId} · ${NEW_OPTION}`))
  const cardEnergy = (await page.innerText('[data-testid=card-energy] dd >> nth=0')).trim()
  assert.equal(cardEnergy, energyClosed, 'the server computes what the browser previewed')
  assert.match(await page.innerText('[data-testid=card-oxygen-year]'), /Net oxygen change over the year[\s\S]*[+−]?\d\.\d\d mg\/L[\s\S]*worst [+−]?\d\.\d\d mg\/L at any flow/i)
  assert.match(await page.innerText('[data-testid=card-recovery]'), /\d+ %[\s\S]*pressure recovered by the diffuser/)
  for (const chart of ['chart-fdc', 'chart-power-air', 'chart-suction', 'chart-energy-months', 'chart-oxygen-months', 'chart-tornado-energy']) {
    const painted = await waitForChart(page, `[data-testid=${chart}]`)
    assert.ok(painted > 500, `${chart} is drawn (${painted} painted pixels)`)
  }
  await page.click('[data-testid=tornado-oxygen]')
  assert.ok((await waitForChart(page, '[data-testid=chart-tornado-oxygen]')) > 500, 'the oxygen sensitivity is drawn')
  await page.click('[data-testid=tornado-npv]')
  assert.ok((await waitForChart(page, '[data-testid=chart-tornado-npv]')) > 500, 'the NPV sensitivity is drawn, capital cost and export price among its bars')

  // How sure: the record's years one by one, the stored Monte Carlo, and a preview from another seed in a browser worker.
  const sure = page.locator('[data-testid=assessment-uncertainty]')
  assert.match(await sure.locator('[data-testid=uncertainty-years]').innerText(), /Complete years\s+\d+[\s\S]*P50 annual energy\s+[\d,.]+ MWh[\s\S]*P90 annual energy\s+([\d,.]+ MWh|needs 9 complete years)[\s\S]*Driest year\s+\d{4}: /)
  assert.ok((await waitForChart(page, '[data-testid=chart-years]')) > 500, 'each complete year\'s energy is drawn')
  const drawsTable = sure.locator('[data-testid=uncertainty-draws] table >> nth=0')
  assert.match(await drawsTable.locator('caption').innerText(), /Stored with this assessment \(200 draws, seed 1\)/)
  assert.deepEqual((await drawsTable.locator('tbody th').allInnerTexts()).map((t) => t.trim()), ['Annual energy (MWh/yr)', 'Levelised cost (£/MWh)', 'Net present value (£)', 'Net O₂ change, worst month (mg/L)'])
  assert.match(await page.innerText('[data-testid=uncertainty-loss-chance]'), /loses more oxygen than the acceptable 0\.10 mg\/L in (none of the draws|every draw|(under )?\d+ % of draws)/)
  assert.ok((await waitForChart(page, '[data-testid=chart-draws-energy]')) > 500, 'the draws\' energy is drawn')
  await page.fill('input[name=previewDraws]', '20')
  await page.fill('input[name=previewSeed]', '7')
  await page.click('[data-testid=uncertainty-preview]')
  await page.waitForSelector('[data-testid=uncertainty-preview-table]', { timeout: 30_000 })
  assert.match(await page.innerText('[data-testid=uncertainty-preview-table] caption'), /Preview, not stored \(20 draws, seed 7\)/)

  // 5. Flags, each in words, raised or clear; then the cautions every screening carries.
  const flags = page.locator('[data-testid=assessment-flags] li[data-testid^=flag-]')
  assert.equal(await flags.count(), 7, 'every flag is listed, raised or clear')
  for (const text of await flags.allInnerTexts()) assert.match(text, /^(Safety|River caution|Money caution|Note|Clear)\s+\S[\s\S]*\n\S/, 'each flag says its level or that it is clear, and its reason')
  const states = await flags.evaluateAll((ls) => ls.map((l) => ({ raised: l.getAttribute('data-raised') === 'true', level: l.getAttribute('data-level') ?? '', facts: l.querySelector('[data-testid=flag-facts]')?.textContent ?? '' })))
  const rank = (f: { raised: boolean; level: string }) => (f.raised ? 0 : 4) + ['safety', 'river', 'money', 'note'].indexOf(f.level)
  assert.deepEqual(states.map(rank), [...states.map(rank)].sort((a, b) => a - b), 'raised flags first, then safety, river cautions, money cautions and notes')
  // Money in the demo organisation's currency, with a plain word on whether it pays.
  const money = await page.locator('[data-testid=money-verdict]').innerText()
  assert.match(money, /^(Does not pay: .*it would need £[\d,]+ per MWh to break even\.|Pays: NPV £[\d,]+ at £[\d,]+ per MWh.*)$/, 'the money card says whether the scheme pays, in pounds')
  assert.ok(!/currency/i.test(await page.locator('[data-testid=money-cards]').innerText()), 'no amount is labelled "currency"')
  const loss = states[await flags.evaluateAll((ls) => ls.findIndex((l) => l.getAttribute('data-testid') === 'flag-net-oxygen-loss'))]!
  assert.equal(loss.level, 'river', 'the oxygen cost to the river is a river caution')
  assert.ok(loss.raised, 'a shallow throat in the leat costs the river some oxygen: its bubbles give back less than the weir\'s fall')
  assert.match(loss.facts, /^raised (under )?\d+ % of the year · worst −\d\.\d\d mg\/L in [A-Z][a-z]{2} at [\d.]+ m³\/s$/, 'the raised flag gives its share of the year, its worst value and when')
  assert.ok(states.every((f) => f.raised || f.facts === ''), 'a clear flag says it in its reason alone')

  // The operating rule: energy first, July closed, both modes side by side.
  const operation = page.locator('[data-testid=assessment-operation]')
  const opText = await operation.innerText()
  assert.match(opText, /Mode in use\s+Energy first/)
  assert.match(opText, /Closed months\s+July/)
  assert.match(opText, /Units run\s+(under )?\d+ % of the year/)
  assert.deepEqual((await operation.locator('thead th').allInnerTexts()).map((t) => t.trim()), ['Figure', 'Energy first in use', 'River first'])
  assert.equal(await operation.locator('tbody tr').count(), 4, 'energy, worst month, worst at any flow and mean net O₂ change')
  const energyFirstCell = (await operation.locator('tbody tr >> nth=0').locator('td >> nth=0').innerText()).trim()
  assert.equal(energyFirstCell, cardEnergy.replace(/ MWh\/yr$/, ''), 'the mode in use gives the headline energy')
  assert.match(await page.innerText('[data-testid=energy-given-up]'), /^Energy given up for the river: [\d,]+\.\d MWh\/yr/)
  assert.match(await page.innerText('[data-testid=operation-basis]'), /^Judged at \d+ flows in each month/)
  const cautions = await page.innerText('[data-testid=assessment-cautions]')
  for (const c of CAUTIONS) assert.ok(cautions.includes(c.title) && cautions.includes(c.text), `the caution "${c.title}" is shown`)
  assert.equal(await page.locator('[data-testid=month-table] tbody tr').count(), 12)
  // July is closed: marked in words, no unit runs, no energy.
  assert.equal(await page.locator('[data-testid=month-table] tbody tr[data-closed=true]').count(), 1)
  const july = (await page.locator('[data-testid=month-row-7] td').allInnerTexts()).map((t) => t.trim())
  assert.match(july[0]!, /^Jul\s+closed$/)
  assert.equal(july[9], '0', 'no unit runs in a closed month')
  assert.equal(july[13], '0.0', 'a closed month makes no energy')
  assert.match(await page.innerText('[data-testid=month-bases]'), /Each month's flow is the mean of the record's days in that month\.[\s\S]*Each month's energy comes from the record's days in that month\./)
  assert.equal(await page.locator('[data-testid=month-profile-note]').count(), 0, 'a site with a record needs no seasonal profile')
  const shut = await page.locator('[data-testid=perflow-table] [data-testid=shut-reason]').allInnerTexts()
  assert.equal(shut.length, 13, 'a reason (or a dash) at each flow of the table')
  assert.ok(shut.every((t) => ['–', 'not enough water to feed a unit at the pool level', 'would draw no air', 'below turbine cut-in', 'shut for the river', 'no head', 'closed month'].includes(t.trim())), `shut reasons in words: ${shut.join(' | ')}`)
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
  assert.ok(months[0]!.includes('Closed month (-)') && months[0]!.includes('Share of the month units run (fraction)'))
  assert.match(months[1]!, /^Jan,/)
  assert.match(months[7]!, /^Jul,[^\r\n]*,closed,/)
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
  assert.equal(summary.filter((l) => l.startsWith('Flag: ')).length, 7, 'every flag, the money caution included')
  assert.ok(summary.includes('Closed months,7,month numbers'), 'the summary CSV names the closed month')

  // 7. The sweep of the option runs in a Web Worker (no server sweep), then draws the heatmap.
  await page.goto(`${BASE}/sites/${siteId}/options/${optionId}`)
  await page.click('[data-testid=link-sweep]')
  await page.waitForURL(`${BASE}/sites/${siteId}/options/${optionId}/sweep`)
  await page.waitForSelector('[data-testid=sweep-form]')
  // The form starts around the option; the grid is set to reach the deep, narrow corner where the
  // demo weir's one safe design lies: 5 throats (0.3–0.7 m) × 1, 2, 3 units × 3 depths (3–5 m).
  assert.equal(await page.inputValue('[data-testid=sweep-throatFrom]'), '0.44', 'the throat range starts three steps below the option')
  assert.equal(await page.inputValue('[data-testid=sweep-depthFrom]'), '0', 'the depth range starts 1 m above the option, no higher than the surface')
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
  const points = (await cells.evaluateAll((bs) => bs.map((b) => ({
    label: b.getAttribute('aria-label') ?? '', safe: b.getAttribute('data-safe') === 'true', acceptable: b.getAttribute('data-acceptable') === 'true', text: b.textContent ?? '',
  })))).map((c) => ({
    ...c,
    energy: Number(/: ([\d,]+\.\d) MWh\/yr/.exec(c.label)?.[1]?.replace(/,/g, '')),
  }))
  assert.ok(points.every((c) => Number.isFinite(c.energy) && /\d/.test(c.text)), 'every cell shows its energy')
  assert.ok(points.every((c) => c.safe === !c.text.includes('unsafe:')), 'unsafe cells say so in words, not colour alone')
  assert.ok(points.every((c) => (c.safe && !c.acceptable) === c.text.includes('river cost')), 'safe cells that cost the river too much oxygen say so in words')
  assert.ok(points.every((c) => c.label.includes(!c.safe ? ', unsafe (' : !c.acceptable ? ', safe but a river cost' : ', acceptable')), 'each cell\'s label says which it is')
  const acceptable = points.filter((c) => c.acceptable && c.energy > 0)
  assert.ok(acceptable.length >= 1, 'the grid reaches an acceptable design')
  assert.match(await page.innerText('[data-testid=sweep-summary]'), new RegExp(`^Of 45 options, ${acceptable.length} make energy with every safety flag clear and cost the river no more oxygen than is acceptable;`))
  // The best acceptable point is starred, is the most energy among the acceptable cells, and has its panel.
  const starred = points.filter((c) => c.label.endsWith(', best acceptable point'))
  assert.equal(starred.length, 1, 'one cell is the best acceptable point')
  assert.equal(starred[0]!.energy, Math.max(...acceptable.map((c) => c.energy)))
  assert.ok(starred[0]!.text.startsWith('★'))
  const bestPanel = page.locator('section[aria-label="Best acceptable point"]')
  await bestPanel.waitFor()
  assert.match(await bestPanel.locator('[role=note]').innerText(), /^Acceptable: every safety flag clear/)
  assert.match(await bestPanel.innerText(), /Net O₂ change, mean over the year\s+[+−]?\d\.\d\d mg\/L[\s\S]*Net O₂ change, worst at any flow\s+[+−]?\d\.\d\d mg\/L/)
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
  assert.match(await panel.locator('[role=note]').innerText(), !chosen.safe ? /^Unsafe: .+\.$/ : !chosen.acceptable ? /^River cost: safe, but/ : /^Acceptable:/, 'the pick says whether it is unsafe, a river cost or acceptable')
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
  assert.equal(await page.locator('[data-testid=option-list] tbody tr').count(), 5, 'three demo options and the two new ones')
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

/**
 * Every demo option's editor loaded afresh by address, as each demo role: what the server draws must be
 * what the browser draws (a mismatch is a console error, which the journey counts), with every field on show.
 */
async function optionPagesLoadedDirectly(browser: Browser) {
  for (const email of [ENGINEER, 'elspeth@fellside-agency.example']) {
    const page = await openPage(browser)
    await signIn(page, email)
    const ids = await page.evaluate(async () => {
      const me = (await (await fetch('/api/me')).json()) as { memberships: Array<{ orgId: number }> }
      const list = (await (await fetch(`/api/orgs/${me.memberships[0]!.orgId}/options`)).json()) as { sites: Array<{ siteId: number, options: Array<{ id: number }> }> }
      return list.sites.flatMap((s) => s.options.map((o) => [s.siteId, o.id] as const))
    })
    assert.ok(ids.length >= 5, `the demo options are listed (${ids.length})`)
    for (const [siteId, optionId] of ids) {
      await page.goto(`${BASE}/sites/${siteId}/options/${optionId}`)
      await page.waitForSelector('[data-testid=option-form]')
    }
    await page.context().close()
  }
}

await runJourney('options', async (browser) => {
  await optionPagesLoadedDirectly(browser)
  await engineerJourney(browser)
})
