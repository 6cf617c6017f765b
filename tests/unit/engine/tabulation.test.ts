import { describe, expect, it } from 'vitest'
import { annualEnergyFromRecord, tabulatedPower, type PowerAt } from '../../../shared/engine/energy'
import { buildScheme, powerState } from '../../../shared/engine/scheme'
import { draft, parse, TEMPS, UPSTREAM_O2 } from './fixtures'

// A long record's power is read from a per-month table (piecewise-linear interpolation in log
// flow). These checks bound what that costs in accuracy against evaluating every day exactly.

/** Ten invented years of daily flows spanning low flows to floods, deterministic. */
function tenYears(): { date: string; flow: number | null }[] {
  const out: { date: string; flow: number | null }[] = []
  let state = 7
  for (let i = 0; i < 3653; i++) {
    state = (state * 48271) % 2147483647
    const d = new Date(Date.UTC(2001, 0, 1) + i * 86_400_000)
    const season = 1 + 0.8 * Math.cos(((d.getUTCMonth() + 0.5) / 12) * 2 * Math.PI)
    out.push({ date: d.toISOString().slice(0, 10), flow: 0.4 + 6 * season * (state / 2147483647) ** 2 })
  }
  return out
}

describe('tabulated power on a long record', () => {
  const input = parse(draft())
  const scheme = buildScheme(input, 0.9, { month: 0, tC: 10, upstreamO2_mgL: 10 })
  const months = TEMPS.map((t, i) => ({ month: i + 1, tC: t, upstreamO2_mgL: UPSTREAM_O2[i]! }))
  const sample = (q: number, m: number) => {
    const p = powerState(scheme, q, months[m - 1]!)
    return { power: p.electricalPower_W, state: (p.unitsRunning * 3 + ['stopped', 'spilling', 'taking-all'].indexOf(p.regime)) * 8 + ['stopped', 'no-suction', 'below-cut-in', 'running', 'at-rating'].indexOf(p.turbineState) }
  }
  const exact: PowerAt = (q, m) => sample(q, m).power
  const days = tenYears()
  const flows = days.map((d) => d.flow!).sort((a, b) => a - b)
  const opts = { rating_W: scheme.ratedPerUnit_W * input.option.units, availability: 0.95 }

  it('gives annual energy within 0.5 % of evaluating every day exactly, and each month within 1 %', () => {
    // Numerical tolerance chosen for screening, common practice, no source.
    const reference = annualEnergyFromRecord(days, exact, opts)
    const tabulated = annualEnergyFromRecord(days, tabulatedPower(sample, flows[0]!, flows.at(-1)!), { ...opts, memoise: false })
    expect(reference.annualEnergy_MWh).toBeGreaterThan(0)
    expect(Math.abs(tabulated.annualEnergy_MWh / reference.annualEnergy_MWh - 1)).toBeLessThan(0.005)
    reference.energyByMonth_MWh.forEach((e, m) => {
      const t = tabulated.energyByMonth_MWh[m]!
      if (e! > 0.01 * reference.annualEnergy_MWh) expect(Math.abs(t / e! - 1), `month ${m + 1}`).toBeLessThan(0.01)
    })
  })

  it('is exact at the table nodes and at the ends, and builds each month\'s table once', () => {
    let calls = 0
    const counted = (q: number, m: number) => {
      calls++
      return sample(q, m)
    }
    const table = tabulatedPower(counted, 1, 100, 3)
    expect(table(10, 7)).toBeCloseTo(exact(10, 7), 9) // the middle node, 10 = √(1·100)
    expect(table(1, 7)).toBe(exact(1, 7))
    expect(table(0, 7)).toBe(exact(0, 7))
    const before = calls
    table(20, 7)
    table(30, 7)
    expect(calls - before).toBe(0)
  })
})
