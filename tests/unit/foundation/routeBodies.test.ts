import { readdirSync, readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'

// Every route reads its body through the limited readers (server/utils/body.ts for JSON,
// server/utils/uploads.ts for files), never through h3's unbounded ones, so no route can be made to
// hold a body of any size; and no middleware reads bodies before a route has checked its caller.

const SERVER = join(process.cwd(), 'server')
const walk = (dir: string): string[] => readdirSync(dir, { withFileTypes: true }).flatMap((d) => (d.isDirectory() ? walk(join(dir, d.name)) : d.name.endsWith('.ts') ? [join(dir, d.name)] : []))
const UNBOUNDED = /\b(readBody|readValidatedBody|readRawBody|readMultipartFormData|readFormData|getRequestWebStream)\s*\(/

describe('body readers', () => {
  it('no route, middleware or plugin calls an unbounded h3 body reader', () => {
    const offenders = walk(SERVER)
      .filter((f) => !f.endsWith('utils/body.ts'))
      .filter((f) => UNBOUNDED.test(readFileSync(f, 'utf8').replace(/\/\/.*$|\/\*[\s\S]*?\*\//gm, '')))
      .map((f) => relative(process.cwd(), f))
    expect(offenders).toEqual([])
  })

  it('every JSON body is read with a named limit', () => {
    const missing = walk(join(SERVER, 'api'))
      .flatMap((f) => {
        const text = readFileSync(f, 'utf8')
        return [...text.matchAll(/readValidatedJson\(([^)]*)\)|readJsonText\(([^)]*)\)/g)].filter((m) => !/BODY_LIMITS\.\w+/.test(m[0])).map(() => relative(process.cwd(), f))
      })
    expect(missing).toEqual([])
  })
})
