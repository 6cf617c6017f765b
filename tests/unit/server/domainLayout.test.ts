import { readdirSync, readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'

// The folder rules of DEVELOPERS.md, checked: server/domain holds plain functions that never lean on
// Nitro's auto-imports (so the seed and the benchmarks can run them), the request glue (handlers,
// server/utils, middleware, plugins) leaves every query to server/domain, db/ reaches into server/
// only through server/domain, and the engine worker imports only pure code.

const ROOT = process.cwd()
const walk = (dir: string): string[] => readdirSync(dir, { withFileTypes: true }).flatMap((d) => (d.isDirectory() ? walk(join(dir, d.name)) : d.name.endsWith('.ts') ? [join(dir, d.name)] : []))
const code = (file: string) => readFileSync(file, 'utf8').replace(/\/\/.*$|\/\*[\s\S]*?\*\//gm, '')
const importsOf = (file: string) => [...code(file).matchAll(/\bfrom\s+'([^']+)'/g)].map((m) => m[1]!)

/** Every name server/utils exports: Nitro auto-imports them into all server code. */
const utilsNames = walk(join(ROOT, 'server/utils')).flatMap((f) => [...code(f).matchAll(/export\s+(?:async\s+)?(?:function\*?|const|class)\s+(\w+)/g)].map((m) => m[1]!))
/** Nitro and h3 globals a route may use and a domain function must not. */
const NITRO_GLOBALS = ['useRuntimeConfig', 'useStorage', 'useNitroApp', 'createError', 'defineEventHandler', 'setResponseStatus', 'setResponseHeader', 'setResponseHeaders', 'getRequestIP', 'getUserSession', 'hashPassword', 'verifyPassword', 'sendStream']

describe('server/domain', () => {
  const files = walk(join(ROOT, 'server/domain'))

  it('exists and holds the operations', () => {
    expect(files.map((f) => relative(ROOT, f))).toEqual(expect.arrayContaining(['server/domain/sites.ts', 'server/domain/errors.ts', 'server/domain/review.ts']))
  })

  it('uses no Nitro auto-import: everything it uses is imported or its own', () => {
    const globals = [...new Set([...utilsNames, ...NITRO_GLOBALS])]
    const offenders = files.flatMap((f) => {
      const text = code(f)
      return globals
        .filter((name) => new RegExp(`(?<![.\\w])${name}\\s*[(<]`).test(text))
        .filter((name) => !new RegExp(`(import\\s+(type\\s+)?\\{[^}]*\\b${name}\\b[^}]*\\}\\s+from)|(function\\*?\\s+${name}\\b)|(const\\s+${name}\\b)`).test(text))
        .map((name) => `${relative(ROOT, f)}: ${name}`)
    })
    expect(offenders).toEqual([])
  })

  it('imports nothing from server/utils, server/api or the app', () => {
    const offenders = files.flatMap((f) => importsOf(f).filter((p) => /(^|\/)(utils|api|plugins|middleware)\//.test(p) && !p.includes('shared/utils')).map((p) => `${relative(ROOT, f)}: ${p}`))
    expect(offenders).toEqual([])
  })
})

describe('request glue', () => {
  /** A Kysely query built or run in place: a query builder, raw SQL, or a transaction. */
  const QUERY = /\.(selectFrom|insertInto|replaceInto|updateTable|deleteFrom|mergeInto|selectNoFrom|transaction)\s*\(|\bsql\s*`/

  it('handlers, server/utils, middleware and plugins build no query: they call server/domain', () => {
    const files = ['server/api', 'server/utils', 'server/middleware', 'server/plugins'].flatMap((d) => walk(join(ROOT, d)))
    expect(files.length).toBeGreaterThan(50)
    expect(files.filter((f) => QUERY.test(code(f))).map((f) => relative(ROOT, f))).toEqual([])
  })
})

describe('db/', () => {
  it('reaches into server/ only through server/domain', () => {
    const offenders = walk(join(ROOT, 'db')).flatMap((f) => importsOf(f).filter((p) => p.includes('server/') && !p.includes('server/domain/')).map((p) => `${relative(ROOT, f)}: ${p}`))
    expect(offenders).toEqual([])
  })
})

describe('the engine worker', () => {
  it('imports only pure code: shared/, zod and the validator', () => {
    const allowed = (p: string) => p.includes('/shared/') || p === 'zod' || p.endsWith('server/utils/validate')
    expect(importsOf(join(ROOT, 'workers/engine.worker.ts')).filter((p) => !allowed(p))).toEqual([])
  })
})
