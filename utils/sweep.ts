// The design sweep's ranges and grid, and the messages of its Web Worker (the best acceptable point is the engine's bestPoint).
import type { SweepPoint } from '#shared/engine/sweep'
import type { AssessInput, SweepGrid } from '#shared/schemas/assess'

/** Most points one sweep may hold (the server's SweepGridSchema says the same). */
export const MAX_SWEEP_POINTS = 400

/** Most values along one axis (SweepGridSchema). */
export const MAX_AXIS_VALUES = 30

/** What the sweep form holds (numbers typed; units as a list such as "1, 2, 3"). */
export interface SweepRanges {
  throatFrom: number | null
  throatTo: number | null
  throatStep: number | null
  units: string
  depthFrom: number | null
  depthTo: number | null
  depthStep: number | null
}

/** Values from `from` to `to` inclusive in steps of `step`, rounded to 4 decimals; an error text when the range is unusable. */
export function rangeValues(from: number | null, to: number | null, step: number | null, what: string, min: number, max: number): number[] | string {
  if (from === null || to === null || step === null || [from, to, step].some((x) => !Number.isFinite(x))) return `${what}: give from, to and step as numbers`
  if (from < min || to > max) return `${what}: must lie between ${min} and ${max} m`
  if (to < from) return `${what}: "to" must not be below "from"`
  if (!(step > 0)) return `${what}: step must be more than 0`
  const n = Math.floor((to - from) / step + 1e-9) + 1
  if (n > MAX_AXIS_VALUES) return `${what}: ${n} values, more than the ${MAX_AXIS_VALUES} one axis may hold; take a larger step`
  const out: number[] = []
  for (let i = 0; i < n; i++) out.push(Math.round((from + i * step) * 1e4) / 1e4)
  return out.filter((v) => (what.startsWith('Throat diameter') ? v > 0 : v >= 0))
}

/** Whole numbers of units from a list like "1, 2, 4" or a span "1-4"; an error text otherwise. */
export function unitValues(text: string): number[] | string {
  const parts = text.split(/[,\s]+/).filter(Boolean)
  if (!parts.length) return 'Units: list at least one number of units, e.g. 1, 2, 3'
  const out = new Set<number>()
  for (const p of parts) {
    const span = /^(\d+)\s*[-–]\s*(\d+)$/.exec(p)
    const nums = span ? Array.from({ length: Math.max(0, Number(span[2]) - Number(span[1]) + 1) }, (_, k) => Number(span[1]) + k) : [Number(p)]
    for (const n of nums) {
      if (!Number.isInteger(n) || n < 1 || n > 50) return `Units: "${p}" is not a whole number from 1 to 50`
      out.add(n)
    }
  }
  if (out.size > MAX_AXIS_VALUES) return `Units: at most ${MAX_AXIS_VALUES} values`
  return [...out].sort((a, b) => a - b)
}

/** The grid the ranges describe, its size, and every problem found (the 400-point cap among them). */
export function gridFromRanges(r: SweepRanges): { grid: SweepGrid | null; count: number; errors: string[] } {
  const throat = rangeValues(r.throatFrom, r.throatTo, r.throatStep, 'Throat diameter', 0.01, 10)
  const units = unitValues(r.units)
  const depth = rangeValues(r.depthFrom, r.depthTo, r.depthStep, 'Throat submergence', 0, 30)
  const errors = [throat, units, depth].filter((x): x is string => typeof x === 'string')
  const len = (x: number[] | string) => (typeof x === 'string' ? 0 : x.length)
  const count = len(throat) * len(units) * len(depth)
  if (!errors.length && count > MAX_SWEEP_POINTS) {
    errors.push(`${count} points is more than the ${MAX_SWEEP_POINTS} a sweep may hold: take larger steps or fewer units.`)
  }
  if (errors.length || typeof throat === 'string' || typeof units === 'string' || typeof depth === 'string') return { grid: null, count, errors }
  return { grid: { throatDiameters_m: throat, units, throatDepths_m: depth }, count, errors }
}

/** Starting ranges around an option's design. */
export function rangesAround(d: { throatDiameter_m: number; units: number; throatDepth_m: number }): SweepRanges {
  const r2 = (x: number) => Math.round(x * 100) / 100
  const step = Math.max(0.05, r2(d.throatDiameter_m * 0.1))
  return {
    throatFrom: r2(Math.max(step, d.throatDiameter_m - 3 * step)), throatTo: r2(d.throatDiameter_m + 3 * step), throatStep: step,
    units: Array.from({ length: 4 }, (_, k) => Math.max(1, d.units - 1) + k).join(', '),
    depthFrom: r2(Math.max(0, d.throatDepth_m - 1)), depthTo: r2(d.throatDepth_m + 1), depthStep: 0.5,
  }
}

/** Messages between the page and workers/sweep.worker.ts. */
export type SweepWorkerRequest = { input: AssessInput; grid: SweepGrid }

export type SweepWorkerMessage =
  | { type: 'progress'; done: number; total: number }
  | { type: 'done'; points: SweepPoint[] }
  | { type: 'error'; message: string }
