// The commissioning records as a CSV table: what was measured, what the assessment said, the verdicts.
import type { Verdict } from '#shared/engine/commissioning'
import type { CommissioningRecordDto } from '#shared/schemas/commissioning'
import type { CsvCell } from './csv'

/** Header row; each quantity carries its unit. */
export const COMMISSIONING_CSV_COLUMNS = [
  'measured_at', 'measured_by', 'option', 'assessment_id', 'river_flow_m3s', 'water_temp_C', 'manometer_fluid', 'manometer_density_kgm3',
  'reading_m', 'reading_unit', 'upstream_oxygen_mgL', 'downstream_oxygen_mgL', 'oxygen_measured_at',
  'measured_unit_flow_m3s', 'assessed_unit_flow_m3s', 'flow_verdict', 'flow_difference',
  'measured_deficit_closed', 'assessed_deficit_closed', 'oxygen_verdict', 'oxygen_difference', 'engine_version',
] as const

const difference = (v: Verdict) => (v.kind === 'not-comparable' ? null : v.difference)

/** One row per record, in the columns' order. */
export function commissioningCsvRows(records: readonly CommissioningRecordDto[]): CsvCell[][] {
  return records.map((r) => [
    r.measuredAt, r.measuredBy, r.optionName, r.assessmentId, r.riverFlow_m3s, r.waterTemp_C, r.manometerFluid, r.manometerDensity_kgm3,
    r.reading_m, r.readingUnit, r.upstreamOxygen_mgL, r.downstreamOxygen_mgL, r.oxygenMeasuredAt,
    r.result.measured.flow.flow_m3s, r.result.assessed.unitFlow_m3s, r.result.flowVerdict.kind, difference(r.result.flowVerdict),
    r.result.measured.oxygen.deficitClosed, r.result.assessed.deficitClosed, r.result.oxygenVerdict.kind, difference(r.result.oxygenVerdict), r.engineVersion,
  ])
}
