import type { Fdc } from '../engine/hydrology'

/** Most points of a flow-duration curve sent for charting. */
export const FDC_CHART_POINTS = 200

/** At most `max` nodes of a curve, evenly spread by index, first and last kept (for the hydrology chart). */
export function fdcChartPoints(fdc: Fdc, max = FDC_CHART_POINTS): { exceedance: number; flow: number }[] {
  const n = fdc.exceedance.length
  const take = Math.min(n, max)
  const out: { exceedance: number; flow: number }[] = []
  for (let k = 0; k < take; k++) {
    const i = take === 1 ? 0 : Math.round((k * (n - 1)) / (take - 1))
    out.push({ exceedance: fdc.exceedance[i]!, flow: fdc.flow[i]! })
  }
  return out
}
