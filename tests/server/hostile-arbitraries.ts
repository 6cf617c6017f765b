import fc from 'fast-check'
import { expect } from 'vitest'
import type { ZodType } from 'zod'
import type { Reply } from './client'
import { testDb } from './review-helpers'

// Shared pieces of the hostile-input tests (tests/server/hostile-*.test.ts): values of the wrong
// type, at the edges of numbers, huge and deeply nested; request bodies built from a route's real
// keys; query strings with repeated, unknown and out-of-range keys; and the checks every answer
// must pass (never 5xx, always a message, a refused input names its field).

/** About 100 kB of text. */
export const HUGE_TEXT = 'x'.repeat(100_000)

/** A value nested `depth` arrays deep. */
export const nested = (depth: number): unknown => {
  let v: unknown = 1
  for (let i = 0; i < depth; i++) v = [v]
  return v
}

/** Numbers at the edges: zero, minus zero, the smallest and largest doubles, past the safe integers. */
export const boundaryNumber = fc.constantFrom(0, -0, -1, 1, 0.5, 1e308, -1e308, Number.MIN_VALUE, Number.MAX_SAFE_INTEGER, 2 ** 53 + 2, 2 ** 31, -(2 ** 31), 1e21)

/** Text that looks like a number, or is empty, long, or markup (short enough for a query string). */
export const queryText = fc.constantFrom('NaN', 'Infinity', '-Infinity', '1e999', '-1e999', '', ' ', '0', '-0', '-1', '1.5', '0x10', '1e3', '9007199254740993', '1e308', 'null', 'true', '[]', '{}', '<b>x</b>', 'y'.repeat(4000))

/** Text that looks like a number, or is empty, huge (100 kB), or markup. */
export const numberishText = fc.constantFrom('NaN', 'Infinity', '-Infinity', '1e999', '-1e999', '', ' ', '0', '-0', '-1', '1.5', '0x10', '1e3', '9007199254740993', '1e308', 'null', 'true', '[]', '{}', '<b>x</b>', HUGE_TEXT)

/** One scalar of any kind that a JSON body can carry. */
export const hostileScalar = fc.oneof(boundaryNumber, numberishText, fc.constant(null), fc.boolean(), fc.string({ maxLength: 40 }), fc.integer())

/** Anything a JSON body can carry in one field: scalars, arrays, objects, deep nesting. */
export const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: hostileScalar },
  { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
  { weight: 1, arbitrary: fc.array(hostileScalar, { maxLength: 6 }) },
  { weight: 1, arbitrary: fc.dictionary(fc.string({ maxLength: 8 }), hostileScalar, { maxKeys: 4 }) },
  { weight: 1, arbitrary: fc.constantFrom(nested(64), nested(2000), { a: nested(500) }) },
)

/** Bodies over a route's real keys (`good` is a valid body): any of the keys holding anything, one key of a good body replaced, or any JSON at all. */
export function bodiesFor(good: Record<string, unknown>): fc.Arbitrary<unknown> {
  const keys = Object.keys(good)
  return fc.oneof(
    fc.record(Object.fromEntries(keys.map((k) => [k, hostileValue])), { requiredKeys: [] }),
    fc.tuple(fc.constantFrom(...keys), hostileValue).map(([k, v]) => ({ ...good, [k]: v })),
    fc.tuple(fc.subarray(keys), fc.constantFrom(...keys), hostileValue).map(([drop, k, v]) => ({ ...Object.fromEntries(Object.entries(good).filter(([x]) => !drop.includes(x))), [k]: v })),
    fc.jsonValue({ maxDepth: 4 }),
    fc.constantFrom(null, [], '', 'text', 0, [good], { ...good, extra: HUGE_TEXT }),
  )
}

/** What the server's validator sees of a JSON body: the body after JSON (-0 is 0), null read as {}. */
const asValidated = (body: unknown) => (JSON.parse(JSON.stringify(body) ?? 'null') as unknown) ?? {}

/** True when the route's own schema refuses `body`. */
export const refuses = (schema: ZodType, body: unknown) => !schema.safeParse(asValidated(body)).success

/** Only the bodies the route's schema refuses: sending them must change nothing. */
export const refusedBodies = (schema: ZodType, arb: fc.Arbitrary<unknown>) => arb.filter((b) => refuses(schema, b))

/** A query: some of `keys` (and an unknown one), each once or repeated, holding text of every kind. */
export function queriesFor(keys: string[], values: fc.Arbitrary<string> = fc.oneof(queryText, fc.string({ maxLength: 30 }))) {
  return fc
    .array(fc.tuple(fc.constantFrom(...keys, 'unknown', 'sort[]'), values), { maxLength: 6 })
    .map((pairs) => {
      const query: Record<string, string | string[]> = {}
      for (const [k, v] of pairs) {
        const had = query[k]
        query[k] = had === undefined ? v : Array.isArray(had) ? [...had, v] : [had, v]
      }
      const search = pairs.map(([k, v]) => `${encodeURIComponent(k)}=${encodeURIComponent(v)}`).join('&')
      return { query, search }
    })
}

/** Every answer: below 500, and with a string message when refused. */
export function expectSafe(res: Reply, label: string): void {
  expect(res.status, `${label} → ${res.status} ${JSON.stringify(res.body)?.slice(0, 400)}`).toBeLessThan(500)
  if (res.status >= 400) expect(typeof res.body?.message, `${label}: no message`).toBe('string')
}

/**
 * True when the body reader refuses a JSON text itself, before its schema sees it
 * (server/utils/body.ts parseJsonBody): text that is not JSON, or a `__proto__`, `constructor` or
 * `prototype` key anywhere (prototype pollution). It answers with a message naming the body.
 */
export function bodyReaderRefuses(text: string): boolean {
  try {
    JSON.parse(text)
  } catch {
    return true
  }
  return /"(?:__proto__|constructor|prototype)"\s*:/.test(text)
}

/**
 * A refused input: 400 whose message starts with the field it names (`assessmentId: …`); for a body
 * the body reader refuses (see bodyReaderRefuses) the field named is the body itself.
 */
export function expectFieldRefusal(res: Reply, label: string, body?: unknown): void {
  expectSafe(res, label)
  // A body over the route's own limit (8 kB on routes open to signed-out callers) is refused unread.
  if (res.status === 413) {
    expect(res.body.message, label).toMatch(/^body: is larger than the/)
    expect(JSON.stringify(body ?? '').length, label).toBeGreaterThan(8 * 1024)
    return
  }
  expect(res.status, `${label} → ${JSON.stringify(res.body)?.slice(0, 400)}`).toBe(400)
  if (body !== undefined && bodyReaderRefuses(JSON.stringify(body))) expect(res.body.message, label).toMatch(/^body: is not valid JSON/)
  else expect(res.body.message, label).toMatch(/^[\w.-]+: \S/)
}

/** Every row of the named tables that belong to `orgId` (or all rows, for tables without org_id), to compare before and after. */
export function orgRows(orgId: number, tables: string[]): Record<string, unknown[]> {
  const db = testDb()
  return Object.fromEntries(
    tables.map((t) => {
      const hasOrg = (db.prepare(`select count(*) as n from pragma_table_info(?) where name = 'org_id'`).get(t) as { n: number }).n > 0
      const rows = hasOrg ? db.prepare(`select * from ${t} where org_id = ? order by rowid`).all(orgId) : db.prepare(`select * from ${t} order by rowid`).all()
      return [t, rows]
    }),
  )
}

/** `label` for a failure message: the body, cut short. */
export const show = (v: unknown) => {
  const text = JSON.stringify(v) ?? String(v)
  return text.length > 300 ? `${text.slice(0, 300)}… (${text.length} chars)` : text
}
