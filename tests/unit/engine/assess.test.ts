import { describe, expect, it } from 'vitest'
import { assess } from '../../../shared/engine/assess'
import { ENGINE_VERSION } from '../../../shared/engine/version'
import { isaPressure } from '../../../shared/engine/atmosphere'
import { unitCapacity } from '../../../shared/engine/venturi'
import { waterDensity } from '../../../shared/engine/water'
import { draft, numbersIn, parse, yearOfDays } from './fixtures'

const g = 9.80665

function expectAllFinite(v: unknown): void {
  const bad = numbersIn(v).filter(([, x]) => !Number.isFinite(x))
  expect(bad).toEqual([])
}

describe('assess: shape and bookkeeping', () => {
  const r = assess(parse(draft()))
  it('returns every part, 12 months and the engine version', () => {
    expect(r.engineVersion).toBe(ENGINE_VERSION)
    expect(r.engineVersion).toBe('0.4.0')
    expect(r.months).toHaveLength(12)
    expect(r.perFlow.length).toBeGreaterThan(10)
    expect(r.summary.flags.map((f) => f.id).sort()).toEqual(['cavitation', 'does-not-pay', 'gas-supersaturation', 'net-oxygen-loss', 'never-runs', 'oxygen-below-target', 'scheme-below-target'])
    for (const f of r.summary.flags) expect(f.reason.length).toBeGreaterThan(20)
    expectAllFinite(r)
  })
  it('lists the defaults it used with their origin', () => {
    const jet = r.defaultsUsed.find((d) => d.field === 'option.air.jetPumpEfficiency')
    expect(jet?.value).toBe(0.25)
    expect(jet?.source).toMatch(/illustrative/)
    expect(r.defaultsUsed.find((d) => d.field === 'settings.theta')?.source).toMatch(/ASCE\/EWRI 2-06/)
    const custom = assess(parse({ ...draft(), settings: { theta: 1.02 } }))
    expect(custom.defaultsUsed.find((d) => d.field === 'settings.theta')).toBeUndefined()
  })
  it('keeps continuity at every row: reserved + units + spill = river', () => {
    for (const p of r.perFlow) {
      expect(p.reservedFlow_m3s + p.unitsRunning * p.unitFlow_m3s + p.spill_m3s).toBeCloseTo(p.riverFlow_m3s, 9)
    }
  })
  it('never makes more electricity than η_ej·ρgQH, nor than the river\'s hydraulic power', () => {
    const rho = waterDensity(r.months.reduce((s, m) => s + m.temperature_C, 0) / 12)
    for (const p of r.perFlow) {
      const unitsHydraulic = rho * g * p.unitsRunning * p.unitFlow_m3s * p.workingHead_m
      expect(p.electricalPower_kW * 1000).toBeLessThanOrEqual(0.25 * unitsHydraulic + 1e-9)
      expect(p.electricalPower_kW * 1000).toBeLessThanOrEqual(rho * g * p.riverFlow_m3s * p.grossHead_m + 1e-9)
      expect(p.waterToWire).toBeLessThan(0.25)
    }
  })
  it('shows both oxygen methods and uses the chosen one in the summary (the bubble model by default)', () => {
    expect(r.methods.summaryUses).toBe('bubble-model')
    expect(r.summary.netOxygenGainSummerLowFlow_mgL).toBeCloseTo(r.methods.atSummerLowFlow.bubbleModel.netGain_mgL, 12)
    const f = assess(parse({ ...draft(), settings: { oxygenMethod: 'field-transfer' } }))
    expect(f.methods.summaryUses).toBe('field-transfer')
    expect(f.summary.netOxygenGainSummerLowFlow_mgL).toBeCloseTo(f.methods.atSummerLowFlow.fieldTransfer.netGain_mgL, 12)
    for (const m of r.months) {
      expect(m.downstreamWith_mgL).toBeCloseTo(m.downstreamBubbleModel_mgL, 12)
      expect(m.netGain_mgL).toBeCloseTo(m.downstreamWith_mgL - m.downstreamWithout_mgL, 12)
      expect(m.downstreamWithoutRange_mgL.min_mgL).toBeLessThanOrEqual(m.downstreamWithout_mgL + 1e-12)
      expect(m.downstreamWithoutRange_mgL.max_mgL).toBeGreaterThanOrEqual(m.downstreamWithout_mgL - 1e-12)
    }
    expect(r.methods.weir.model).toBe('butts-evans')
  })
  it('says plainly when the scheme leaves less oxygen than the weir alone', () => {
    const f = r.summary.flags.find((x) => x.id === 'net-oxygen-loss')
    // raised when, anywhere in the year, the loss passes the acceptable 0.1 mg/L (the default)
    expect(f?.raised).toBe(r.summary.worstNetOxygenGain_mgL < -0.1)
    expect(f?.level).toBe('river')
    if (f?.raised) {
      expect(f.reason).toMatch(/less oxygen with the scheme than without/)
      expect(f.shareOfTime).toBeGreaterThan(0)
      expect(f.worst?.value).toBeCloseTo(r.summary.worstNetOxygenGain_mgL, 12)
    }
  })
})

describe('assess: money', () => {
  it('prices civils on the design flow (units × one unit full at the gross head) and flags a scheme that does not pay', () => {
    const input = parse(draft())
    const r = assess(input)
    const o = input.option
    const geometry = { throatDiameter_m: o.throatDiameter_m, outletDiameter_m: o.outletDiameter_m, inletLoss: o.inletLoss, diffuserEfficiency: 0.88, flowCoefficient: 0.98 }
    // Design flow = n · C·A_t·√(2gH/K) (energy equation, venturi.ts), at the site's gross head.
    expect(r.money.designFlow_m3s).toBeCloseTo(o.units * unitCapacity(input.site.grossHead_m, geometry), 12)
    // Capex = fixed + per kW × rating + per m³/s × design flow (bottom-up estimate, common practice).
    const c = o.costs
    expect(r.money.capex).toBeCloseTo(c.fixedCost + c.ratedPowerPrice * r.summary.ratedPower_kW + c.civilsPerDesignFlow * r.money.designFlow_m3s, 6)
    const flag = r.summary.flags.find((f) => f.id === 'does-not-pay')!
    expect(flag.level).toBe('money')
    expect(flag.raised).toBe(!r.money.pays)
    expect(r.money.pays).toBe(r.money.npv >= 0 && r.money.annualRevenue >= r.money.annualOpex)
  })

  it('pays at an export price above break-even, and not below it', () => {
    const base = parse(draft())
    const be = assess(base).money.breakEvenPrice!
    const at = (price: number) => assess({ ...base, settings: { ...base.settings, exportPrice: price } }, { compareModes: false })
    expect(at(be * 1.01).money.pays).toBe(true)
    expect(at(be * 1.01).summary.flags.find((f) => f.id === 'does-not-pay')!.raised).toBe(false)
    expect(at(be * 0.99).money.pays).toBe(false)
  })
})

describe('assess: worked cases', () => {
  it('a river always above N·Q_cap + reserved runs at rating all year: capacity factor = availability', () => {
    // 1 kW per unit, well below what each unit can make, so every day is at rating: CF = A = 0.95
    const d = draft()
    d.option = { ...d.option, turbine: { ratedPower_kW: 1 } }
    d.hydrology = { kind: 'record', days: yearOfDays(() => 60) }
    // a percentile reserved flow of a constant river would be the whole river, so fix it
    d.reservedFlow = { kind: 'fixed', flow: 0.5 }
    const r = assess(parse(d))
    expect(r.summary.capacityFactor).toBeCloseTo(0.95, 9)
    // E = N·P_rated·24·365.25 h·0.95 (record years = days/365.25)
    expect(r.summary.ratedPower_kW).toBe(2)
    expect(r.summary.annualEnergy_MWh).toBeCloseTo(0.002 * 24 * 365.25 * 0.95, 9)
    expect(r.perFlow.every((p) => p.regime === 'spilling')).toBe(true)
  })
  it('a taking-all row matches H_w = K·(Q_u/(C·A_t))²/2g worked by hand, within the allowed drawdown', () => {
    // one unit, throat 0.6 m, outlet 1.2 m: r = 0.25, K = 0.04 + 0.12·0.9375 + 0.0625 = 0.215
    // C·A_t = 0.98·π·0.36/4 = 0.277088 m²; Q_cap(2 m) = 0.277088·√(2·9.80665·2/0.215) = 3.74274 m³/s
    // Q_cap(1.95 m) = 3.74274·√(1.95/2) = 3.69566 m³/s: the least the unit passes at the allowed level
    const d = draft()
    d.option = { ...d.option, units: 1 }
    d.reservedFlow = { kind: 'fixed', flow: 0.28 }
    const r = assess(parse(d))
    expect(unitCapacity(2, { throatDiameter_m: 0.6, outletDiameter_m: 1.2, inletLoss: 0.04, diffuserEfficiency: 0.88, flowCoefficient: 0.98 })).toBeCloseTo(3.74274, 4)
    const row = r.perFlow.find((p) => p.exceedance === 50)
    // Q50 = 4 m³/s; take 4 − 0.28 = 3.72, between 3.69566 and 3.74274 → the unit takes it all
    // V = 3.72/0.277088 = 13.42531 m/s, V²/2g = 9.18964 m; H_w = 0.215·9.18964 = 1.97577 m (≥ 1.95)
    expect(row?.regime).toBe('taking-all')
    expect(row?.unitFlow_m3s).toBeCloseTo(3.72, 12)
    expect(row?.workingHead_m).toBeCloseTo(1.97577, 4)
    // s = 1.04·9.18964 − 1.97577 − 1.5 = 6.08145 m
    expect(row?.suctionHead_m).toBeCloseTo(6.08145, 4)
    // with 0.5 m³/s reserved the take is 3.5 < 3.69566: the unit cannot be fed at the level and stays shut
    // (the pool is not drawn down to 1.75 m to pass it)
    const held = assess(parse({ ...d, reservedFlow: { kind: 'fixed', flow: 0.5 } })).perFlow.find((p) => p.exceedance === 50)
    expect(held?.regime).toBe('stopped')
    expect(held?.shutReason).toBe('too-little-flow')
    expect(held?.spill_m3s).toBeCloseTo(3.5, 12)
  })
  it('more head gives more annual energy', () => {
    const e = [1.5, 2, 2.5].map((H) => {
      const d = draft()
      d.site = { ...d.site, grossHead_m: H }
      return assess(parse(d)).summary.annualEnergy_MWh
    })
    expect(e[1]).toBeGreaterThan(e[0] as number)
    expect(e[2]).toBeGreaterThan(e[1] as number)
  })
  it('uses the ISA pressure of the site altitude', () => {
    const d = draft()
    d.site = { ...d.site, altitude_m: 1000 }
    const r = assess(parse(d))
    // lower air pressure: less suction before vapour, the margin falls by (101325 − 89874.6)/ρg ≈ 1.17 m
    const r0 = assess(parse(draft()))
    const m0 = r0.summary.minCavitationMargin_m ?? 0
    const m1 = r.summary.minCavitationMargin_m ?? 0
    const drop = (isaPressure(120) - isaPressure(1000)) / (waterDensity(17) * g)
    expect(m0 - m1).toBeCloseTo(drop, 2)
  })
})

describe('assess: hydrology inputs', () => {
  it('scales an FDC by catchment area ratio like doubling its flows', () => {
    // area-ratio method, common practice, no source: Q_site = Q_gauge·A_site/A_gauge
    const scaled = assess(parse({ ...draft(), gaugeScaling: { siteArea_km2: 200, gaugeArea_km2: 100 } }))
    const d = draft()
    if (d.hydrology.kind !== 'fdc') throw new Error('fixture is an FDC')
    d.hydrology = { kind: 'fdc', points: d.hydrology.points.map((p) => ({ ...p, flow: p.flow * 2 })) }
    const doubled = assess(parse(d))
    expect(scaled.summary.annualEnergy_MWh).toBeCloseTo(doubled.summary.annualEnergy_MWh, 9)
    expect(scaled.hydrology.q50).toBeCloseTo(8, 12)
  })
  it('reports the cavitation index where units run', () => {
    const r = assess(parse(draft()))
    // σ = 2g·m/V² > 0 while the margin is positive
    expect(r.summary.minCavitationIndex).toBeGreaterThan(0)
    for (const p of r.perFlow) if (p.unitsRunning === 0) expect(p.cavitationIndex).toBeNull()
  })
})

describe('assess: flags', () => {
  it('a deep throat under a high head raises cavitation and gas supersaturation', () => {
    const d = draft()
    d.site = { ...d.site, grossHead_m: 3.5 }
    d.option = { ...d.option, throatDepth_m: 5 }
    // fine bubbles on a clean surface released 5 m down: the discharge carries gas above the air's pressure;
    // with a 20 mmHg limit (stricter than 110 %) the flag is raised on ΔP alone
    d.settings = { bubbleDiameter_m: 0.001, filmModel: 'higbie', plumeVelocity_ms: 0, tdgExcessLimit_mmHg: 20 }
    const r = assess(parse(d))
    const f = Object.fromEntries(r.summary.flags.map((x) => [x.id, x]))
    // s = η_d(1 − r²)H/K − d_t = 0.88·0.9375·3.5/0.215 − 5 = 8.43 m; margin ≈ 10.0 − 8.43 < 2.5 m
    expect(f.cavitation?.raised).toBe(true)
    expect(f.cavitation?.reason).toMatch(/cavitate/)
    // Henry's law: gas taken up at 5 m (up to 1.48 atm-equivalent at equilibrium, REFERENCES §13) stays
    // above the air's pressure at the surface: the excess pressure passes 20 mmHg while TDG stays under 110 %
    expect(r.summary.maxUnitGasExcess_mmHg).toBeGreaterThan(20)
    expect(r.summary.maxUnitTotalDissolvedGas).toBeLessThan(1.1)
    expect(f['gas-supersaturation']?.raised).toBe(true)
    expect(f['gas-supersaturation']?.reason).toMatch(/mmHg/)
    const relaxed = assess(parse({ ...d, settings: { ...d.settings, tdgExcessLimit_mmHg: 76 } }))
    expect(relaxed.summary.flags.find((x) => x.id === 'gas-supersaturation')?.raised).toBe(false)
    expectAllFinite(r)
  })
  it('a throat too deep for its head never draws air and says why', () => {
    const d = draft()
    d.site = { ...d.site, grossHead_m: 0.6 }
    d.option = { ...d.option, throatDepth_m: 4 }
    const r = assess(parse(d))
    const f = r.summary.flags.find((x) => x.id === 'never-runs')
    expect(r.summary.annualEnergy_MWh).toBe(0)
    expect(f?.raised).toBe(true)
    expect(f?.reason).toMatch(/throat/)
    expect(r.summary.lcoe).toBeNull()
  })
  it('oxygen below target is raised when the upstream water is poor', () => {
    const d = draft()
    d.site = { ...d.site, months: d.site.months.map((m) => ({ ...m, upstreamOxygen_mgL: 2 })) }
    const r = assess(parse(d))
    expect(r.summary.flags.find((x) => x.id === 'oxygen-below-target')?.raised).toBe(true)
    expect(r.months.every((m) => m.flags.includes('oxygen-below-target'))).toBe(true)
  })
})

describe('assess: zeros, never NaN', () => {
  it('zero flow gives zeros', () => {
    const d = draft()
    d.hydrology = { kind: 'fdc', points: [{ exceedance: 1, flow: 0 }, { exceedance: 50, flow: 0 }, { exceedance: 99, flow: 0 }] }
    const r = assess(parse(d))
    expectAllFinite(r)
    expect(r.summary.annualEnergy_MWh).toBe(0)
    expect(r.summary.meanAirFlow_m3s).toBe(0)
    expect(r.summary.netOxygenGainSummerLowFlow_mgL).toBe(0)
    expect(r.months.every((m) => m.energy_MWh === 0 && m.netGain_mgL === 0)).toBe(true)
  })
  it('zero head gives zeros and says there is no head', () => {
    const d = draft()
    d.site = { ...d.site, grossHead_m: 0 }
    const r = assess(parse(d))
    expectAllFinite(r)
    expect(r.summary.annualEnergy_MWh).toBe(0)
    expect(r.summary.ratedPower_kW).toBe(0)
    expect(r.summary.capacityFactor).toBe(0)
    expect(r.summary.flags.find((x) => x.id === 'never-runs')?.reason).toMatch(/no head/)
  })
  it('a dry month in the record gives zero energy and no change in oxygen that month', () => {
    const d = draft()
    d.hydrology = { kind: 'record', days: yearOfDays((m) => (m === 8 ? 0 : 6)) }
    const r = assess(parse(d))
    expectAllFinite(r)
    const aug = r.months[7]
    expect(aug?.flow_m3s).toBe(0)
    expect(aug?.energy_MWh).toBe(0)
    expect(aug?.netGain_mgL).toBe(0)
    expect(aug?.downstreamWith_mgL).toBe(aug?.upstreamOxygen_mgL)
    expect(r.months[6]?.energy_MWh).toBeGreaterThan(0)
  })
})
