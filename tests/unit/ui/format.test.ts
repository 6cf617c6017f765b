import { describe, expect, it } from 'vitest'
import { MONTH_NAMES, MONTH_SHORT, monthName } from '../../../shared/utils/months'
import { formatCount, formatDateTime, formatDateTimeUtc, formatDay, formatNumber, formatUpTo } from '../../../utils/format'

// The one formatter of the app (utils/format.ts) and the one list of month names (shared/utils/months.ts).
describe('numbers', () => {
  it('shows fixed decimals, at most some decimals and counts with British grouping; a dash when missing', () => {
    expect(formatNumber(12345.678, 2)).toBe('12,345.68')
    expect(formatNumber(0.5, 1)).toBe('0.5')
    expect(formatNumber(null)).toBe('–')
    expect(formatNumber(Number.NaN)).toBe('–')
    expect(formatUpTo(2.5, 2)).toBe('2.5')
    expect(formatUpTo(2.456, 2)).toBe('2.46')
    expect(formatUpTo(undefined, 2)).toBe('–')
    expect(formatCount(80000)).toBe('80,000')
  })
})

describe('days and moments', () => {
  it('shows a day as its UTC calendar day, whatever the time', () => {
    expect(formatDay('2026-03-12')).toBe('12 Mar 2026')
    expect(formatDay('2026-09-01T23:30:00.000Z')).toBe('1 Sep 2026')
    expect(formatDay(null)).toBe('—')
    expect(formatDay('not a date')).toBe('—')
  })

  it('shows a moment in UTC for the hover title, and in a named time zone for the reader', () => {
    expect(formatDateTimeUtc('2026-07-12T14:05:09.000Z')).toBe('12 Jul 2026, 14:05 UTC')
    expect(formatDateTime('2026-07-12T14:05:09.000Z', 'Europe/London')).toBe('12 Jul 2026, 15:05 BST')
    expect(formatDateTime('2026-01-12T23:05:00.000Z', 'Europe/London')).toBe('12 Jan 2026, 23:05 GMT')
    // Past midnight in the reader's zone, the day moves on.
    expect(formatDateTime('2026-01-12T23:05:00.000Z', 'Asia/Tokyo')).toMatch(/^13 Jan 2026, 08:05 /)
  })
})

describe('month names', () => {
  it('has twelve of each, January first, and names a month by its number', () => {
    expect(MONTH_NAMES).toHaveLength(12)
    expect(MONTH_SHORT).toHaveLength(12)
    expect(MONTH_NAMES.map((m) => m.slice(0, 3))).toEqual([...MONTH_SHORT])
    expect(monthName(8)).toBe('August')
    expect(monthName(13)).toBe('Month 13')
    expect(monthName(0, 'Jan?')).toBe('Jan?')
  })
})
