import { readFileSync } from 'node:fs'
import { beforeAll, describe, expect, it } from 'vitest'
import type { Client } from './client'
import { signUp } from './client'

// docs/api.md shows a complete request and response for each engine route; the running server
// must give exactly the documented answer (same engine version, deterministic engine).
let client: Client
beforeAll(async () => {
  client = (await signUp('examples')).client
})

/** The JSON block between `<!-- example NAME KIND -->` and its closing marker in docs/api.md. */
function documented(name: string, kind: 'request' | 'response'): unknown {
  const doc = readFileSync('docs/api.md', 'utf8')
  const open = `<!-- example ${name} ${kind} -->`
  const start = doc.indexOf(open)
  const end = doc.indexOf(`<!-- /example ${name} ${kind} -->`)
  expect(start, `${open} in docs/api.md`).toBeGreaterThan(-1)
  const block = doc.slice(start + open.length, end).trim().replace(/^```json\n/, '').replace(/\n```$/, '')
  return JSON.parse(block)
}

describe('documented engine examples', () => {
  for (const name of ['assess', 'sweep', 'sensitivity']) {
    it(`POST /api/engine/${name} answers the documented example with the documented result`, async () => {
      const request = documented(name, 'request')
      expect(request).toEqual(JSON.parse(readFileSync(`docs/examples/${name}.request.json`, 'utf8')))
      const res = await client.post(`/api/engine/${name}`, request)
      expect(res.status).toBe(200)
      expect(res.body).toEqual(documented(name, 'response'))
    })
  }
})
