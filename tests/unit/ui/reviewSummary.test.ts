// Pure helpers of the landowner summary and the summary links (utils/summary.ts):
// the plain-language sentences, the homes figure's rounding and the link's days left.
import { describe, expect, it } from 'vitest'
import { SummaryLinkInputSchema } from '../../../shared/schemas/summaryLink'
import { formatDay } from '../../../utils/format'
import type { OxygenRow } from '../../../utils/review'
import { daysLeft, listInWords, monthInWords, riverInWords, roundHomes } from '../../../utils/summary'

const row = (name: string, without: number, withScheme: number, target = 7): OxygenRow => ({ month: 1, name, without, with: withScheme, target })

describe('a month in words', () => {
  it('says the level with the scheme, the change and whether it meets the target, each with its unit', () => {
    expect(monthInWords(row('July', 6.8, 7.4))).toBe('July: 7.4 mg/L with the scheme, up from 6.8 mg/L without it; the target is 7.0 mg/L, so this is enough for the target.')
    expect(monthInWords(row('August', 6.9, 6.6))).toBe('August: 6.6 mg/L with the scheme, down from 6.9 mg/L without it; the target is 7.0 mg/L, so this is below the target.')
  })
  it('calls a change that does not show at one decimal "about the same"', () => {
    expect(monthInWords(row('May', 9.01, 9.04))).toMatch(/about the same as without it/)
    expect(monthInWords(row('January', 12.66, 12.72))).toMatch(/about the same as without it/)
    expect(monthInWords(row('March', 11.94, 12.0))).toMatch(/up from 11.9 mg\/L/)
  })
})

describe('the year in words', () => {
  it('says when every month gains and meets the target', () => {
    expect(riverInWords([row('June', 8, 8.5), row('July', 7.2, 7.6)])).toBe('With the scheme the river would carry more oxygen in every month. It would meet the target in every month.')
  })
  it('counts the months better and worse, and names those still below the target', () => {
    const rows = [row('June', 8, 8.5), row('July', 6.5, 6.8), row('August', 6.9, 6.4)]
    expect(riverInWords(rows)).toBe('With the scheme the river would carry more oxygen in 2 of 3 months and less in 1. It would still be below the target in July and August.')
  })
  it('counts only changes that show at one decimal, and words a year of no gain plainly', () => {
    expect(riverInWords([row('June', 8.01, 8.03), row('July', 7.2, 7.6)])).toMatch(/^With the scheme the river would carry more oxygen in 1 of 2 months\./)
    expect(riverInWords([row('June', 8.01, 8.03), row('July', 7.61, 7.6)])).toMatch(/^With the scheme the river would carry about the same oxygen as now in every month\./)
    expect(riverInWords([row('June', 8, 7.5), row('July', 7.61, 7.6)])).toMatch(/^With the scheme the river would carry less oxygen in 1 of 2 months, and about the same in the rest\./)
  })
  it('says so when there are no months', () => {
    expect(riverInWords([])).toBe('No month-by-month figures are available yet.')
  })
  it('joins lists the English way', () => {
    expect(listInWords(['June'])).toBe('June')
    expect(listInWords(['June', 'July', 'August'])).toBe('June, July and August')
    expect(listInWords([])).toBe('')
  })
})

describe('homes and days', () => {
  it('rounds the homes figure so it does not pretend to precision', () => {
    // Our own presentation rule (nearest 1 under 10, 5 under 100, else 10), no outside source.
    expect(roundHomes(7.4)).toBe(7)
    expect(roundHomes(57)).toBe(55)
    expect(roundHomes(153)).toBe(150)
  })
  it('counts whole days left, rounding a part day up, and never below 0', () => {
    const now = new Date('2026-03-01T12:00:00.000Z')
    expect(daysLeft('2026-03-31T12:00:00.000Z', now)).toBe(30)
    expect(daysLeft('2026-03-01T13:00:00.000Z', now)).toBe(1)
    expect(daysLeft('2026-02-01T00:00:00.000Z', now)).toBe(0)
  })
  it('shows a day the British way in UTC, and a dash for none', () => {
    expect(formatDay('2026-03-31T23:30:00.000Z')).toBe('31 Mar 2026')
    expect(formatDay(null)).toBe('—')
  })
})

describe('the link form against the shared schema', () => {
  it('fills the default expiry and refuses too many days, naming the field', () => {
    expect(SummaryLinkInputSchema.parse({ note: 'for the farm' }).expiresIn_d).toBe(30)
    expect(SummaryLinkInputSchema.safeParse({ expiresIn_d: 400 }).error!.issues[0]!.path).toEqual(['expiresIn_d'])
  })
})
