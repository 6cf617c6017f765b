// The built server for the HTTP benchmarks: `.output/server/index.mjs` (never built here; run
// `npm run build` first) started by scripts/builtServer.mjs on a free 127.0.0.1 port with a temporary
// SQLite file and uploads folder, optionally loaded with the demo scenario first; plus sign-up and
// sign-in answering a session cookie.
import { existsSync } from 'node:fs'
import { SERVER_ENTRY as BUILT_ENTRY, startBuiltServer } from '../builtServer.mjs'

/** The built server; GILLWATT_BENCH_SERVER may name a copy of .output's entry (e.g. one taken under the build lock). */
export const SERVER_ENTRY = process.env.GILLWATT_BENCH_SERVER || BUILT_ENTRY
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
  /** The server's process id, e.g. to read its resident memory. */
  pid: number
  stop(): Promise<void>
}

/**
 * Starts the built server in production mode on a fresh temporary database and waits for
 * /api/health. `demo: true` loads the demo scenario (`db/cli.ts seed`, as `npm run db:seed`) first;
 * `env` adds to the server's environment (e.g. raised rate limits).
 */
export async function startBenchServer(opts: { demo?: boolean; env?: Record<string, string> } = {}): Promise<BenchServer> {
  assertBuilt()
  const server = await startBuiltServer({
    entry: SERVER_ENTRY,
    prefix: 'gillwatt-bench-server-',
    seed: opts.demo,
    sessionPassword: SESSION_PASSWORD,
    env: opts.env,
    // Should the benchmark end without stop(), the server goes with it.
    onSpawn: (child) => {
      const kill = () => child.kill('SIGKILL')
      process.once('exit', kill)
      child.once('exit', () => process.off('exit', kill))
    },
  })
  let stopping = false
  // A server that dies under load says why: its own output goes to stderr.
  server.child.once('exit', (code, signal) => {
    if (!stopping) console.error(`The built server exited (${signal ?? `code ${code}`}) during the benchmark:\n${server.output().slice(-4000)}`)
  })
  const stop = async () => {
    stopping = true
    await server.close()
  }
  return { baseURL: server.baseURL, databasePath: server.databasePath, pid: server.child.pid!, stop }
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
/**
 * Signs up a new person with an organisation of their own (they are its admin), then signs them in:
 * sign-up answers 202 with no session whether or not the address was new, so a stranger learns nothing.
 */
export async function signUpSession(baseURL: string, tag: string): Promise<BenchSession> {
  const email = `bench-${tag}-${Date.now().toString(36)}-${people++}@bench.example`
  const password = 'bench only password 2026'
  const res = await fetch(`${baseURL}/api/auth/signup`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', accept: 'application/json' },
    body: JSON.stringify({ name: `Bench ${tag}`, email, password, organisationName: `Bench organisation ${tag} (invented)` }),
  })
  if (res.status !== 202) throw new Error(`POST /api/auth/signup for ${email} answered ${res.status}: ${await res.text()}`)
  return signInSession(baseURL, email, password)
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
