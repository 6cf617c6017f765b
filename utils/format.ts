// The one way the app shows numbers, days and times.
/** A number to `digits` decimals with thin grouping, or a dash when missing. */
export function formatNumber(x: number | null | undefined, digits = 2): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '–'
  return x.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits })
}
