// Starts the built Gillwatt server (.output/server/index.mjs) for tests, journeys and benchmarks:
// on a free 127.0.0.1 port, in production mode, on its own SQLite file and uploads folder (a fresh
// temporary folder unless given), optionally loaded with the demo scenario first, and waits for
// /api/health. One place for this, so every harness starts the server the same way. Used by
// tests/server/global-setup.ts and the tests that need a server of their own, scripts/e2e.mjs and
// scripts/bench/server.ts. Types: builtServer.d.mts.
import { spawn, spawnSync } from 'node:child_process'
import { existsSync, mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

export const SERVER_ENTRY = join(process.cwd(), '.output/server/index.mjs')

/** A TCP port free on 127.0.0.1 right now. */
export function freePort() {
  return new Promise((resolve, reject) => {
    const srv = createServer()
    srv.unref()
    srv.on('error', reject)
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address()
      srv.close(() => resolve(port))
    })
  })
}

/** Stops a child and its process group (when it has one): SIGTERM first, SIGKILL after `graceMs`. */
export async function stopProcess(child, graceMs = 5000) {
  if (child.exitCode !== null || child.signalCode !== null) return
  const exited = new Promise((r) => child.once('exit', r))
  const signal = (sig) => {
    try {
      // A child started without `detached` leads no group of its own: this throws and it alone is signalled.
      process.kill(-child.pid, sig)
    } catch {
      child.kill(sig)
    }
  }
  signal('SIGTERM')
  await Promise.race([exited, new Promise((r) => setTimeout(r, graceMs))])
  if (child.exitCode === null && child.signalCode === null) {
    signal('SIGKILL')
    await exited
  }
}

/**
 * Starts the built server and resolves once /api/health answers.
 * @param {import('./builtServer.d.mts').BuiltServerOptions} [options]
 * @returns {Promise<import('./builtServer.d.mts').BuiltServer>}
 */
export async function startBuiltServer(options = {}) {
  const entry = options.entry ?? SERVER_ENTRY
  if (!existsSync(entry)) throw new Error(`No built server at ${entry}: run \`npm run build\` first (npm test builds for you).`)
  const ownDir = !options.dir
  const dir = options.dir ?? mkdtempSync(join(tmpdir(), options.prefix ?? 'gillwatt-server-'))
  const databasePath = options.databasePath ?? join(dir, 'gillwatt.sqlite')
  const uploadsDir = options.uploadsDir ?? join(dir, 'uploads')
  const removeDir = () => {
    if (ownDir) rmSync(dir, { recursive: true, force: true })
  }
  const port = await freePort()
  const baseURL = `http://127.0.0.1:${port}`
  const env = {
    ...process.env,
    NODE_ENV: 'production',
    PORT: String(port),
    HOST: '127.0.0.1',
    NITRO_HOST: '127.0.0.1',
    NITRO_PORT: String(port),
    DATABASE_PATH: databasePath,
    UPLOADS_DIR: uploadsDir,
    NUXT_SESSION_PASSWORD: options.sessionPassword ?? 'local-only-session-password-0123456789abcdef',
    NUXT_PUBLIC_APP_URL: baseURL,
    // No tile server (maps draw on a plain background) and no SMTP (mail stays in the outbox).
    NUXT_PUBLIC_MAP_TILES_URL: '',
    NUXT_PUBLIC_MAP_TILES_ATTRIBUTION: '',
    SMTP_URL: '',
    // Last, so a caller may replace any of the above; a value of undefined leaves the variable out.
    ...options.env,
  }
  if (options.seed) {
    // What `npm run db:seed` runs, without npm in between.
    const seeded = spawnSync(process.execPath, ['--import', 'tsx', 'db/cli.ts', 'seed'], { env, encoding: 'utf8' })
    if (seeded.status !== 0) {
      removeDir()
      throw new Error(`Loading the demo scenario (db/cli.ts seed) failed:\n${seeded.stdout}${seeded.stderr}${seeded.error ?? ''}`)
    }
  }
  let output = ''
  const child = spawn(process.execPath, [entry], { env, stdio: ['ignore', 'pipe', 'pipe'], detached: options.detached ?? false })
  options.onSpawn?.(child)
  child.stdout.on('data', (d) => (output += d))
  child.stderr.on('data', (d) => (output += d))
  const stop = () => stopProcess(child)
  const close = async () => {
    await stop()
    removeDir()
  }
  const timeoutMs = options.healthTimeoutMs ?? 30_000
  const deadline = Date.now() + timeoutMs
  for (;;) {
    if (child.exitCode !== null || child.signalCode !== null) {
      removeDir()
      throw new Error(`The server exited early (${child.signalCode ?? `code ${child.exitCode}`}):\n${output}`)
    }
    try {
      if ((await fetch(`${baseURL}/api/health`)).ok) break
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      await close()
      throw new Error(`The server did not answer /api/health in ${timeoutMs / 1000} s:\n${output}`)
    }
    await new Promise((r) => setTimeout(r, 100))
  }
  return { baseURL, port, dir, databasePath, uploadsDir, child, output: () => output, stop, close }
}
