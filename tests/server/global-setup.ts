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
    // Links in mail and summary links keep nuxt.config's http://localhost:3000, which the tests expect.
    env: { NUXT_PUBLIC_APP_URL: undefined },
  })
  project.provide('baseURL', server.baseURL)
  project.provide('databasePath', server.databasePath)
}

export async function teardown() {
  await server?.close()
}
