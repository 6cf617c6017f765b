// `npm run demo`: builds Gillwatt, migrates and seeds the embedded SQLite database with the
// invented demo scenario, and serves it on http://localhost:3000 (PORT to change).
import { spawn, spawnSync } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'

const step = (title, cmd, args, env = process.env) => {
  console.log(`\n== ${title}`)
  const { status } = spawnSync(cmd, args, { stdio: 'inherit', env })
  if (status !== 0) process.exit(status ?? 1)
}

// A session password of the demo's own, kept in .data so sign-ins survive restarts.
mkdirSync('.data', { recursive: true })
const secretFile = '.data/demo-session-password'
if (!existsSync(secretFile)) writeFileSync(secretFile, randomBytes(32).toString('hex'), { mode: 0o600 })
const env = {
  ...process.env,
  NODE_ENV: 'production',
  NUXT_SESSION_PASSWORD: process.env.NUXT_SESSION_PASSWORD || readFileSync(secretFile, 'utf8').trim(),
  PORT: process.env.PORT || '3000',
}

if (!process.argv.includes('--no-build')) step('Building Gillwatt', 'npx', ['nuxt', 'build'])
step('Preparing the database with the demo scenario', process.execPath, ['--import', 'tsx', 'db/cli.ts', 'seed'], env)

console.log(`\n== Gillwatt is starting on http://localhost:${env.PORT} (Ctrl+C to stop)\n`)
const server = spawn(process.execPath, ['.output/server/index.mjs'], { stdio: 'inherit', env })
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal))
server.on('exit', (code) => process.exit(code ?? 0))
