// The comparison table's rows (design, then headline figures with how sure they are, best per row
// marked) and its CSV.
// Money is in each option's organisation's currency: when the options share one, the row's unit
// names it; when they do not, each cell carries its own symbol and no cell is marked best.
import type { CompareItem } from '#shared/schemas/compare'
import { formatMoney, moneyUnit } from './format'

/** One row of the comparison table: a label with its unit, one cell per option, and which is best. */
export interface CompareRow {
  key: string
  label: string
  unit: string
  section: 'design' | 'figures'
  cells: (string | number | null)[]
  /** Indexes of the best cells (ties all marked); empty when the row has no better or worse. */
  best: number[]
  /** True when the options do not all hold the same value. */
  differs: boolean
  /** Decimals to show numbers with. */
  digits: number
}

const CONSTRICTION_LABEL: Record<string, string> = { 'venturi': 'venturi', 'short-nozzle': 'short nozzle', 'sharp-plate': 'sharp-edged plate' }

const round = (x: number | null | undefined, d: number) => (x === null || x === undefined || !Number.isFinite(x) ? null : Math.round(x * 10 ** d) / 10 ** d)

/** The comparison's rows: the design, then the newest assessment's headline figures, best per row marked. */
export function compareRows(items: readonly CompareItem[]): CompareRow[] {
  const row = (key: string, label: string, unit: string, section: CompareRow['section'], cells: (string | number | null)[], digits = 0, better?: 'high' | 'low'): CompareRow => {
    const nums = cells.map((c) => (typeof c === 'number' ? c : null))
    const present = nums.filter((n): n is number => n !== null)
    const target = better && present.length >= 2 ? (better === 'high' ? Math.max(...present) : Math.min(...present)) : null
    const best = target === null || present.every((n) => n === target) ? [] : nums.flatMap((n, i) => (n === target ? [i] : []))
    return { key, label, unit, section, cells, best, differs: new Set(cells.map((c) => String(c))).size > 1, digits }
  }
  const a = items.map((i) => i.latestAssessment)
  const codes = new Set(items.map((i) => i.site.currency.code))
  const shared = codes.size <= 1 ? items[0]?.site.currency : undefined
  /** A money row: numbers under the shared currency's unit, or each cell with its own symbol. */
  const money = (key: string, label: string, per: string | undefined, pick: (x: NonNullable<CompareItem['latestAssessment']>) => number | null, none: string, better: 'high' | 'low') =>
    shared
      ? row(key, label, moneyUnit(shared, per), 'figures', a.map((x) => (x ? (pick(x) === null ? none : round(pick(x), 0)) : null)), 0, better)
      : row(key, label, per ? `per ${per}, each option's currency` : "each option's currency", 'figures', a.map((x, i) => (x ? (pick(x) === null ? none : formatMoney(pick(x), items[i]!.site.currency)) : null)))
  /** A figure of the stored Monte Carlo or record years: `none` where the assessment has none, a dash where there is no assessment. */
  const uncertain = (pick: (x: NonNullable<CompareItem['latestAssessment']>) => number | null, scale: number, digits: number, none: string) =>
    a.map((x) => {
      const v = x ? pick(x) : null
      return x ? (v === null ? none : round(v * scale, digits)) : null
    })
  const recordP90 = a.some((x) => x?.recordP90_MWh != null)
  return [
    row('site', 'Site', '', 'design', items.map((i) => `${i.site.name} (${i.site.riverName})`)),
    row('head', 'Gross head', 'm', 'design', items.map((i) => i.site.grossHead_m), 2),
    row('units', 'Units', 'units', 'design', items.map((i) => i.option.design.units)),
    row('constriction', 'Constriction', '', 'design', items.map((i) => CONSTRICTION_LABEL[i.option.design.constriction] ?? i.option.design.constriction)),
    row('throat', 'Throat diameter', 'm', 'design', items.map((i) => i.option.design.throatDiameter_m), 2),
    row('outlet', 'Outlet diameter', 'm', 'design', items.map((i) => i.option.design.outletDiameter_m), 2),
    row('depth', 'Throat submergence', 'm', 'design', items.map((i) => i.option.design.throatDepth_m), 2),
    row('pipe', 'Air pipe diameter', 'm', 'design', items.map((i) => i.option.design.air.pipeDiameter_m), 2),
    row('pipeLength', 'Air pipe length', 'm', 'design', items.map((i) => i.option.design.air.pipeLength_m), 1),
    row('ratedEntered', 'Rated power per unit as entered', 'kW', 'design', items.map((i) => i.option.design.turbine.ratedPower_kW ?? 'sized to design'), 1),
    row('energy', 'Annual energy', 'MWh/yr', 'figures', a.map((x) => round(x?.annualEnergy_MWh, 1)), 1, 'high'),
    row('energyP90', 'Annual energy, P90 (Monte Carlo)', 'MWh/yr', 'figures', uncertain((x) => x.energyP90_MWh, 1, 1, 'not run'), 1, 'high'),
    row('energyP50', 'Annual energy, P50 (Monte Carlo)', 'MWh/yr', 'figures', uncertain((x) => x.energyP50_MWh, 1, 1, 'not run'), 1),
    // Only where an option's site has a daily record of 9 complete years or more.
    ...(recordP90 ? [row('recordP90', 'Driest-years P90 from the record', 'MWh/yr', 'figures', uncertain((x) => x.recordP90_MWh, 1, 1, 'needs a 9-year record'), 1, 'high')] : []),
    row('cf', 'Capacity factor', '%', 'figures', a.map((x) => round(x ? x.capacityFactor * 100 : null, 1)), 1, 'high'),
    row('rated', 'Rated power (all units)', 'kW', 'figures', a.map((x) => round(x?.ratedPower_kW, 1)), 1),
    row('margin', 'Least cavitation margin', 'm', 'figures', a.map((x) => (x ? (x.minCavitationMargin_m === null ? 'never runs' : round(x.minCavitationMargin_m, 2)) : null)), 2, 'high'),
    row('oxygen', 'Net O₂ gain, summer low flow', 'mg/L', 'figures', a.map((x) => round(x?.netOxygenGainSummerLowFlow_mgL, 2)), 2, 'high'),
    row('netLossChance', 'Chance of a net O₂ loss', '% of draws', 'figures', uncertain((x) => x.netLossProbability, 100, 1, 'not run'), 1, 'low'),
    money('lcoe', 'LCOE', 'MWh', (x) => x.lcoe, 'no energy', 'low'),
    money('npv', 'NPV at the export price', undefined, (x) => x.npv, 'not stored', 'high'),
    money('capex', 'Capital cost', undefined, (x) => x.capex, 'not stored', 'low'),
    row('baselineEnergy', 'Conventional turbine at the same weir: annual energy', 'MWh/yr', 'figures', items.map((i) => (i.baseline ? round(i.baseline.annualEnergy_MWh, 1) : null)), 1),
    row('baselineKind', 'Conventional turbine: kind', '', 'figures', items.map((i) => i.baseline?.kindLabel ?? null)),
    row('givenUp', 'Energy given up to the conventional turbine', 'MWh/yr', 'figures', items.map((i) => (i.baseline ? round(i.baseline.energyGivenUp_MWh, 1) : null)), 1, 'low'),
    row('oxygenOverBaseline', 'Mean net O₂ gained over the conventional turbine', 'mg/L', 'figures', items.map((i) => (i.baseline ? round(i.baseline.oxygenGainedOverBaseline_mgL, 3) : null)), 3, 'high'),
    row('oxygenPerMWh', 'O₂ gained per MWh/yr given up', 'mg/L per MWh/yr', 'figures', items.map((i) => (i.baseline ? (i.baseline.oxygenPerMWhGivenUp === null ? 'nothing given up' : round(i.baseline.oxygenPerMWhGivenUp, 5)) : null)), 5, 'high'),
    row('flags', 'Flags raised', 'flags', 'figures', a.map((x) => (x ? x.flagsRaised.length : null)), 0, 'low'),
    row('engine', 'Engine version', '', 'figures', a.map((x) => (x ? `${x.engineVersion}${x.stale ? ' (older engine)' : ''}` : 'not assessed'))),
  ]
}

/** The comparison as CSV rows: header of option names, then one row per figure with its unit. */
export function compareCsvRows(items: readonly CompareItem[]): (string | number | null)[][] {
  return [
    ['Figure', 'Unit', ...items.map((i) => i.option.name)],
    ...compareRows(items).map((r) => [r.label, r.unit || '-', ...r.cells]),
  ]
}
