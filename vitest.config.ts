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
        // App code imports shared/ as `~~/shared/...` (Nuxt externalises shared/ by that path); UI unit tests need the alias too.
        resolve: { alias: { '~~': fileURLToPath(new URL('.', import.meta.url)) } },
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
