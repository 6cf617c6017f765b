// Invented demo site for engine tests (illustrative numbers, no real place).
import { expect } from 'vitest'
import { EngineInputError } from '../../../shared/engine/errors'
import type { DailyFlow } from '../../../shared/engine/hydrology'
import { AssessInputSchema, type AssessInput, type AssessInputDraft } from '../../../shared/schemas/assess'

export const TEMPS = [4, 5, 7, 9, 12, 15, 17, 17, 14, 11, 7, 5]
export const UPSTREAM_O2 = [12, 11.8, 11.2, 10.6, 9.8, 8.8, 8.0, 7.9, 8.6, 9.6, 10.8, 11.6]

/** A plausible low-head site with two venturi units, overridable piecewise. */
export function draft(): AssessInputDraft {
  return {
    site: {
      altitude_m: 120,
      grossHead_m: 2,
      months: TEMPS.map((t, i) => ({ temperature_C: t, upstreamOxygen_mgL: UPSTREAM_O2[i] ?? 9 })),
    },
    hydrology: {
      kind: 'fdc',
      points: [{ exceedance: 1, flow: 40 }, { exceedance: 10, flow: 14 }, { exceedance: 50, flow: 4 }, { exceedance: 95, flow: 0.9 }, { exceedance: 99, flow: 0.5 }],
    },
    option: { units: 2, throatDiameter_m: 0.6, outletDiameter_m: 1.2, throatDepth_m: 1.5, air: { pipeDiameter_m: 0.5, pipeLength_m: 10 } },
  }
}

/** Parse a draft with defaults filled. */
export function parse(d: AssessInputDraft): AssessInput {
  return AssessInputSchema.parse(d)
}

/** Consecutive days from 2001-01-01 with flows from a function of the month (1–12). */
export function yearOfDays(flowOfMonth: (month: number) => number | null): Array<{ date: string, flow: number | null }> {
  const out: Array<{ date: string, flow: number | null }> = []
  const start = Date.UTC(2001, 0, 1)
  for (let i = 0; i < 365; i++) {
    const d = new Date(start + i * 86400000)
    out.push({ date: d.toISOString().slice(0, 10), flow: flowOfMonth(d.getUTCMonth() + 1) })
  }
  return out
}

/** Every number inside a value, with its path. */
export function numbersIn(v: unknown, path = '$'): Array<[string, number]> {
  if (typeof v === 'number') return [[path, v]]
  if (Array.isArray(v)) return v.flatMap((x, i) => numbersIn(x, `${path}[${i}]`))
  if (v !== null && typeof v === 'object') return Object.entries(v).flatMap(([k, x]) => numbersIn(x, `${path}.${k}`))
  return []
}

/** Consecutive days from a start date (UTC), one per flow. */
export function record(start: string, flows: readonly (number | null)[]): DailyFlow[] {
  const t0 = Date.parse(`${start}T00:00:00Z`)
  return flows.map((flow, i) => ({ date: new Date(t0 + i * 86_400_000).toISOString().slice(0, 10), flow }))
}

/** Expect `fn` to throw an EngineInputError on `field`. */
export function expectInputError(fn: () => unknown, field: string): void {
  try {
    fn()
  } catch (e) {
    expect(e).toBeInstanceOf(EngineInputError)
    expect((e as EngineInputError).field).toBe(field)
    return
  }
  throw new Error(`expected an EngineInputError on ${field}`)
}

/** `$.a.b[2].c` → ['a', 'b', 2, 'c']. */
export const keysOf = (path: string): (string | number)[] =>
  path.replace(/^\$\.?/, '').split(/\.|\[(\d+)\]/).filter((k) => k !== undefined && k !== '').map((k) => (/^\d+$/.test(k) ? Number(k) : k))

/** The field name as the schema and the API print it: `option.air.pipeDiameter_m`, `hydrology.points.2.flow`. */
export const fieldOf = (path: string) => keysOf(path).join('.')

/** A deep copy of `value` with the number at `path` (as `numbersIn` names it) set to `to`. */
export function setAt<T>(value: T, path: string, to: unknown): T {
  const copy = structuredClone(value) as Record<string | number, unknown>
  const keys = keysOf(path)
  let at = copy
  for (const k of keys.slice(0, -1)) at = at[k] as Record<string | number, unknown>
  at[keys.at(-1)!] = to
  return copy as T
}
