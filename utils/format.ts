// The one way the app shows numbers, days and times. Numbers use British grouping ("12,345.6").
// A day is a UTC calendar day, "12 Mar 2026", the same in every time zone. A moment (a date and
// time) is shown in the reader's own time zone with its name ("12 Mar 2026, 14:05 BST"), with the
// UTC time for a `title` on hover; components/app/AppDateTime.vue does both, and shows the UTC time
// in the server's render so the page the browser hydrates matches it.
import type { Currency } from '#shared/schemas/organisation'
import { MONTH_SHORT } from '#shared/utils/months'

// ——— numbers ———

/** A number to exactly `digits` decimals with grouping, or a dash when missing. */
export function formatNumber(x: number | null | undefined, digits = 2): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '–'
  return x.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits })
}

/** A number with at most `digits` decimals (no trailing zeros) and grouping, or a dash when missing. */
export function formatUpTo(x: number | null | undefined, digits = 0): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '–'
  return x.toLocaleString('en-GB', { maximumFractionDigits: digits })
}

/** A count with grouping: 12,345. */
export function formatCount(n: number): string {
  return formatUpTo(n, 0)
}

// ——— money ———
// Amounts carry the organisation's currency symbol; the engine's figures are in that currency already
// (nothing is converted). A minus is a true minus sign before the symbol: "−£169,000".

/** An amount with the currency's symbol, to `digits` decimals with grouping: "£12,345", "−£169,000"; a dash when missing. */
export function formatMoney(x: number | null | undefined, currency: Currency, digits = 0): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '–'
  const text = formatNumber(Math.abs(x), digits)
  return `${x < 0 && text !== formatNumber(0, digits) ? '−' : ''}${currency.symbol}${text}`
}

/** The unit of an amount, or of a price per `per`: "£", "£/MWh", "£/yr". */
export function moneyUnit(currency: Currency, per?: string): string {
  return per ? `${currency.symbol}/${per}` : currency.symbol
}

/** An engine unit with the word "currency" replaced by the symbol: "currency/kW" → "£/kW", "currency/(m3/s)" → "£ per m³/s". */
export function withCurrency(unit: string, currency: Currency): string {
  return unit.replace('currency/(m3/s)', `${currency.symbol} per m³/s`).replaceAll('currency', currency.symbol)
}

// ——— days and moments ———

const pad = (n: number) => String(n).padStart(2, '0')

/** The UTC day of an ISO date or date-time as "12 Mar 2026"; a dash when missing or not a date. */
export function formatDay(iso: string | null | undefined): string {
  const d = iso ? new Date(iso) : null
  if (!d || Number.isNaN(d.getTime())) return '—'
  return `${d.getUTCDate()} ${MONTH_SHORT[d.getUTCMonth()]} ${d.getUTCFullYear()}`
}

/** A moment in UTC: "12 Mar 2026, 14:05 UTC" (the hover title, and the server's render). */
export function formatDateTimeUtc(iso: string): string {
  const d = new Date(iso)
  if (Number.isNaN(d.getTime())) return '—'
  return `${formatDay(iso)}, ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())} UTC`
}

/** A moment in the reader's time zone, named: "12 Mar 2026, 15:05 BST". `timeZone` is for tests. */
export function formatDateTime(iso: string, timeZone?: string): string {
  const d = new Date(iso)
  if (Number.isNaN(d.getTime())) return '—'
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-GB', { year: 'numeric', month: 'numeric', day: 'numeric', hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZoneName: 'short', timeZone })
      .formatToParts(d)
      .map((p) => [p.type, p.value]),
  )
  return `${Number(parts.day)} ${MONTH_SHORT[Number(parts.month) - 1]} ${parts.year}, ${parts.hour}:${parts.minute} ${parts.timeZoneName}`
}
