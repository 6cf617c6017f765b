// How a stored assessment is shown (utils/assessment.ts): flag levels and their order, a flag's share
// of the year and worst value in words, regimes, shut reasons and month bases in plain words, and
// runs stored by an older engine (no level, share, worst value or operating rule) shown without fault.
import { describe, expect, it } from 'vitest'
import { assess } from '../../../shared/engine/assess'
import type { Flag, MonthRow, PerFlowRow } from '../../../shared/engine/results'
import type { ShutReason } from '../../../shared/engine/operation'
import {
  basisWords, distinctOf, ENERGY_BASIS_WORDS, flagFacts, flagLevel, flagTitle, FLOW_BASIS_WORDS, headlineFigures, monthsNamed,
  needsSeasonalProfile, orderedFlags, percentText, regimeText, REGIME_WORDS, SHUT_REASON_WORDS, shutReasonText, signedMgL, type StoredFlag,
} from '../../../utils/assessment'
import { draft, parse } from '../engine/fixtures'
import { DEFAULT_CURRENCY as GBP } from '../../../shared/schemas/organisation'

const flag = (id: Flag['id'], raised: boolean, level: Flag['level']): Flag =>
  ({ id, raised, level, safety: level === 'safety', shareOfTime: raised ? 0.2 : 0, worst: null, reason: `${id} reason` })

describe('flags', () => {
  it('orders raised flags first, then safety, river cautions and notes, keeping the engine order within a level', () => {
    const flags = [
      flag('oxygen-below-target', true, 'note'),
      flag('cavitation', false, 'safety'),
      flag('net-oxygen-loss', true, 'river'),
      flag('never-runs', false, 'note'),
      flag('gas-supersaturation', true, 'safety'),
      flag('scheme-below-target', true, 'safety'),
    ]
    expect(orderedFlags({ summary: { flags } }).map((f) => f.id)).toEqual([
      'gas-supersaturation', 'scheme-below-target', 'net-oxygen-loss', 'oxygen-below-target', 'cavitation', 'never-runs',
    ])
  })

  it('takes a level from the older safety mark when a stored flag has none, and titles an older flag id', () => {
    const older: StoredFlag[] = [
      { id: 'net-oxygen-loss', raised: true, safety: false, reason: 'r' },
      { id: 'cavitation', raised: true, safety: true, reason: 'r' },
    ]
    expect(older.map(flagLevel)).toEqual(['note', 'safety'])
    expect(orderedFlags({ summary: { flags: older } }).map((f) => f.id)).toEqual(['cavitation', 'net-oxygen-loss'])
    expect(flagFacts(older[0]!)).toBe('')
    expect(flagTitle('head-limited-never-runs')).toBe('Units never run')
    expect(flagTitle('net-oxygen-loss')).toBe('Oxygen cost to the river')
    expect(flagTitle('something-new')).toBe('something-new')
  })

  it('says how much of the year a flag is raised and its worst value, signed for an oxygen change', () => {
    const f: StoredFlag = {
      ...flag('net-oxygen-loss', true, 'river'), shareOfTime: 0.1234,
      worst: { value: -0.314, unit: 'mg/L', month: 8, monthName: 'Aug', flow_m3s: 0.617, exceedance: 95 },
    }
    expect(flagFacts(f)).toBe('raised 12 % of the year · worst −0.31 mg/L in Aug at 0.62 m³/s')
    expect(flagFacts({ ...f, shareOfTime: 0.001 })).toMatch(/^raised under 1 % of the year · /)
    // A clear flag gives only its worst value; a gas figure has no decimals.
    const gas: StoredFlag = { ...flag('gas-supersaturation', false, 'safety'), worst: { value: 104.4, unit: '%', month: 7, monthName: 'Jul', flow_m3s: 2, exceedance: 50 } }
    expect(flagFacts(gas)).toBe('worst 104 % in Jul at 2.00 m³/s')
    // A scheme-wide flag has no share of time.
    expect(flagFacts({ ...flag('never-runs', true, 'note'), shareOfTime: null })).toBe('')
  })

  it('reads the engine\'s own flags: closed summer months and river first still give each flag a level, a share and a reason', () => {
    const r = assess(parse({ ...draft(), option: { ...draft().option, operation: { mode: 'river-first', closedMonths: [7, 8] } } }))
    const ordered = orderedFlags(r)
    expect(ordered).toHaveLength(7)
    const raised = ordered.filter((f) => f.raised)
    expect(ordered.slice(0, raised.length)).toEqual(raised)
    for (const f of ordered) {
      expect(['safety', 'river', 'money', 'note']).toContain(flagLevel(f))
      if (f.raised && f.shareOfTime !== null && f.shareOfTime !== undefined) expect(flagFacts(f)).toMatch(/^raised (under )?\d* ?% of the year/)
    }
    expect(r.months.filter((m) => m.closed).map((m) => m.name)).toEqual(['Jul', 'Aug'])
    expect(monthsNamed(r.operation.closedMonths)).toBe('July and August')
  })
})

describe('words for the per-flow and month tables', () => {
  it('names every regime and shut reason in plain words, older regimes too', () => {
    expect(REGIME_WORDS).toEqual({ 'stopped': 'stopped', 'spilling': 'units full, the rest spills', 'taking-all': 'units take all they may, pool held' })
    expect(regimeText('spilling')).toBe('units full, the rest spills')
    expect(regimeText('head-limited')).toBe('units full, the rest spills')
    expect(regimeText('flow-limited')).toBe('units take all the flow')
    // every reason the engine can give has its own plain words (no code shown to the user)
    const all: ShutReason[] = ['too-little-flow', 'no-suction', 'below-cut-in', 'closed-month', 'river-first', 'no-head']
    const words = all.map((r) => shutReasonText(r))
    expect(new Set(words).size).toBe(all.length)
    for (const [i, w] of words.entries()) expect(w, all[i]).not.toBe(all[i])
    expect(Object.keys(SHUT_REASON_WORDS).sort()).toEqual([...all].sort())
    expect(shutReasonText('closed-month')).toBe('closed month')
    expect(shutReasonText(null)).toBe('–')
    expect(shutReasonText(undefined)).toBe('–')
  })

  it('gives each row of a real run a regime and, where units stay shut, a reason in words', () => {
    const r = assess(parse({ ...draft(), option: { ...draft().option, operation: { closedMonths: [1] } } }))
    const rows: PerFlowRow[] = r.perFlow
    for (const row of rows) {
      expect(Object.values(REGIME_WORDS)).toContain(regimeText(row.regime))
      if (row.shutReason) expect(Object.values(SHUT_REASON_WORDS)).toContain(shutReasonText(row.shutReason))
    }
  })

  it('says where the months\' flows and energies come from, and asks a curve site without a profile for month flows', () => {
    const curve = assess(parse(draft()))
    expect(distinctOf(curve.months, 'flowBasis')).toEqual(['annual-q50'])
    expect(distinctOf(curve.months, 'energyBasis')).toEqual(['annual-curve'])
    expect(basisWords(FLOW_BASIS_WORDS, 'annual-q50').sentence).toMatch(/no seasonal profile/)
    expect(basisWords(ENERGY_BASIS_WORDS, 'annual-curve').tag).toBe('annual curve')
    expect(basisWords(ENERGY_BASIS_WORDS, 'month-flow')).toEqual({ tag: 'month-flow', sentence: 'month-flow' })
    expect(needsSeasonalProfile(curve.months, curve.hydrology.basis)).toBe(true)

    const d = draft()
    const profiled = assess(parse({ ...d, site: { ...d.site, months: d.site.months!.map((m, i) => ({ ...m, flow_m3s: i < 3 || i > 9 ? 8 : 2 })) } }))
    expect(distinctOf(profiled.months, 'flowBasis')).toEqual(['profile-median'])
    expect(needsSeasonalProfile(profiled.months, profiled.hydrology.basis)).toBe(false)
    const rows: Partial<MonthRow>[] = [{ curveBasis: 'annual-curve' }]
    expect(needsSeasonalProfile(rows, 'record')).toBe(false)
  })
})

describe('headline figures and numbers', () => {
  it('adds the year\'s net oxygen change and the diffuser\'s recovery to the headline, and leaves them out for an older run', () => {
    const r = assess(parse(draft()))
    const figures = headlineFigures(r.summary, GBP, 0.5)
    expect(figures.map((f) => f.key)).toEqual(['energy', 'cf', 'rated', 'margin', 'oxygen', 'oxygen-year', 'recovery', 'lcoe'])
    const year = figures.find((f) => f.key === 'oxygen-year')!
    expect(year.value).toBe(signedMgL(r.summary.meanNetOxygenGain_mgL))
    expect(year.note).toBe(`mean over the year; worst ${signedMgL(r.summary.worstNetOxygenGain_mgL)} mg/L at any flow`)
    const recovery = figures.find((f) => f.key === 'recovery')!
    expect(recovery).toMatchObject({ unit: '%', note: 'pressure recovered by the diffuser' })
    expect(Number(recovery.value)).toBe(Math.round(r.summary.recoveredFraction * 100))

    const { meanNetOxygenGain_mgL: _m, worstNetOxygenGain_mgL: _w, recoveredFraction: _r, ...older } = r.summary
    expect(headlineFigures(older as typeof r.summary, GBP).map((f) => f.key)).toEqual(['energy', 'cf', 'rated', 'margin', 'oxygen', 'lcoe'])
  })

  it('signs oxygen changes with a true minus, rounds shares to whole percent and names months in order', () => {
    expect(signedMgL(0.123)).toBe('+0.12')
    expect(signedMgL(-0.3)).toBe('−0.30')
    expect(signedMgL(-0.001)).toBe('0.00')
    expect(signedMgL(Number.NaN)).toBe('–')
    expect(percentText(0.123)).toBe('12')
    expect(percentText(0.001)).toBe('under 1')
    expect(percentText(0)).toBe('0')
    expect(monthsNamed([])).toBe('none')
    expect(monthsNamed([9])).toBe('September')
    expect(monthsNamed([9, 6, 7])).toBe('June, July and September')
  })
})
