import { describe, expect, it } from 'vitest'
import { commissioningCheck } from '../../../shared/engine/commissioning'
import type { CommissioningRecordDto } from '../../../shared/schemas/commissioning'
import { COMMISSIONING_CSV_COLUMNS, commissioningCsvRows } from '../../../utils/commissioningCsv'
import { draft, parse } from '../engine/fixtures'

describe('the commissioning records as CSV', () => {
  it('gives one row per record in the columns\' order, with the verdicts and their differences', () => {
    const m = {
      measuredAt: '2026-05-12T10:30', riverFlow_m3s: 8, waterTemp_C: 12, manometerFluid: 'mercury' as const, manometerDensity_kgm3: 13546,
      reading_m: 0.1, readingUnit: 'm-of-manometer-fluid' as const, upstreamTapDiameter_m: null, dischargeCoefficient: null,
      upstreamOxygen_mgL: 8.5, downstreamOxygen_mgL: 9.5, oxygenMeasuredAt: 'unit-outlet' as const,
    }
    const result = commissioningCheck(parse(draft()), m)
    const record: CommissioningRecordDto = {
      ...m, id: 1, siteId: 2, optionId: 3, optionName: 'Pair', assessmentId: 4, measuredBy: 'Ada Fellgate', enteredBy: null, notes: '',
      result, engineVersion: '0.3.0', createdAt: '2026-05-12T12:00:00.000Z',
    }
    const [row] = commissioningCsvRows([record])
    expect(row).toHaveLength(COMMISSIONING_CSV_COLUMNS.length)
    const cell = (name: (typeof COMMISSIONING_CSV_COLUMNS)[number]) => row![COMMISSIONING_CSV_COLUMNS.indexOf(name)]
    expect(cell('measured_by')).toBe('Ada Fellgate')
    expect(cell('measured_unit_flow_m3s')).toBe(result.measured.flow.flow_m3s)
    expect(cell('flow_verdict')).toBe(result.flowVerdict.kind)
    expect(cell('flow_difference')).toBe(result.measured.flow.flow_m3s / result.assessed.unitFlow_m3s - 1)
  })
})
