import { describe, expect, it } from 'vitest'
import type { PerFlowRow } from '../../../shared/engine/results'
import { weirHeadsLine } from '../../../shared/utils/weirHeads'

const row = (riverFlow_m3s: number, grossHead_m: number, tailDepth_m: number | null | undefined, weirDrowned?: boolean) =>
  ({ riverFlow_m3s, grossHead_m, tailDepth_m, weirDrowned }) as PerFlowRow

describe('the line on heads from the weir hydraulics', () => {
  it('says how the head moves and from what flow the weir drowns', () => {
    const line = weirHeadsLine([row(64, 0.5, 2.7, true), row(31, 0.9, 1.8, false), row(40, 0.7, 2.1, true), row(1.2, 1.8, 0.25, false)])!
    expect(line).toMatchObject({ headMin_m: 0.5, headMax_m: 1.8, drownedFrom_m3s: 40 })
    expect(line.sentence).toBe('Heads come from the weir\'s hydraulics: the gross head runs from 1.80 m to 0.50 m across the flow-duration curve; the weir drowns by 40.00 m³/s: its aeration then is that of a submerged sluice.')
    expect(line.plain).toMatch(/40\.00 m³\/s and more/)
  })

  it('is null for a head table, and for a result stored before the tail was kept', () => {
    expect(weirHeadsLine([row(5, 2, null, false)])).toBeNull()
    expect(weirHeadsLine([row(5, 2, undefined)])).toBeNull()
  })

  it('says the weir stays free when it never drowns', () => {
    expect(weirHeadsLine([row(5, 2, 0.4, false)])!.drownedFrom_m3s).toBeNull()
  })
})
