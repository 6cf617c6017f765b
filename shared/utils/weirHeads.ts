// One plain line on heads from the weir's hydraulics, read from a stored result's per-flow table, for the
// reviewer's brief and the landowner summary: how far the head moves with the flow, and from what flow the
// weir is drowned (its aeration then that of a submerged sluice). Null for a site whose heads come from its
// head table, or a result stored before the per-flow table carried the tail.
import type { PerFlowRow } from '../engine/results'

/** The figures behind the line and the line itself. */
export interface WeirHeadsLine {
  headMin_m: number
  headMax_m: number
  /** The least river flow of the table at which the weir is drowned, m³/s; null when it is free at all of them. */
  drownedFrom_m3s: number | null
  /** For the reviewer. */
  sentence: string
  /** For the landowner, in plain words. */
  plain: string
}

const m = (x: number): string => x.toFixed(2)

/** The line for a stored result's per-flow rows, or null when its heads did not come from the weir's hydraulics. */
export function weirHeadsLine(rows: readonly PerFlowRow[]): WeirHeadsLine | null {
  const hyd = rows.filter((r) => r.tailDepth_m !== undefined && r.tailDepth_m !== null)
  if (hyd.length === 0) return null
  const heads = hyd.map((r) => r.grossHead_m)
  const headMin_m = Math.min(...heads)
  const headMax_m = Math.max(...heads)
  const drowned = hyd.filter((r) => r.weirDrowned === true).map((r) => r.riverFlow_m3s)
  const drownedFrom_m3s = drowned.length ? Math.min(...drowned) : null
  const range = `Heads come from the weir's hydraulics: the gross head runs from ${m(headMax_m)} m to ${m(headMin_m)} m across the flow-duration curve`
  return {
    headMin_m, headMax_m, drownedFrom_m3s,
    sentence: drownedFrom_m3s === null
      ? `${range}, and the weir stays free (tail below the crest) at every flow of the table.`
      : `${range}; the weir drowns by ${m(drownedFrom_m3s)} m³/s: its aeration then is that of a submerged sluice.`,
    plain: drownedFrom_m3s === null
      ? `The fall at the weir changes with the river, from about ${m(headMax_m)} m at low flow to ${m(headMin_m)} m in a flood.`
      : `The fall at the weir changes with the river, from about ${m(headMax_m)} m at low flow to ${m(headMin_m)} m in a flood; in big floods (${m(drownedFrom_m3s)} m³/s and more) the water below rises over the weir and it adds little oxygen then.`,
  }
}
