// The weir hydraulics' part of the site form: where the heads come from (the head table or the weir's
// hydraulics), the crest height and weir coefficient, and the tail by Manning's equation or a
// stage–discharge table; a blank draft, one from a stored weir, and the body it sends (unchecked:
// blanks stay null for WeirHydraulicsInputSchema to report), and the preview's figures.
import type { WeirHydraulicsInput } from '#shared/schemas/assess'
import type { WeirShapeClass } from '#shared/engine/oxygen'
import { drowningFlow, hydraulicState, resolveWeirHydraulics, type HydraulicState, type WeirHydraulics } from '#shared/engine/weirHydraulics'
import { blankRowOf, parseTypedNumber, rowsFromValues, rowsText, type TableRow } from './numberTable'

export const TAIL_COLUMNS = ['flow_m3s', 'depth_m'] as const

/** One editable row of the tail's stage–discharge table. */
export type TailTableRow = TableRow<(typeof TAIL_COLUMNS)[number]>

/** The form's fields for the weir hydraulics. */
export interface HydraulicsDraft {
  headsFrom: 'head-table' | 'hydraulics'
  crestHeight_m: number | null
  /** Blank: the default for the weir's crest form. */
  dischargeCoefficient: number | null
  tailKind: 'manning' | 'table'
  channelWidth_m: number | null
  bedSlope: number | null
  roughnessN: number | null
  tailRows: TailTableRow[]
}

/** The draft fields for a stored weir's hydraulics (null or absent: heads from the head table). */
export function hydraulicsDraftFrom(h: WeirHydraulicsInput | null): HydraulicsDraft {
  return {
    headsFrom: h ? 'hydraulics' : 'head-table',
    crestHeight_m: h?.crestHeight_m ?? null,
    dischargeCoefficient: h?.dischargeCoefficient ?? null,
    tailKind: h?.tail.kind ?? 'manning',
    channelWidth_m: h?.tail.kind === 'manning' ? h.tail.channelWidth_m : null,
    bedSlope: h?.tail.kind === 'manning' ? h.tail.bedSlope : null,
    roughnessN: h?.tail.kind === 'manning' ? h.tail.roughnessN : null,
    tailRows: h?.tail.kind === 'table' ? rowsFromValues(h.tail.rows, TAIL_COLUMNS) : [blankTailRow(), blankTailRow()],
  }
}

/** A blank row of the tail table. */
export function blankTailRow(): TailTableRow {
  return blankRowOf(TAIL_COLUMNS)
}

/** The rows' texts as one string, to tell whether the table has unsaved changes. */
export function tailRowsText(rows: readonly TailTableRow[]): string {
  return rowsText(rows, TAIL_COLUMNS)
}

/** The weir's `hydraulics` as the API takes it (unchecked), or null while heads come from the head table. */
export function hydraulicsFromDraft(d: HydraulicsDraft) {
  if (d.headsFrom !== 'hydraulics') return null
  const tail = d.tailKind === 'manning'
    ? { kind: 'manning' as const, channelWidth_m: d.channelWidth_m, bedSlope: d.bedSlope, roughnessN: d.roughnessN }
    : { kind: 'table' as const, rows: d.tailRows.map((r) => ({ flow_m3s: parseTypedNumber(r.flow_m3s), depth_m: parseTypedNumber(r.depth_m) })) }
  return { crestHeight_m: d.crestHeight_m, dischargeCoefficient: d.dischargeCoefficient, tail }
}

/** The preview of the hydraulics: resolved, the state at each flow, and the flow from which the weir drowns. */
export interface HydraulicsPreview {
  hydraulics: WeirHydraulics
  rows: HydraulicState[]
  drownsAbove_m3s: number | null
}

/**
 * The preview's figures at `flows`, by the engine's own functions (shared/engine/weirHydraulics.ts), or
 * null while the hydraulics cannot be worked out yet (a blank or out-of-range field).
 */
export function hydraulicsPreview(h: WeirHydraulicsInput, crestLength_m: number | null, shape: WeirShapeClass, flows: readonly number[]): HydraulicsPreview | null {
  if (crestLength_m === null || !(crestLength_m > 0)) return null
  try {
    const hydraulics = resolveWeirHydraulics(h, crestLength_m, shape)
    return { hydraulics, rows: flows.map((q) => hydraulicState(hydraulics, q)), drownsAbove_m3s: drowningFlow(hydraulics) }
  }
  catch {
    return null
  }
}
