// The CSV tables of a stored assessment (server/domain/assessmentCsv.ts): the operating rule's columns
// in the per-flow and month tables and the summary, and a run stored by an older engine, whose
// newer cells are left blank rather than failing.
import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { assess } from '../../../shared/engine/assess'
import type { AssessResult } from '../../../shared/engine/results'
import { assessmentCsv } from '../../../server/domain/assessmentCsv'
import { draft, parse } from '../engine/fixtures'
import { DEFAULT_CURRENCY as GBP } from '../../../shared/schemas/organisation'

const table = (text: string) => Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true }).data

describe('assessment CSV', () => {
  const result = assess(parse({ ...draft(), option: { ...draft().option, operation: { mode: 'river-first', closedMonths: [7, 8] } } }))

  it('gives each month whether it is closed, how much of it the units run and cost the river too much, and its worst net change', () => {
    const rows = table(assessmentCsv(result, 'months', GBP))
    expect(rows).toHaveLength(12)
    expect(rows.filter((r) => r['Closed month (-)'] === 'closed').map((r) => r['Month (-)'])).toEqual(['Jul', 'Aug'])
    expect(rows[6]!['Share of the month units run (fraction)']).toBe('0')
    rows.forEach((r, i) => {
      const m = result.months[i]!
      expect(Number(r['Share of the month units run (fraction)'])).toBeCloseTo(m.runningShare, 12)
      expect(Number(r['Share of the month with an oxygen loss beyond the acceptable one (fraction)'])).toBeCloseTo(m.lossShare, 12)
      expect(Number(r['Worst net oxygen change in the month (mg/L)'])).toBeCloseTo(m.worstNetGain_mgL, 12)
      expect(r['Curve basis (-)']).toBe(m.curveBasis)
      expect(r['Energy basis (-)']).toBe(m.energyBasis)
    })
  })

  it('gives each flow of the curve its shut reason (blank where every unit the water can feed runs)', () => {
    const rows = table(assessmentCsv(result, 'perFlow', GBP))
    expect(rows).toHaveLength(result.perFlow.length)
    rows.forEach((r, i) => expect(r['Shut reason (-)']).toBe(result.perFlow[i]!.shutReason ?? ''))
    expect(rows.some((r) => r['Shut reason (-)'] !== '')).toBe(true)
  })

  it('lists the operating rule and the year\'s oxygen in the summary', () => {
    const lines = assessmentCsv(result, 'summary', GBP).split('\r\n')
    expect(lines).toContain('Operating mode,river-first,-')
    expect(lines).toContain('Closed months,7 8,month numbers')
    expect(lines).toContain(`Energy given up for the river,${result.operation.energyGivenUpForRiver_MWh},MWh/yr`)
    expect(lines).toContain(`Mean net oxygen change over the year,${result.summary.meanNetOxygenGain_mgL},mg/L`)
    expect(lines.filter((l) => l.startsWith('Flag: '))).toHaveLength(7)
  })

  it('labels every amount with the organisation\'s currency code, and says whether the scheme pays', () => {
    const lines = assessmentCsv(result, 'summary', { code: 'EUR', symbol: '€' }).split('\r\n')
    expect(lines).toContain(`Capital cost,${result.money.capex},EUR`)
    expect(lines).toContain(`Net present value,${result.money.npv},EUR`)
    expect(lines).toContain(`Break-even export price,${result.money.breakEvenPrice},EUR/MWh`)
    expect(lines).toContain(`Pays at the export price,${result.money.pays ? 'yes' : 'no'},-`)
    expect(lines.some((l) => /currency/i.test(l))).toBe(false)
  })

  it('leaves the newer cells blank for a run stored by an older engine', () => {
    const older = structuredClone(result) as unknown as Record<string, unknown> & AssessResult
    delete (older as Partial<AssessResult>).operation
    for (const m of older.months as unknown as Record<string, unknown>[]) for (const k of ['closed', 'curveBasis', 'runningShare', 'lossShare', 'worstNetGain_mgL']) Reflect.deleteProperty(m, k)
    for (const p of older.perFlow as unknown as Record<string, unknown>[]) delete p['shutReason']
    const months = table(assessmentCsv(older, 'months', GBP))
    expect(months[6]!['Closed month (-)']).toBe('')
    expect(months[6]!['Share of the month units run (fraction)']).toBe('')
    expect(table(assessmentCsv(older, 'perFlow', GBP)).every((r) => r['Shut reason (-)'] === '')).toBe(true)
    expect(assessmentCsv(older, 'summary', GBP).split('\r\n')).toContain('Operating mode,,-')
  })
})

describe('depleted reach CSV', () => {
  it('gives the two flow-duration curves at each exceedance, and only the header for a run stored before flow rules', () => {
    const result = assess(parse(draft()))
    const rows = table(assessmentCsv(result, 'depletedReach', GBP))
    expect(rows).toHaveLength(13)
    rows.forEach((r, i) => {
      const c = result.depletedReach!.curve[i]!
      expect(Number(r['Exceedance (% of time)'])).toBe(c.exceedance)
      expect(Number(r['River flow without the scheme (m³/s)'])).toBeCloseTo(c.natural_m3s, 12)
      expect(Number(r['Flow over the weir with the scheme (m³/s)'])).toBeCloseTo(c.withScheme_m3s, 12)
    })
    const summary = table(assessmentCsv(result, 'summary', GBP))
    expect(Number(summary.find((r) => r['Figure'] === 'Days a year at the hands-off flow only')!['Value'])).toBeCloseTo(result.depletedReach!.annualHandsOffOnly_d, 9)
    const { depletedReach: _, ...older } = result
    expect(assessmentCsv(older, 'depletedReach', GBP).trim()).toBe('Exceedance (% of time),River flow without the scheme (m³/s),Flow over the weir with the scheme (m³/s)')
  })
})
