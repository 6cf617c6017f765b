// `npm test`: builds the app once, then runs every Vitest project (unit, server) against it.
// Reports land in .reports/; the closing line is printed by scripts/summarise.mjs.
import { spawnSync } from 'node:child_process'
import { rmSync } from 'node:fs'

const run = (cmd, args) => spawnSync(cmd, args, { stdio: 'inherit', env: process.env }).status ?? 1

rmSync('.reports', { recursive: true, force: true })
if (process.env.GILLWATT_SKIP_BUILD !== '1') {
  const built = run('npx', ['nuxt', 'build'])
  if (built !== 0) {
    console.error('Build failed: no tests were run.')
    console.log('0 passed, 1 failed')
    process.exit(1)
  }
}
const tests = run('npx', ['vitest', 'run', ...process.argv.slice(2)])
const summary = run(process.execPath, ['scripts/summarise.mjs'])
process.exit(tests || summary)
