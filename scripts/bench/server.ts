// The built server for the HTTP benchmarks: `.output/server/index.mjs` (never built here; run
// `npm run build` first) on a free 127.0.0.1 port with a temporary SQLite file and uploads folder,
// optionally loaded with the demo scenario first; plus sign-up and sign-in answering a session cookie.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { existsSync, mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

/** The built server; GILLWATT_BENCH_SERVER may name a copy of .output's entry (e.g. one taken under the build lock). */
export const SERVER_ENTRY = process.env.GILLWATT_BENCH_SERVER || join(process.cwd(), '.output/server/index.mjs')
const HEALTH_TIMEOUT_MS = 30_000
const SESSION_PASSWORD = 'bench-only-session-password-0123456789abcdef'

/** Throws a clear message when there is no built server; the benchmarks never build. */
export function assertBuilt(): void {
  if (!existsSync(SERVER_ENTRY)) {
    throw new Error(`No built server at ${SERVER_ENTRY}: run npm run build first (npm run bench builds nothing itself).`)
  }
}

export interface BenchServer {
  baseURL: string
  /** The server's SQLite file: a second connection may write to it while the server runs (WAL). */
  databasePath: string
  stop(): Promise<void>
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

async function stopChild(child: ChildProcess, graceMs = 5000): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return
  const exited = new Promise((r) => child.once('exit', r))
  child.kill('SIGTERM')
  await Promise.race([exited, new Promise((r) => setTimeout(r, graceMs))])
  if (child.exitCode === null && child.signalCode === null) {
    child.kill('SIGKILL')
    await exited
  }
}

/**
 * Starts the built server in production mode on a fresh temporary database and waits for
 * /api/health. `demo: true` loads the demo scenario (`db/cli.ts seed`, as `npm run db:seed`) first.
 */
export async function startBenchServer(opts: { demo?: boolean } = {}): Promise<BenchServer> {
  assertBuilt()
  const dir = mkdtempSync(join(tmpdir(), 'gillwatt-bench-server-'))
  const databasePath = join(dir, 'bench.sqlite')
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
    UPLOADS_DIR: join(dir, 'uploads'),
    NUXT_SESSION_PASSWORD: SESSION_PASSWORD,
    NUXT_PUBLIC_APP_URL: baseURL,
    NUXT_PUBLIC_MAP_TILES_URL: '',
    NUXT_PUBLIC_MAP_TILES_ATTRIBUTION: '',
    SMTP_URL: '',
  }
  const cleanUp = () => rmSync(dir, { recursive: true, force: true })
  if (opts.demo) {
    const seeded = spawnSync(process.execPath, ['--import', 'tsx', 'db/cli.ts', 'seed'], { env, encoding: 'utf8' })
    if (seeded.status !== 0) {
      cleanUp()
      throw new Error(`Loading the demo scenario failed:\n${seeded.stdout}${seeded.stderr}`)
    }
  }
  let output = ''
  const child = spawn(process.execPath, [SERVER_ENTRY], { env, stdio: ['ignore', 'pipe', 'pipe'] })
  child.stdout?.on('data', (d) => (output += d))
  child.stderr?.on('data', (d) => (output += d))
  const onExit = () => child.kill('SIGKILL')
  process.once('exit', onExit)
  let stopping = false
  // A server that dies under load says why: its own output goes to stderr.
  child.once('exit', (code, signal) => {
    if (!stopping) console.error(`The built server exited (${signal ?? `code ${code}`}) during the benchmark:\n${output.slice(-4000)}`)
  })
  const stop = async () => {
    stopping = true
    process.off('exit', onExit)
    await stopChild(child)
    cleanUp()
  }
  const deadline = Date.now() + HEALTH_TIMEOUT_MS
  for (;;) {
    if (child.exitCode !== null) {
      await stop()
      throw new Error(`The built server exited early:\n${output}`)
    }
    try {
      const res = await fetch(`${baseURL}/api/health`)
      if (res.ok) break
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      await stop()
      throw new Error(`The built server did not answer /api/health within ${HEALTH_TIMEOUT_MS / 1000} s:\n${output}`)
    }
    await new Promise((r) => setTimeout(r, 150))
  }
  return { baseURL, databasePath, stop }
}

/** A signed-in person: the `cookie` header value to send, and their first organisation. */
export interface BenchSession {
  cookie: string
  /** The bare session cookie, for a browser context. */
  sessionCookie: { name: string; value: string }
  userId: number
  orgId: number
}

async function sessionFrom(res: Response, what: string, expected: number): Promise<BenchSession> {
  const text = await res.text()
  if (res.status !== expected) throw new Error(`${what} answered ${res.status}: ${text}`)
  const body = JSON.parse(text) as { user: { id: number }; memberships: { orgId: number }[] }
  const pairs = res.headers.getSetCookie().map((c) => c.split(';')[0]!)
  const session = pairs.find((p) => p.startsWith('gillwatt-session='))
  if (!session) throw new Error(`${what} set no gillwatt-session cookie`)
  const eq = session.indexOf('=')
  return {
    cookie: pairs.join('; '),
    sessionCookie: { name: session.slice(0, eq), value: session.slice(eq + 1) },
    userId: body.user.id,
    orgId: body.memberships[0]!.orgId,
  }
}

let people = 0
/** Signs up a new person with an organisation of their own (they are its admin). */
export async function signUpSession(baseURL: string, tag: string): Promise<BenchSession> {
  const email = `bench-${tag}-${Date.now().toString(36)}-${people++}@bench.example`
  const res = await fetch(`${baseURL}/api/auth/signup`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', accept: 'application/json' },
    body: JSON.stringify({ name: `Bench ${tag}`, email, password: 'bench only password 2026', organisationName: `Bench organisation ${tag} (invented)` }),
  })
  return sessionFrom(res, `POST /api/auth/signup for ${email}`, 201)
}

/** Signs in an existing account (e.g. a demo account). */
export async function signInSession(baseURL: string, email: string, password: string): Promise<BenchSession> {
  const res = await fetch(`${baseURL}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', accept: 'application/json' },
    body: JSON.stringify({ email, password }),
  })
  return sessionFrom(res, `POST /api/auth/login for ${email}`, 200)
}
