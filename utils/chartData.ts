// Pure helpers that shape hydrology data for the charts (no Chart.js here, so they unit-test in node).
/** One point of a chart series; y null leaves a gap. */
export interface XY {
  x: number
  y: number | null
}

/** Milliseconds since 1970 of a YYYY-MM-DD date at 00:00 UTC, or NaN when malformed. */
export function dayToMs(date: string): number {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date)
  return m ? Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) : Number.NaN
}

/** A YYYY-MM-DD label for a time in ms. */
export function msToDay(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10)
}

/**
 * Shrinks a long series to about `target` points for drawing: each bucket keeps its lowest and
 * highest point in time order, so peaks and droughts survive; a gap (null) inside a bucket is kept
 * as one null point so the line breaks there. Series already short enough come back as they are.
 */
export function downsampleMinMax(points: readonly XY[], target = 2000): XY[] {
  if (points.length <= target || target < 4) return [...points]
  const bucketSize = Math.ceil(points.length / Math.floor(target / 2))
  const out: XY[] = []
  for (let start = 0; start < points.length; start += bucketSize) {
    const end = Math.min(points.length, start + bucketSize)
    let min: XY | null = null
    let max: XY | null = null
    let gap: XY | null = null
    for (let i = start; i < end; i++) {
      const p = points[i]!
      if (p.y === null) {
        gap ??= p
        continue
      }
      if (!min || p.y < (min.y as number)) min = p
      if (!max || p.y > (max.y as number)) max = p
    }
    const keep = [min, max, gap].filter((p): p is XY => p !== null)
    keep.sort((a, b) => a.x - b.x)
    for (const p of keep) if (out[out.length - 1] !== p) out.push(p)
  }
  return out
}

/** FDC points for a log flow axis: only flows above zero can be drawn; sorted by exceedance. */
export function fdcSeries(points: readonly { exceedance: number; flow: number }[]): { x: number; y: number }[] {
  return points
    .filter((p) => Number.isFinite(p.flow) && p.flow > 0 && Number.isFinite(p.exceedance))
    .map((p) => ({ x: p.exceedance, y: p.flow }))
    .sort((a, b) => a.x - b.x)
}

/** Flow with a sensible number of significant figures for labels: 3 for most, more below 0.01. */
export function formatFlow(flow: number | null | undefined): string {
  if (flow === null || flow === undefined || !Number.isFinite(flow)) return '–'
  if (flow === 0) return '0'
  const abs = Math.abs(flow)
  if (abs >= 100) return flow.toFixed(0)
  return Number(flow.toPrecision(3)).toString()
}

/**
 * Tick positions (ms) at the first day of years (every 1, 2, 5, 10… years, at most `maxTicks`)
 * between `min` and `max`; for spans under two years, the first day of every few months.
 */
export function calendarTicks(min: number, max: number, maxTicks = 10): number[] {
  if (!(max > min)) return []
  const first = new Date(min)
  const last = new Date(max)
  const years = last.getUTCFullYear() - first.getUTCFullYear()
  const out: number[] = []
  if (years >= 2) {
    const step = [1, 2, 5, 10, 20, 25, 50, 100].find((s) => years / s < maxTicks) ?? 100
    for (let y = Math.ceil(first.getUTCFullYear() / step) * step; y <= last.getUTCFullYear(); y += step) {
      const t = Date.UTC(y, 0, 1)
      if (t >= min && t <= max) out.push(t)
    }
    return out
  }
  const months = years * 12 + last.getUTCMonth() - first.getUTCMonth()
  const step = [1, 2, 3, 6].find((s) => months / s < maxTicks) ?? 6
  for (let m = first.getUTCMonth(), y = first.getUTCFullYear(); Date.UTC(y, m, 1) <= max; m += 1) {
    const t = Date.UTC(y, m, 1)
    if (t >= min && new Date(t).getUTCMonth() % step === 0) out.push(t)
  }
  return out
}
