import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync, mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { TestProject } from 'vitest/node'

// One built Gillwatt server for all server-route tests, on a fresh temporary SQLite file.
// `npm test` builds .output first; run `npm run build` before `vitest --project server` by hand.

declare module 'vitest' {
  export interface ProvidedContext {
    baseURL: string
    databasePath: string
  }
}

const freePort = () =>
  new Promise<number>((resolve, reject) => {
    const srv = createServer()
    srv.unref()
    srv.on('error', reject)
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number }
      srv.close(() => resolve(port))
    })
  })

let server: ChildProcess | undefined
let dir: string | undefined

export async function setup(project: TestProject) {
  const entry = join(process.cwd(), '.output/server/index.mjs')
  if (!existsSync(entry)) throw new Error('No built server: run `npm run build` (npm test does it for you).')
  dir = mkdtempSync(join(tmpdir(), 'gillwatt-test-'))
  const databasePath = join(dir, 'test.sqlite')
  const port = await freePort()
  const baseURL = `http://127.0.0.1:${port}`
  let output = ''
  server = spawn(process.execPath, [entry], {
    env: {
      ...process.env,
      NODE_ENV: 'production',
      PORT: String(port),
      HOST: '127.0.0.1',
      NITRO_HOST: '127.0.0.1',
      DATABASE_PATH: databasePath,
      UPLOADS_DIR: join(dir, 'uploads'),
      NUXT_SESSION_PASSWORD: 'test-only-session-password-0123456789abcdef',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  server.stdout?.on('data', (d) => (output += d))
  server.stderr?.on('data', (d) => (output += d))
  const deadline = Date.now() + 30_000
  for (;;) {
    if (server.exitCode !== null) throw new Error(`Server exited early:\n${output}`)
    try {
      const res = await fetch(`${baseURL}/api/health`)
      if (res.ok) break
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) throw new Error(`Server did not answer /api/health in 30 s:\n${output}`)
    await new Promise((r) => setTimeout(r, 150))
  }
  project.provide('baseURL', baseURL)
  project.provide('databasePath', databasePath)
}

export async function teardown() {
  if (server && server.exitCode === null) {
    const exited = new Promise((r) => server!.once('exit', r))
    server.kill('SIGTERM')
    await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))])
    if (server.exitCode === null) server.kill('SIGKILL')
  }
  if (dir) rmSync(dir, { recursive: true, force: true })
}
