import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

// Two projects: `unit` runs pure code (engine, schemas, helpers) in node;
// `server` talks HTTP to one built Gillwatt server on a fresh temporary SQLite file.
export default defineConfig({
  test: {
    reporters: ['default', 'json'],
    outputFile: { json: '.reports/vitest.json' },
    projects: [
      {
        // App and route code import shared/ as `#shared/...` (Nuxt's alias) and the root as `~~/`; UI unit tests need both too.
        resolve: { alias: { '#shared': fileURLToPath(new URL('./shared', import.meta.url)), '~~': fileURLToPath(new URL('.', import.meta.url)) } },
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        test: {
          name: 'server',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/server/global-setup.ts'],
          testTimeout: 30_000,
          hookTimeout: 60_000,
          fileParallelism: false,
        },
      },
    ],
  },
})
