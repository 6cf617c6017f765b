// What every run of one option at one site shares, whatever its operating mode or its uncertain
// inputs: the site's hydrology read once (its curve, a record's days and month curves), the reserved
// flow, the year's and each month's conditions, and the month table's flows. assess.ts and the Monte
// Carlo (monteCarlo.ts) both start here.
import type { AssessInput } from '../schemas/assess'
import { resolveFlowRules, type FlowRules } from './flowRules'
import { fdcFromPoints, flowAtExceedance, readRecord, recordCurves, reservedFlow, scaleFdcByAreaRatio, scaleSampleByAreaRatio } from './hydrology'
import type { MonthRow } from './results'
import { buildScheme, type Conditions, type Scheme } from './scheme'
import { monthCurves, type MonthCurve, type SiteHydrology } from './year'

/** Inputs every run of one option shares. */
export interface RunBasis {
  h: SiteHydrology
  reserved: number
  /** The flow rules resolved against the annual curve (hands-off flow = reserved). */
  rules: FlowRules
  annual: Conditions
  monthCond: Conditions[]
  curves: MonthCurve[]
  flows: Array<{ flow: number, basis: MonthRow['flowBasis'] }>
}

/** Read the site once for every run of `input`'s option. */
export function runBasis(input: AssessInput): RunBasis {
  const h = siteHydrology(input)
  const curves = monthCurves(input, h)
  const reserved = reservedFlow(input.reservedFlow, h.fdc)
  return {
    h, reserved, rules: resolveFlowRules(input.flowRules, reserved, h.fdc), annual: annualConditions(input), monthCond: monthConditions(input),
    curves, flows: monthFlows(h, curves),
  }
}

const mean = (xs: readonly number[]): number => (xs.length ? xs.reduce((s, x) => s + x, 0) / xs.length : 0)

function siteHydrology(input: AssessInput): SiteHydrology {
  const sc = input.gaugeScaling
  if (input.hydrology.kind === 'record') {
    const read = readRecord(input.hydrology.days)
    const sample = sc ? scaleSampleByAreaRatio(read, sc.siteArea_km2, sc.gaugeArea_km2) : read
    const curves = recordCurves(sample)
    return { fdc: curves.annual, record: { sample, monthCurves: curves.months } }
  }
  const fdc = fdcFromPoints(input.hydrology.points)
  return { fdc: sc ? scaleFdcByAreaRatio(fdc, sc.siteArea_km2, sc.gaugeArea_km2) : fdc, record: null }
}

/**
 * The month table's flow for each month: a record's mean for the month (the mean of the month's own
 * curve, which holds exactly that month's days), else the median of the month's curve, else the annual median.
 */
function monthFlows(h: SiteHydrology, curves: readonly MonthCurve[]): RunBasis['flows'] {
  const q50 = flowAtExceedance(h.fdc, 50)
  return curves.map((c) => {
    if (c.basis === 'record') return { flow: c.curve.meanFlow, basis: 'record-mean' as const }
    if (c.basis === 'seasonal-profile') return { flow: flowAtExceedance(c.curve, 50), basis: 'profile-median' as const }
    return { flow: q50, basis: 'annual-q50' as const }
  })
}

/** Mean annual conditions: the mean of the twelve months' temperature and upstream oxygen (month 0: never a closed month). */
function annualConditions(input: AssessInput): Conditions {
  return {
    month: 0,
    tC: mean(input.site.months.map((m) => m.temperature_C)),
    upstreamO2_mgL: mean(input.site.months.map((m) => m.upstreamOxygen_mgL)),
  }
}

/** Each month's conditions, January first: its temperature and upstream oxygen. */
export function monthConditions(input: AssessInput): Conditions[] {
  return input.site.months.map((m, k) => ({ month: k + 1, tC: m.temperature_C, upstreamO2_mgL: m.upstreamOxygen_mgL }))
}

/**
 * The scheme every run of `input` works with: its flow rules, and the median flow where heads come from
 * the weir's hydraulics (the option's throat depth is read there). The assessment, each Monte Carlo draw
 * and a commissioning check all build it here, so they judge the same scheme.
 */
export function basisScheme(input: AssessInput, b: RunBasis): Scheme {
  return buildScheme(input, b.reserved, b.annual, b.rules, flowAtExceedance(b.h.fdc, 50))
}
