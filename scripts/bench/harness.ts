import { cpus, totalmem } from 'node:os'
import { performance } from 'node:perf_hooks'

export interface BenchFigure {
  name: string
  value: number
  unit: string
  target: string
  pass: boolean
  /** Shown instead of `value` with its unit, for figures that are a word (e.g. "no"). */
  display?: string
}

/** Milliseconds of each of `runs` calls, after a few warm-up calls. */
export function timeRuns(runs: number, fn: () => void): number[] {
  for (let i = 0; i < Math.min(5, runs); i++) fn()
  const out: number[] = []
  for (let i = 0; i < runs; i++) {
    const t = performance.now()
    fn()
    out.push(performance.now() - t)
  }
  return out
}

/** Milliseconds of each of `runs` awaited calls, after `warmUp` calls. */
export async function timeAsync(runs: number, fn: () => Promise<unknown>, warmUp = 5): Promise<number[]> {
  for (let i = 0; i < warmUp; i++) await fn()
  const out: number[] = []
  for (let i = 0; i < runs; i++) {
    const t = performance.now()
    await fn()
    out.push(performance.now() - t)
  }
  return out
}

export const percentile = (xs: number[], p: number): number => {
  const s = [...xs].sort((a, b) => a - b)
  return s[Math.min(s.length - 1, Math.max(0, Math.ceil((p / 100) * s.length) - 1))]!
}
export const median = (xs: number[]): number => percentile(xs, 50)

/** One line naming this machine, for the benchmark record. */
export function machine(): string {
  const c = cpus()
  return `${c[0]?.model.trim() ?? 'unknown CPU'}, ${c.length} cores, ${(totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.version}, ${process.platform}`
}
