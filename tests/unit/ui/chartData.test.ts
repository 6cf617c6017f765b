import { describe, expect, it } from 'vitest'
import { calendarTicks, dayToMs, downsampleMinMax, fdcSeries, formatFlow, msToDay, type XY } from '../../../utils/chartData'

describe('downsampleMinMax', () => {
  const century: XY[] = Array.from({ length: 36_525 }, (_, i) => ({ x: i, y: 2 + Math.sin(i / 30) }))

  it('returns short series unchanged', () => {
    const short = [{ x: 0, y: 1 }, { x: 1, y: 2 }]
    expect(downsampleMinMax(short, 100)).toEqual(short)
  })

  it('shrinks a century of days to about the target, in time order', () => {
    const out = downsampleMinMax(century, 2000)
    expect(out.length).toBeLessThanOrEqual(2000)
    expect(out.length).toBeGreaterThan(1500)
    for (let i = 1; i < out.length; i++) expect(out[i]!.x).toBeGreaterThan(out[i - 1]!.x)
  })

  it('keeps the highest and lowest day of the whole series', () => {
    const spiky = century.map((p) => ({ ...p }))
    spiky[12_345] = { x: 12_345, y: 500 }
    spiky[30_001] = { x: 30_001, y: 0.01 }
    const out = downsampleMinMax(spiky, 1000)
    expect(out).toContainEqual({ x: 12_345, y: 500 })
    expect(out).toContainEqual({ x: 30_001, y: 0.01 })
  })

  it('keeps a gap as a null point so the line breaks', () => {
    const gappy = century.map((p, i) => (i >= 20_000 && i < 20_100 ? { x: p.x, y: null } : p))
    const out = downsampleMinMax(gappy, 1000)
    expect(out.some((p) => p.y === null && p.x >= 20_000 && p.x < 20_100)).toBe(true)
  })
})

describe('chart helpers', () => {
  it('drops flows a log axis cannot draw and sorts by exceedance', () => {
    expect(fdcSeries([{ exceedance: 95, flow: 0 }, { exceedance: 50, flow: 2 }, { exceedance: 5, flow: 9 }])).toEqual([{ x: 5, y: 9 }, { x: 50, y: 2 }])
  })

  it('turns dates into UTC milliseconds and back', () => {
    expect(msToDay(dayToMs('2019-03-31'))).toBe('2019-03-31')
    expect(dayToMs('31/03/2019')).toBeNaN()
  })

  it('formats flows to three significant figures', () => {
    expect(formatFlow(3.14159)).toBe('3.14')
    expect(formatFlow(0.004567)).toBe('0.00457')
    expect(formatFlow(1234.5)).toBe('1235')
    expect(formatFlow(null)).toBe('–')
    expect(formatFlow(0)).toBe('0')
  })
})

describe('calendarTicks', () => {
  it('puts ticks on 1 January, every year for a short record and every 10 years for a century', () => {
    const three = calendarTicks(dayToMs('2019-01-01'), dayToMs('2021-12-30'))
    expect(three.map(msToDay)).toEqual(['2019-01-01', '2020-01-01', '2021-01-01'])
    const century = calendarTicks(dayToMs('1921-03-05'), dayToMs('2020-12-31'))
    expect(century.length).toBeLessThanOrEqual(10)
    expect(century.map(msToDay).slice(0, 2)).toEqual(['1930-01-01', '1940-01-01'])
  })

  it('uses months for a record under two years', () => {
    const ticks = calendarTicks(dayToMs('2020-02-10'), dayToMs('2020-11-20'))
    expect(ticks.map(msToDay)).toEqual(['2020-03-01', '2020-04-01', '2020-05-01', '2020-06-01', '2020-07-01', '2020-08-01', '2020-09-01', '2020-10-01', '2020-11-01'])
    expect(calendarTicks(5, 5)).toEqual([])
  })
})
