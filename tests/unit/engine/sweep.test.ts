import { describe, expect, it } from 'vitest'
import { assess } from '../../../shared/engine/assess'
import { sensitivity } from '../../../shared/engine/sensitivity'
import { sweep, withDesign } from '../../../shared/engine/sweep'
import { SweepGridSchema } from '../../../shared/schemas/assess'
import { draft, numbersIn, parse } from './fixtures'

describe('sweep', () => {
  // a submerged sluice gate aerates little (Butts & Evans b = 0.05), so the units can add oxygen
  const d0 = draft()
  d0.site = { ...d0.site, weirShape: 'sluice-gate-submerged' }
  const input = parse(d0)
  const grid = SweepGridSchema.parse({ throatDiameters_m: [0.4, 0.6, 0.8], units: [1, 2], throatDepths_m: [0.5, 1.5, 4] })
  const r = sweep(input, grid)
  it('runs every grid point', () => {
    expect(r.points).toHaveLength(3 * 2 * 3)
    const keys = new Set(r.points.map((p) => `${p.throatDiameter_m}/${p.units}/${p.throatDepth_m}`))
    expect(keys.size).toBe(18)
  })
  it('each point equals a direct assessment of that design', () => {
    const p = r.points[7]
    expect(p).toBeDefined()
    if (!p) return
    const direct = assess(withDesign(input, p.throatDiameter_m, p.units, p.throatDepth_m)).summary
    expect(p.annualEnergy_MWh).toBe(direct.annualEnergy_MWh)
    // the outlet keeps the area ratio of the option
    expect(p.outletDiameter_m / p.throatDiameter_m).toBeCloseTo(1.2 / 0.6, 12)
  })
  it('picks the most energy among points with every safety flag and the river caution clear', () => {
    const clear = r.points.filter((p) => p.acceptable && p.annualEnergy_MWh > 0)
    expect(clear.length).toBeGreaterThan(0)
    expect(r.best).not.toBeNull()
    const max = Math.max(...clear.map((p) => p.annualEnergy_MWh))
    expect(r.best?.annualEnergy_MWh).toBe(max)
    expect(r.best?.raisedFlags).not.toContain('cavitation')
    expect(r.best?.raisedFlags).not.toContain('gas-supersaturation')
    expect(r.best?.raisedFlags).not.toContain('net-oxygen-loss')
  })
  it('gives no best option when every point costs the river too much oxygen, and says why', () => {
    // a sharp-crested weir with a 2 m fall aerates well; shallow throats lose that aeration
    const shallow = SweepGridSchema.parse({ throatDiameters_m: [0.4, 0.6, 0.8], units: [1, 2], throatDepths_m: [0.5, 1.5] })
    const none = sweep(parse(draft()), shallow)
    expect(none.points.every((p) => p.raisedFlags.includes('net-oxygen-loss'))).toBe(true)
    expect(none.best).toBeNull()
    expect(none.reason).toMatch(/None of the 12 options qualifies: 12 cost the river more oxygen than is acceptable/)
  })
  it('finds an acceptable best at the same weir where one exists (a deep throat: bubbles held longer under pressure)', () => {
    const some = sweep(parse(draft()), grid)
    expect(some.best).not.toBeNull()
    expect(some.best?.acceptable).toBe(true)
    expect(some.best?.throatDepth_m).toBe(4)
    expect(some.reason).toMatch(/cost the river no more oxygen than is acceptable/)
  })
  it('the deepest throat never makes more energy than the shallowest', () => {
    // more submergence → less suction (Bernoulli), and less useful compression: energy falls
    for (const dt of grid.throatDiameters_m) {
      for (const n of grid.units) {
        const at = (d: number): number => r.points.find((p) => p.throatDiameter_m === dt && p.units === n && p.throatDepth_m === d)?.annualEnergy_MWh ?? Number.NaN
        expect(at(4)).toBeLessThanOrEqual(at(0.5))
      }
    }
  })
  it('refuses a grid past 400 points', () => {
    const big = { throatDiameters_m: Array.from({ length: 10 }, (_, i) => 0.2 + i * 0.1), units: [1, 2, 3, 4, 5], throatDepths_m: Array.from({ length: 9 }, (_, i) => i * 0.5) }
    expect(SweepGridSchema.safeParse(big).success).toBe(false)
  })
})

describe('sensitivity', () => {
  const input = parse(draft())
  const s = sensitivity(input, 0.2)
  it('moves each key input by ±20 % and sorts by energy swing', () => {
    expect(s.fraction).toBe(0.2)
    expect(s.items.length).toBeGreaterThanOrEqual(7)
    for (let i = 1; i < s.items.length; i++) expect(s.items[i - 1]?.energySwing_MWh).toBeGreaterThanOrEqual(s.items[i]?.energySwing_MWh ?? 0)
    const head = s.items.find((x) => x.key === 'grossHead')
    expect(head?.low.value).toBeCloseTo(1.6, 12)
    expect(head?.high.value).toBeCloseTo(2.4, 12)
    // more head → more energy
    expect(head?.high.annualEnergy_MWh).toBeGreaterThan(head?.low.annualEnergy_MWh ?? Infinity)
    expect(numbersIn(s).every(([, x]) => Number.isFinite(x))).toBe(true)
  })
  it('keeps efficiencies at or below 1', () => {
    const d = draft()
    d.option = { ...d.option, turbine: { efficiency: 0.95 } }
    const t = sensitivity(parse(d)).items.find((x) => x.key === 'turbineEfficiency')
    expect(t?.high.value).toBe(1)
  })
  it('includes the inputs the Monte Carlo draws: bubble size moves oxygen, capital cost and export price move only the NPV', () => {
    const by = (k: string) => s.items.find((x) => x.key === k)!
    expect(by('bubbleDiameter').low.value).toBeCloseTo(0.0024, 12)
    // smaller bubbles carry more interface per volume of air: more oxygen transferred (McGinnis & Little 2002)
    expect(by('bubbleDiameter').low.netOxygenGain_mgL).toBeGreaterThan(by('bubbleDiameter').high.netOxygenGain_mgL)
    expect(by('bubbleDiameter').energySwing_MWh).toBe(0)
    for (const k of ['capex', 'exportPrice']) {
      expect(by(k).energySwing_MWh, k).toBe(0)
      expect(by(k).oxygenSwing_mgL, k).toBe(0)
      expect(by(k).npvSwing, k).toBeGreaterThan(0)
    }
    // NPV = −capex + (E·price − opex)·annuity: a dearer scheme is worth less, a dearer price more (discounted cash flow)
    expect(by('capex').high.npv).toBeLessThan(by('capex').low.npv)
    expect(by('exportPrice').high.npv).toBeGreaterThan(by('exportPrice').low.npv)
    expect(s.base.npv).toBe(assess(input, { compareModes: false }).money.npv)
  })
  it('keeps a bubble diameter within the bubble model\'s 1–6 mm', () => {
    const d = draft()
    d.settings = { bubbleDiameter_m: 0.0055 }
    expect(sensitivity(parse(d), 0.5).items.find((x) => x.key === 'bubbleDiameter')?.high.value).toBe(0.006)
  })
  it('a better turbine only changes energy, not oxygen', () => {
    const t = s.items.find((x) => x.key === 'turbineEfficiency')
    expect(t?.oxygenSwing_mgL).toBeCloseTo(0, 12)
    expect(t?.energySwing_MWh).toBeGreaterThan(0)
  })
})
