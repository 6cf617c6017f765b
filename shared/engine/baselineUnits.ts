// The conventional low-head units the venturi scheme is set against (ENGINE.md §11): each kind's
// part-load efficiency curve and cost per kW, and the baseline's other defaults, each with its origin.
// Data and one interpolation only; the stage itself is baseline.ts.
import type { SourcedValue } from './defaults'

/** The kinds of conventional unit the baseline may be. */
export const BASELINE_KINDS = ['screw', 'propeller', 'cross-flow'] as const
export type BaselineKind = (typeof BASELINE_KINDS)[number]

/** Plain words for each kind, as the screens print them. */
export const BASELINE_KIND_LABEL: Readonly<Record<BaselineKind, string>> = {
  'screw': 'Archimedes screw',
  'propeller': 'propeller (Kaplan-type)',
  'cross-flow': 'cross-flow',
}

/** One point of a part-load curve: turbine efficiency (water to shaft, generator not included) at a share of the design flow. */
export interface CurvePoint {
  flowFraction: number
  efficiency: number
}

/** A kind's part-load curve: points by rising flow fraction (the first is the least flow it runs at), and where they come from. */
export interface EfficiencyCurve {
  points: readonly CurvePoint[]
  source: string
}

const pts = (rows: ReadonlyArray<readonly [number, number]>): CurvePoint[] => rows.map(([flowFraction, efficiency]) => ({ flowFraction, efficiency }))

/**
 * Part-load curves η(Q/Q_d), turbine only (the generator's efficiency is applied apart). REFERENCES §14
 * names the ESHA small-hydro guide (2004) for these curves, marked [M]; the points below could not be
 * read from a published table here, so each is from memory of that guide's figure and of the papers
 * named, and only the peak levels and the flat shape of the screw and cross-flow curves were
 * confirmed in what could be searched (sources in each entry).
 */
export const EFFICIENCY_CURVES: Readonly<Record<BaselineKind, EfficiencyCurve>> = {
  // from memory: lab screws peak about 0.7–0.8 and stay near it down to about a fifth of the design
  // flow (Lyons & Lubitz 2013; Kozyn & Lubitz 2017). Confirmed: practical efficiencies 60–80 %
  // (YoosefDoost & Lubitz 2020, Sustainability 12:7352); mean plant efficiency 69 %, the best plants
  // above 75 % at peak (Lashofer et al. 2012, field survey of screw plants). The points are from memory.
  'screw': {
    points: pts([[0.1, 0.55], [0.2, 0.7], [0.3, 0.75], [0.5, 0.79], [0.75, 0.8], [1, 0.78]]),
    source: 'from memory: shape after Lyons & Lubitz (2013) and Kozyn & Lubitz (2017); peak level confirmed by YoosefDoost & Lubitz (2020), practical efficiencies 60–80 %, and Lashofer et al. (2012), best plants above 75 %',
  },
  // from memory: a Kaplan-type propeller with adjustable runner blades and guide vanes (double
  // regulated) holds about 0.9 from half load and runs down to about a fifth of its design flow (ESHA
  // 2004 guide, efficiency curves of small turbines). A fixed-blade propeller would fall much faster.
  'propeller': {
    points: pts([[0.2, 0.7], [0.3, 0.8], [0.4, 0.86], [0.6, 0.9], [0.8, 0.91], [1, 0.89]]),
    source: 'from memory: double-regulated Kaplan-type curve after the ESHA guide (2004); not confirmed',
  },
  // from memory: a two-cell cross-flow unit (guide vane split 1/3 : 2/3) keeps a flat curve near 0.8
  // down to about a tenth of its flow (ESHA 2004). Confirmed only in kind: a flatter curve than other
  // turbines and a 70–85 % typical peak (Adhikari & Wood 2018, Energies 11:267); favourable part-load
  // performance (Pereira & Borges, cross-flow tests, peak 84.8 %).
  'cross-flow': {
    points: pts([[0.1, 0.6], [0.2, 0.72], [0.3, 0.76], [0.5, 0.79], [0.7, 0.8], [1, 0.79]]),
    source: 'from memory: two-cell cross-flow curve after the ESHA guide (2004); flat shape and 70–85 % peak confirmed by Adhikari & Wood (2018)',
  },
}

/** Turbine efficiency at flow fraction x = Q/Q_d: linear between the curve's points, 0 below its first point (the least flow the unit runs at), held at the last point above it. */
export function partLoadEfficiency(curve: EfficiencyCurve, x: number): number {
  const p = curve.points
  const first = p[0]
  if (!first || !(x >= first.flowFraction)) return 0
  for (let i = 1; i < p.length; i++) {
    const a = p[i - 1] as CurvePoint
    const b = p[i] as CurvePoint
    if (x <= b.flowFraction) return a.efficiency + ((x - a.flowFraction) / (b.flowFraction - a.flowFraction)) * (b.efficiency - a.efficiency)
  }
  return (p[p.length - 1] as CurvePoint).efficiency
}

/**
 * Installed cost per kW by kind, in the option's currency. The Local Government Association gives
 * £5,000–8,000 per kW for UK schemes under 4 m of head, civil works 65–75 % of it, consents 15–20 %,
 * electro-mechanical about 10 % (REFERENCES §14 [C]): the figure holds civils and consents, so the
 * baseline's fixed cost defaults to 0. Which end of the range each kind takes is illustrative.
 */
export const BASELINE_PRICE_PER_KW: Readonly<Record<BaselineKind, SourcedValue>> = {
  'screw': { value: 6500, unit: 'currency/kW', source: 'Local Government Association, UK under 4 m head: £5,000–8,000 per kW (mid-range taken; illustrative choice)' },
  'propeller': { value: 8000, unit: 'currency/kW', source: 'Local Government Association, UK under 4 m head: £5,000–8,000 per kW (upper end taken for a regulated runner and draft tube; illustrative choice)' },
  'cross-flow': { value: 5000, unit: 'currency/kW', source: 'Local Government Association, UK under 4 m head: £5,000–8,000 per kW (lower end taken; illustrative choice)' },
}

/** The baseline's scalar defaults, each with its origin. */
export const BASELINE_DEFAULTS = {
  headLossFraction: { value: 0.05, unit: '-', source: 'illustrative: intake screen, channel and draft-tube losses as a share of the gross head' },
  generatorEfficiency: { value: 0.92, unit: '-', source: 'from memory: small generators with their gearbox or drive 0.90–0.95 (as the venturi turbine\'s default)' },
  fixedCost: { value: 0, unit: 'currency', source: 'the Local Government Association per-kW figure already holds civil works and consents' },
  designFlowExceedance: { value: 30, unit: '%', source: 'common practice, no source: what the flow rules allow the scheme to take at the flow exceeded 30 % of the time' },
} as const satisfies Record<string, SourcedValue>

/**
 * Installed cost by the ORNL non-powered-dam model (Hydropower Baseline Cost Modeling v2, 2015;
 * REFERENCES §14 [C]): ICC = 11,489,245·P^0.976·H^−0.240 in 2014 US dollars, P in MW, H in feet. A
 * cross-check only: US costs in another currency, fitted to larger plants than most weirs hold.
 */
export function ornlInstalledCost_usd2014(rating_kW: number, head_m: number): number | null {
  if (!(rating_kW > 0) || !(head_m > 0)) return null
  return 11_489_245 * (rating_kW / 1000) ** 0.976 * (head_m / 0.3048) ** -0.24
}
