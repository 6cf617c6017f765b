// Engine benchmark: one `assess` over a 100-year daily record (36,525 days) with the month table,
// against a bare loop computing ρ·g·Q·H·η over the same record in the same run, the FDC of that
// record alone, and the Monte Carlo: 1,000 draws over the first 30 years of it, on this one thread.
// The engine is bundled first as the server's engine worker is (scripts/bench/engineEntry.ts).
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { pathToFileURL } from 'node:url'
import { bundleNodeWorker } from '../../build/nodeWorker'
import type { AssessInputDraft } from '../../shared/schemas/assess'
import { type BenchFigure, median, percentile, timeRuns } from './harness'

const DAYS = 36_525
const RUNS = 40

/** An invented, deterministic century of daily flows: a seasonal curve times a slow random walk. */
export function century(): { date: string; flow: number | null }[] {
  const out: { date: string; flow: number | null }[] = []
  const start = Date.UTC(1925, 0, 1)
  let walk = 1
  let state = 20251202
  for (let i = 0; i < DAYS; i++) {
    state = (state * 48271) % 2147483647
    walk = Math.min(3, Math.max(0.3, walk * (0.97 + 0.06 * (state / 2147483647))))
    const d = new Date(start + i * 86_400_000)
    const season = 1 + 0.7 * Math.cos(((d.getUTCMonth() + 0.5) / 12) * 2 * Math.PI)
    out.push({ date: d.toISOString().slice(0, 10), flow: i % 997 === 0 ? null : 4.5 * season * walk })
  }
  return out
}

const TEMPS = [4, 5, 7, 9, 12, 15, 17, 17, 14, 11, 7, 5]
const O2 = [12, 11.8, 11.2, 10.6, 9.8, 8.8, 8.0, 7.9, 8.6, 9.6, 10.8, 11.6]

type Engine = typeof import('./engineEntry')

/** The engine as the worker ships it: scripts/bench/engineEntry.ts bundled by build/nodeWorker.ts, then loaded. */
async function shippedEngine(): Promise<Engine> {
  const dir = mkdtempSync(join(tmpdir(), 'gillwatt-bench-'))
  try {
    const file = join(dir, 'engine.mjs')
    writeFileSync(file, (await bundleNodeWorker(new URL('./engineEntry.ts', import.meta.url).pathname)).code)
    return (await import(pathToFileURL(file).href)) as Engine
  } finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

export async function engineBench(): Promise<BenchFigure[]> {
  const { assess, fdcFromRecord, monteCarlo, AssessInputSchema } = await shippedEngine()
  const days = century()
  const draft: AssessInputDraft = {
    site: { altitude_m: 120, grossHead_m: 2.2, months: TEMPS.map((t, i) => ({ temperature_C: t, upstreamOxygen_mgL: O2[i]! })) },
    hydrology: { kind: 'record', days },
    option: { units: 2, throatDiameter_m: 0.6, outletDiameter_m: 1.2, throatDepth_m: 1.5, air: { pipeDiameter_m: 0.5, pipeLength_m: 10 } },
  }
  const input = AssessInputSchema.parse(draft)

  let sink = 0
  const assessMs = timeRuns(RUNS, () => {
    const r = assess(input)
    sink += r.summary.annualEnergy_MWh + r.months.length
  })
  const rho = 998.2
  const g = 9.80665
  const loopMs = timeRuns(RUNS, () => {
    let e = 0
    for (const d of input.hydrology.kind === 'record' ? input.hydrology.days : []) {
      if (d.flow !== null) e += rho * g * d.flow * 2.2 * 0.25 * 24
    }
    sink += e
  })
  const fdcMs = timeRuns(RUNS, () => {
    sink += fdcFromRecord(days).meanFlow
  })
  // 30 years of the century (10,958 days), 1,000 draws from one seed: three runs, the same draws each time
  const thirty = AssessInputSchema.parse({ ...draft, hydrology: { kind: 'record', days: days.slice(0, 10_958) } })
  const drawsMs = timeRuns(3, () => {
    sink += monteCarlo(thirty, 1000, 1)?.energy_MWh.p50 ?? 0
  })
  if (!Number.isFinite(sink)) throw new Error('benchmark produced a non-finite figure')
  const ratio = median(assessMs) / median(loopMs)
  return [
    { name: 'assess, 36,525-day record with month table: median', value: median(assessMs), unit: 'ms', target: '< 25 ms', pass: median(assessMs) < 25 },
    { name: 'assess, same: 95th percentile', value: percentile(assessMs, 95), unit: 'ms', target: '(reported)', pass: true },
    { name: 'bare ρ·g·Q·H·η loop over the same record: median', value: median(loopMs), unit: 'ms', target: '(baseline)', pass: true },
    { name: 'assess ÷ bare loop', value: ratio, unit: '×', target: '≤ 20×', pass: ratio <= 20 },
    { name: 'FDC from a 36,525-day record with gaps (rank and mean): median', value: median(fdcMs), unit: 'ms', target: '< 10 ms', pass: median(fdcMs) < 10 },
    { name: 'Monte Carlo, 1,000 draws over a 30-year daily record, one thread: median of 3', value: median(drawsMs), unit: 'ms', target: '< 3000 ms', pass: median(drawsMs) < 3000 },
  ]
}
