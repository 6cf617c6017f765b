// CSV tables of a stored assessment, units in every header. Pure (papaparse only), so it needs no Nitro.
import Papa from 'papaparse'
import { storedVerdict } from '../../shared/engine/money'
import type { AssessResult, MonthRow, PerFlowRow } from '../../shared/engine/results'
import type { AssessmentTable } from '../../shared/schemas/assessment'
import type { Currency } from '../../shared/schemas/organisation'

type Column<R> = [header: string, value: (row: R) => string | number | null]

const PER_FLOW: Column<PerFlowRow>[] = [
  ['Exceedance (% of time)', (r) => r.exceedance],
  ['River flow (m³/s)', (r) => r.riverFlow_m3s],
  ['Regime (-)', (r) => r.regime],
  ['Units running (-)', (r) => r.unitsRunning],
  ['Shut reason (-)', (r) => r.shutReason ?? null],
  ['Flow per unit (m³/s)', (r) => r.unitFlow_m3s],
  ['Spill (m³/s)', (r) => r.spill_m3s],
  ['Left in the river by the flow rules (m³/s)', (r) => r.reservedFlow_m3s],
  ['Gross head (m)', (r) => r.grossHead_m],
  ['Working head (m)', (r) => r.workingHead_m],
  ['Throat velocity (m/s)', (r) => r.throatVelocity_ms],
  ['Suction head (m)', (r) => r.suctionHead_m],
  ['Cavitation margin (m)', (r) => r.cavitationMargin_m],
  ['Cavitation index (-)', (r) => r.cavitationIndex],
  ['Air flow (m³/s)', (r) => r.airFlow_m3s],
  ['Electrical power (kW)', (r) => r.electricalPower_kW],
  ['Water-to-wire efficiency (-)', (r) => r.waterToWire],
  ['Downstream oxygen without scheme (mg/L)', (r) => r.downstreamOxygenWithout_mgL],
  ['Downstream oxygen with scheme (mg/L)', (r) => r.downstreamOxygenWith_mgL],
  ['Net oxygen gain (mg/L)', (r) => r.netOxygenGain_mgL],
  ['Unit total dissolved gas (fraction of saturation)', (r) => r.unitTotalDissolvedGas],
  ['Tail depth (m)', (r) => r.tailDepth_m ?? null],
  ['Throat depth below tail (m)', (r) => r.throatDepth_m ?? null],
  ['Weir drowned (-)', (r) => (r.weirDrowned === undefined ? null : r.weirDrowned ? 'drowned' : 'free')],
]

const MONTHS: Column<MonthRow>[] = [
  ['Month (-)', (r) => r.name],
  ['Water temperature (°C)', (r) => r.temperature_C],
  ['Flow (m³/s)', (r) => r.flow_m3s],
  ['Flow basis (-)', (r) => r.flowBasis],
  ['Curve basis (-)', (r) => r.curveBasis ?? null],
  ['Closed month (-)', (r) => (r.closed === undefined ? null : r.closed ? 'closed' : 'open')],
  ['Upstream oxygen (mg/L)', (r) => r.upstreamOxygen_mgL],
  ['Upstream oxygen measured (-)', (r) => (r.upstreamMeasured === undefined ? null : r.upstreamMeasured ? 'measured' : 'not measured')],
  ['Downstream oxygen without scheme (mg/L)', (r) => r.downstreamWithout_mgL],
  ['Without scheme, lowest of the weir models (mg/L)', (r) => r.downstreamWithoutRange_mgL?.min_mgL ?? null],
  ['Without scheme, highest of the weir models (mg/L)', (r) => r.downstreamWithoutRange_mgL?.max_mgL ?? null],
  ['Downstream oxygen with scheme (mg/L)', (r) => r.downstreamWith_mgL],
  ['Downstream oxygen, field-transfer method (mg/L)', (r) => r.downstreamFieldTransfer_mgL],
  ['Downstream oxygen, bubble model (mg/L)', (r) => r.downstreamBubbleModel_mgL],
  ['Net oxygen gain (mg/L)', (r) => r.netGain_mgL],
  ['Worst net oxygen change in the month (mg/L)', (r) => r.worstNetGain_mgL ?? null],
  ['Oxygen target (mg/L)', (r) => r.target_mgL],
  ['Share of the month units run (fraction)', (r) => r.runningShare ?? null],
  ['Share of the month with an oxygen loss beyond the acceptable one (fraction)', (r) => r.lossShare ?? null],
  ['Unit total dissolved gas (fraction of saturation)', (r) => r.unitTotalDissolvedGas],
  ['Cavitation margin (m)', (r) => r.cavitationMargin_m],
  ['Flags raised (-)', (r) => r.flags.join(' ')],
  ['Energy (MWh)', (r) => r.energy_MWh],
  ['Energy basis (-)', (r) => r.energyBasis],
]

/** The summary as figure / value / unit rows (a run stored by an older engine leaves the newer figures blank). */
function summaryRows(result: AssessResult, currency: Currency): (string | number | null)[][] {
  const s = result.summary
  // A run stored before the verdict was kept leaves the newer money cells blank or works them out again.
  const m = result.money as Partial<AssessResult['money']> & Pick<AssessResult['money'], 'capex' | 'annualOpex' | 'npv' | 'simplePayback_yr' | 'annualCarbonAvoided_t' | 'annualRevenue' | 'lcoe'>
  const verdict = storedVerdict(m)
  const c = currency.code
  const op = result.operation as AssessResult['operation'] | undefined
  return [
    ['Annual energy', s.annualEnergy_MWh, 'MWh/yr'],
    ['Capacity factor', s.capacityFactor, '-'],
    ['Full-load hours', s.annualFullLoad_h, 'h/yr'],
    ['Rated power', s.ratedPower_kW, 'kW'],
    ['Mean air flow', s.meanAirFlow_m3s, 'm³/s'],
    ['Peak air flow', s.peakAirFlow_m3s, 'm³/s'],
    ['Minimum cavitation margin', s.minCavitationMargin_m, 'm'],
    ['Minimum cavitation index', s.minCavitationIndex, '-'],
    ['Largest unit total dissolved gas', s.maxUnitTotalDissolvedGas, 'fraction of saturation'],
    ['Net oxygen gain at summer low flow', s.netOxygenGainSummerLowFlow_mgL, 'mg/L'],
    ['Summer low flow', s.summerLowFlow.flow_m3s, 'm³/s'],
    ['Mean net oxygen change over the year', s.meanNetOxygenGain_mgL ?? null, 'mg/L'],
    ['Worst net oxygen change at any flow', s.worstNetOxygenGain_mgL ?? null, 'mg/L'],
    ['Pressure recovered by the diffuser', s.recoveredFraction ?? null, 'fraction'],
    ['Operating mode', op?.mode ?? null, '-'],
    ['Allowed head-pool drawdown', op?.allowedDrawdown_m ?? null, 'm'],
    ['Closed months', op ? op.closedMonths.join(' ') : null, 'month numbers'],
    ['Share of the year units run', op?.runningShare ?? null, 'fraction'],
    ['Energy given up for the river', op && op.modesCompared ? op.energyGivenUpForRiver_MWh : null, 'MWh/yr'],
    ['Days a year at the hands-off flow only', result.depletedReach?.annualHandsOffOnly_d ?? null, 'd/yr'],
    ['Capital cost', m.capex, c],
    ['Design flow the civil works are priced on', m.designFlow_m3s ?? null, 'm³/s'],
    ['Operating cost', m.annualOpex, `${c}/yr`],
    ['Revenue at the export price', m.annualRevenue, `${c}/yr`],
    ['Export price', m.exportPrice ?? null, `${c}/MWh`],
    ['Levelised cost of energy', s.lcoe, `${c}/MWh`],
    ['Net present value', m.npv, c],
    ['Break-even export price', verdict.breakEvenPrice, `${c}/MWh`],
    ['Pays at the export price', verdict.pays ? 'yes' : 'no', '-'],
    ['Simple payback', m.simplePayback_yr, 'yr'],
    ['Carbon avoided', m.annualCarbonAvoided_t, 't CO₂/yr'],
    ...s.flags.map((f) => [`Flag: ${f.id}`, f.raised ? 'raised' : 'clear', '-']),
    ['Engine version', result.engineVersion, '-'],
  ]
}

const cell = (v: string | number | null) => (v === null ? '' : v)

/** The depleted reach's two curves; a run stored before flow rules has only the header. */
function depletedReachCsv(result: AssessResult): string {
  const d = result.depletedReach
  const fields = ['Exceedance (% of time)', 'River flow without the scheme (m³/s)', 'Flow over the weir with the scheme (m³/s)']
  if (!d) return Papa.unparse({ fields, data: [] })
  return Papa.unparse({ fields, data: d.curve.map((r) => [r.exceedance, r.natural_m3s, r.withScheme_m3s]) })
}

/** One table of a stored result as CSV text (CRLF lines, header first); amounts are labelled with `currency`'s ISO code. */
export function assessmentCsv(result: AssessResult, table: AssessmentTable, currency: Currency): string {
  if (table === 'perFlow') return Papa.unparse({ fields: PER_FLOW.map((c) => c[0]), data: result.perFlow.map((r) => PER_FLOW.map((c) => cell(c[1](r)))) })
  if (table === 'depletedReach') return depletedReachCsv(result)
  if (table === 'months') return Papa.unparse({ fields: MONTHS.map((c) => c[0]), data: result.months.map((r) => MONTHS.map((c) => cell(c[1](r)))) })
  return Papa.unparse({ fields: ['Figure', 'Value', 'Unit'], data: summaryRows(result, currency).map((r) => r.map(cell)) })
}
