// Month names, January first, for the app and the server alike (index 0 is January; a 1-based month
// number m is MONTH_NAMES[m - 1]). The one list: pages, CSV files and e-mails all read it.

/** Full month names: "January" … "December". */
export const MONTH_NAMES = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'] as const

/** Three-letter month names: "Jan" … "Dec". */
export const MONTH_SHORT = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'] as const

/** The full name of month `m` (1–12), or `fallback` when out of range. */
export function monthName(m: number, fallback = `Month ${m}`): string {
  return MONTH_NAMES[m - 1] ?? fallback
}
