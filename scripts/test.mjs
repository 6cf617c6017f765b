// `npm test`: builds the app once, runs every Vitest project (unit, server) against it, then the
// browser journeys (scripts/e2e.mjs). A targeted run (`npm test -- --project server tests/server/x.test.ts`,
// or any test-file filter) runs only that Vitest selection. Reports land in .reports/; the closing
// line is printed by scripts/summarise.mjs from all of them.
import { spawnSync } from 'node:child_process'
import { rmSync } from 'node:fs'

const run = (cmd, args) => spawnSync(cmd, args, { stdio: 'inherit', env: process.env }).status ?? 1

const args = process.argv.slice(2)
// `--project x` / `--project=x`, or a file filter (an argument that is not an option or its value).
const targeted = args.some((a, i) => a === '--project' || a.startsWith('--project=') || (!a.startsWith('-') && !/^--?\w/.test(args[i - 1] ?? '')))

rmSync('.reports', { recursive: true, force: true })
if (process.env.GILLWATT_SKIP_BUILD !== '1') {
  const built = run('npx', ['nuxt', 'build'])
  if (built !== 0) {
    console.error('Build failed: no tests were run.')
    console.log('0 passed, 1 failed')
    process.exit(1)
  }
}
const tests = run('npx', ['vitest', 'run', ...args])
const journeys = targeted ? 0 : run(process.execPath, ['scripts/e2e.mjs'])
const summary = run(process.execPath, ['scripts/summarise.mjs'])
process.exit(tests || journeys || summary)
