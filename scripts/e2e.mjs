// The browser journeys (`tests/e2e/*.e2e.ts`), run by `npm test` after Vitest and by hand:
//   node scripts/e2e.mjs                       every journey (needs a build: `npm run build`)
//   node scripts/e2e.mjs tests/e2e/sites.e2e.ts  one journey
// Each journey gets its own built server (scripts/builtServer.mjs) on a free 127.0.0.1 port, with a
// fresh temporary SQLite file (loaded with the demo scenario, as `npm run db:seed` does) and uploads
// folder, so no journey sees another's changes. The journey runs as its own `node --import tsx` process with GW_BASE_URL (and
// GW_DATABASE_PATH); its exit code is its result. Writes .reports/e2e.json for scripts/summarise.mjs.
// Without Debian's chromium every journey counts as failed, so CI cannot pass without a browser;
// GILLWATT_E2E=skip counts them as skipped instead (the closing line then says "N skipped").
import { spawn } from 'node:child_process'
import { accessSync, constants, existsSync, mkdirSync, readdirSync, writeFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { SERVER_ENTRY, startBuiltServer, stopProcess } from './builtServer.mjs'

const ROOT = process.cwd()
const CHROMIUM = process.env.CHROMIUM_PATH || '/usr/bin/chromium'
const REPORT = '.reports/e2e.json'
const JOURNEY_TIMEOUT_MS = Number(process.env.GILLWATT_E2E_TIMEOUT_MS) || 5 * 60_000
const SESSION_PASSWORD = 'e2e-only-session-password-0123456789abcdef'

const requested = process.argv.slice(2)
const journeys = requested.length
  ? requested.map((p) => relative(ROOT, join(ROOT, p)))
  : readdirSync('tests/e2e').filter((f) => f.endsWith('.e2e.ts')).sort().map((f) => `tests/e2e/${f}`)

// Children run in their own process groups (so a stop reaches Chromium too); pass Ctrl+C on to them.
const running = new Set()
for (const sig of ['SIGINT', 'SIGTERM']) {
  process.on(sig, async () => {
    await Promise.all([...running].map((child) => stopProcess(child, 2000)))
    process.exit(130)
  })
}

const log = (line) => console.log(`[e2e] ${line}`)
const seconds = (ms) => `${(ms / 1000).toFixed(1)} s`

/** Writes the report in the shape Vitest's JSON reporter uses, which summarise.mjs reads. */
function writeReport(results) {
  const count = (status) => results.filter((r) => r.status === status).length
  const report = {
    numTotalTests: results.length,
    numPassedTests: count('passed'),
    numFailedTests: count('failed'),
    numPendingTests: count('skipped'),
    numTodoTests: 0,
    numFailedTestSuites: 0,
    success: count('failed') === 0,
    startTime: started,
    testResults: results.map((r) => ({ name: r.name, status: r.status, durationMs: r.durationMs, message: r.message })),
  }
  mkdirSync('.reports', { recursive: true })
  writeFileSync(REPORT, JSON.stringify(report, null, 2) + '\n')
}

/** A built server in its own process group on a fresh demo database (see builtServer.mjs), stopped by Ctrl+C too. */
function startServer() {
  return startBuiltServer({
    prefix: 'gillwatt-e2e-',
    seed: true,
    sessionPassword: SESSION_PASSWORD,
    detached: true,
    onSpawn: (child) => {
      running.add(child)
      child.once('exit', () => running.delete(child))
    },
  })
}

/** Runs one journey file as its own process; resolves with its exit code (or why it was stopped). */
function runJourney(file, server) {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ['--import', 'tsx', file], {
      env: { ...process.env, GW_BASE_URL: server.baseURL, GW_DATABASE_PATH: server.databasePath, CHROMIUM_PATH: CHROMIUM },
      stdio: 'inherit',
      detached: true,
    })
    running.add(child)
    let timedOut = false
    const timer = setTimeout(() => {
      timedOut = true
      stopProcess(child)
    }, JOURNEY_TIMEOUT_MS)
    child.on('error', (error) => {
      clearTimeout(timer)
      resolve({ code: 1, why: `could not start: ${error.message}` })
    })
    child.on('exit', (code, signal) => {
      clearTimeout(timer)
      running.delete(child)
      if (timedOut) resolve({ code: 1, why: `stopped after the ${seconds(JOURNEY_TIMEOUT_MS)} limit` })
      else resolve({ code: code ?? 1, why: code === 0 ? '' : code === null ? `killed by ${signal}` : `exited with code ${code}` })
    })
  })
}

const started = Date.now()
const results = []

let browserMissing = ''
try {
  accessSync(CHROMIUM, constants.X_OK)
} catch {
  browserMissing = `no Chromium at ${CHROMIUM}: install Debian's chromium (apt-get install -y chromium)`
}

if (journeys.length === 0) {
  log('no journeys found in tests/e2e/')
  writeReport([])
  process.exit(0)
}
if (process.env.GILLWATT_E2E === 'skip' || browserMissing) {
  const skip = process.env.GILLWATT_E2E === 'skip'
  const why = skip ? 'GILLWATT_E2E=skip is set' : `${browserMissing}, or set GILLWATT_E2E=skip to skip the journeys`
  log(`${journeys.length} browser journey(s) ${skip ? 'skipped' : 'FAILED'}: ${why}`)
  writeReport(journeys.map((name) => ({ name, status: skip ? 'skipped' : 'failed', durationMs: 0, message: why })))
  process.exit(skip ? 0 : 1)
}
if (!existsSync(SERVER_ENTRY)) {
  const why = 'no built server in .output: run `npm run build` first (npm test builds for you)'
  log(`${journeys.length} browser journey(s) FAILED: ${why}`)
  writeReport(journeys.map((name) => ({ name, status: 'failed', durationMs: 0, message: why })))
  process.exit(1)
}

for (const name of journeys) {
  const t0 = Date.now()
  log(`${name}: starting a server on a fresh demo database`)
  let server
  try {
    server = await startServer()
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error)
    log(`${name} FAILED: ${message}`)
    results.push({ name, status: 'failed', durationMs: Date.now() - t0, message })
    continue
  }
  log(`${name}: running against ${server.baseURL}`)
  const { code, why } = await runJourney(name, server)
  const serverLog = server.output()
  await server.close()
  const durationMs = Date.now() - t0
  if (code === 0) {
    log(`${name} passed in ${seconds(durationMs)}`)
    results.push({ name, status: 'passed', durationMs })
  } else {
    log(`${name} FAILED in ${seconds(durationMs)}: ${why}`)
    if (serverLog.trim()) log(`last lines from its server:\n${serverLog.trim().split('\n').slice(-30).join('\n')}`)
    results.push({ name, status: 'failed', durationMs, message: why })
  }
}

writeReport(results)
const failed = results.filter((r) => r.status === 'failed').length
log(`${results.length - failed} of ${results.length} browser journey(s) passed in ${seconds(Date.now() - started)}`)
process.exit(failed ? 1 : 0)
