import type { TestProject } from 'vitest/node'
import { startBuiltServer, type BuiltServer } from '../../scripts/builtServer.mjs'

// One built Gillwatt server for all server-route tests, on a fresh temporary SQLite file.
// `npm test` builds .output first; run `npm run build` before `vitest --project server` by hand.

declare module 'vitest' {
  export interface ProvidedContext {
    baseURL: string
    databasePath: string
  }
}

let server: BuiltServer | undefined

export async function setup(project: TestProject) {
  server = await startBuiltServer({
    prefix: 'gillwatt-test-',
    sessionPassword: 'test-only-session-password-0123456789abcdef',
    env: {
      // Links in mail and summary links keep nuxt.config's http://localhost:3000, which the tests expect.
      NUXT_PUBLIC_APP_URL: undefined,
      // The tests sign up hundreds of people from one address: the per-address throttles get room
      // (tests/server/throttle.test.ts checks them on a server of its own), and X-Forwarded-For is
      // trusted so a test can stand for several client addresses.
      NUXT_TRUST_PROXY: 'true',
      NUXT_THROTTLE_ADDRESS_FACTOR: '1000',
      // Property tests (hostile-engine, hostile-uploads, fast-check) make hundreds of calls as one
      // person; the per-person limits themselves are tested on servers of their own
      // (engine-pool.test.ts, rate-limits.test.ts).
      NUXT_RATE_LIMITS: JSON.stringify({
        'engine-sweep': { limit: 100_000 },
        'engine-sensitivity': { limit: 100_000 },
        'engine-assess': { limit: 100_000 },
        uploads: { limit: 100_000 },
        invitations: { limit: 100_000 },
        comments: { limit: 100_000 },
      }),
    },
  })
  project.provide('baseURL', server.baseURL)
  project.provide('databasePath', server.databasePath)
}

export async function teardown() {
  await server?.close()
}
