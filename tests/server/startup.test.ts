import { spawnSync } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'

describe('production start-up', () => {
  it('refuses to start without a session password of at least 32 characters', () => {
    const dir = mkdtempSync(join(tmpdir(), 'gillwatt-nosecret-'))
    try {
      for (const password of [undefined, 'too-short']) {
        const env: NodeJS.ProcessEnv = { ...process.env, NODE_ENV: 'production', PORT: '0', DATABASE_PATH: join(dir, 'db.sqlite') }
        delete env.NUXT_SESSION_PASSWORD
        if (password) env.NUXT_SESSION_PASSWORD = password
        const run = spawnSync(process.execPath, ['.output/server/index.mjs'], { env, encoding: 'utf8', timeout: 20_000 })
        expect(run.status, `password ${password}`).toBe(1)
        expect(run.stderr).toContain('NUXT_SESSION_PASSWORD must be set')
      }
    } finally {
      rmSync(dir, { recursive: true, force: true })
    }
  })
})
