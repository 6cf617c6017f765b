// The comparison table's rows (best value per row, differences) and its CSV rows.
import { describe, expect, it } from 'vitest'
import { OptionInputSchema } from '../../../shared/schemas/option'
import type { AssessmentDto } from '../../../shared/schemas/assessment'
import type { CompareItem } from '../../../shared/schemas/compare'
import { compareCsvRows, compareRows } from '../../../utils/compare'

const GBP = { code: 'GBP', symbol: '£' }

function item(id: number, units: number, figures: Partial<AssessmentDto> | null, currency = GBP, baseline: CompareItem['baseline'] = null): CompareItem {
  const o = OptionInputSchema.parse({ name: `Option ${id}`, design: { units, throatDiameter_m: 0.5, outletDiameter_m: 1, throatDepth_m: 2, air: { pipeDiameter_m: 0.4, pipeLength_m: 8 } } })
  const latest: AssessmentDto | null = figures && {
    id: id * 10, siteId: 1, optionId: id, engineVersion: '0.1.0', stale: false, createdAt: '2026-01-01', createdBy: null, supersedes: null, supersededBy: null,
    annualEnergy_MWh: 100, capacityFactor: 0.4, ratedPower_kW: 30, minCavitationMargin_m: 4, netOxygenGainSummerLowFlow_mgL: 0.2, lcoe: 150, capex: 300_000, npv: -50_000,
    energyP50_MWh: null, energyP90_MWh: null, netLossProbability: null, recordP90_MWh: null, baselineEnergy_MWh: null, flagsRaised: [], ...figures,
  }
  return { option: { id, name: o.name, design: o.design, settings: o.settings, version: 1 }, site: { id: 1, orgId: 1, name: 'Weir', riverName: 'Brackwin Water', grossHead_m: 2, currency }, latestAssessment: latest, baseline }
}

describe('comparison rows', () => {
  const screw = (givenUp: number, o2: number): CompareItem['baseline'] => ({ kindLabel: 'Archimedes screw', annualEnergy_MWh: 400, energyGivenUp_MWh: givenUp, oxygenGainedOverBaseline_mgL: o2, oxygenPerMWhGivenUp: givenUp > 0 ? o2 / givenUp : null, lcoe: 120 })
  const items = [item(1, 2, { annualEnergy_MWh: 120, lcoe: 180 }, GBP, screw(280, 0.3)), item(2, 3, { annualEnergy_MWh: 150, lcoe: 140, flagsRaised: ['cavitation'] }, GBP, screw(250, 0.1)), item(3, 3, null)]
  const rows = Object.fromEntries(compareRows(items).map((r) => [r.key, r]))

  it('marks the most energy and the least LCOE as best, ignoring an option never assessed', () => {
    expect(rows['energy']!.best).toEqual([1])
    expect(rows['lcoe']!.best).toEqual([1])
    expect(rows['flags']!.best).toEqual([0])
  })

  it('marks no best where all are equal, and flags rows whose values differ', () => {
    expect(rows['cf']!.best).toEqual([]) // 40 % in both assessed options
    expect(rows['throat']!.differs).toBe(false)
    expect(rows['units']!.differs).toBe(true)
  })

  it('sets each option against its conventional turbine: the least energy given up and the most oxygen gained marked best', () => {
    // definitions of the rows (energy given up, oxygen over the baseline), no outside source
    expect(rows['baselineEnergy']!.cells).toEqual([400, 400, null])
    expect(rows['givenUp']!.best).toEqual([1])
    expect(rows['oxygenOverBaseline']!.best).toEqual([0])
    expect(rows['oxygenPerMWh']!.cells[0]).toBeCloseTo(0.3 / 280, 5)
  })

  it('writes a CSV with a unit column and one column per option', () => {
    const csv = compareCsvRows(items)
    expect(csv[0]).toEqual(['Figure', 'Unit', 'Option 1', 'Option 2', 'Option 3'])
    expect(csv.find((r) => r[0] === 'Annual energy')).toEqual(['Annual energy', 'MWh/yr', 120, 150, null])
    expect(csv.find((r) => r[0] === 'LCOE')).toEqual(['LCOE', '£/MWh', 180, 140, null])
    expect(csv.find((r) => r[0] === 'NPV at the export price')).toEqual(['NPV at the export price', '£', -50_000, -50_000, null])
    expect(csv.flat().some((c) => /currency/i.test(String(c)))).toBe(false)
  })
})

describe('money rows', () => {
  it('show NPV and capital cost in the shared currency, best marked', () => {
    const rows = Object.fromEntries(compareRows([item(1, 2, { npv: -10_000, capex: 200_000 }), item(2, 3, { npv: 5_000, capex: 260_000 })]).map((r) => [r.key, r]))
    expect(rows['npv']).toMatchObject({ unit: '£', cells: [-10_000, 5_000], best: [1] })
    expect(rows['capex']).toMatchObject({ unit: '£', cells: [200_000, 260_000], best: [0] })
  })

  it('give each cell its own symbol, and mark none best, when the options\' currencies differ', () => {
    const rows = Object.fromEntries(compareRows([item(1, 2, { npv: -10_000 }), item(2, 3, { npv: 5_000 }, { code: 'EUR', symbol: '€' })]).map((r) => [r.key, r]))
    expect(rows['npv']).toMatchObject({ unit: "each option's currency", cells: ['−£10,000', '€5,000'], best: [] })
    expect(rows['lcoe']!.unit).toBe("per MWh, each option's currency")
  })
})

describe('how-sure rows', () => {
  const sure = { energyP50_MWh: 118.04, energyP90_MWh: 96.26, netLossProbability: 0.215, recordP90_MWh: null }
  it('show the Monte Carlo P90/P50 energy and the chance of a net oxygen loss, the higher P90 and the lower chance marked best', () => {
    const rows = Object.fromEntries(compareRows([
      item(1, 2, sure),
      item(2, 3, { energyP50_MWh: 130, energyP90_MWh: 90, netLossProbability: 0.05, recordP90_MWh: null }),
      item(3, 3, { energyP50_MWh: null, energyP90_MWh: null, netLossProbability: null, recordP90_MWh: null }),
      item(4, 3, null),
    ]).map((r) => [r.key, r]))
    expect(rows['energyP90']).toMatchObject({ unit: 'MWh/yr', cells: [96.3, 90, 'not run', null], best: [0] })
    expect(rows['energyP50']).toMatchObject({ cells: [118, 130, 'not run', null], best: [] })
    // 0.215 of the draws → 21.5 %
    expect(rows['netLossChance']).toMatchObject({ unit: '% of draws', cells: [21.5, 5, 'not run', null], best: [1] })
    // no option has a record of 9 complete years: no row for it
    expect(rows['recordP90']).toBeUndefined()
  })

  it('add the record\'s P90 year where an option has one, and say what the others lack', () => {
    const rows = Object.fromEntries(compareRows([item(1, 2, { ...sure, recordP90_MWh: 80.04 }), item(2, 3, sure), item(3, 3, { ...sure, recordP90_MWh: 85 })]).map((r) => [r.key, r]))
    expect(rows['recordP90']).toMatchObject({ label: 'Driest-years P90 from the record', cells: [80, 'needs a 9-year record', 85], best: [2] })
  })
})
