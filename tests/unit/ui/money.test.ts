// Money on screen: amounts with the organisation's currency symbol, and whether a scheme pays in one
// plain sentence (utils/format.ts, utils/assessment.ts).
import { describe, expect, it } from 'vitest'
import { flagReason, moneySentence, moneyVerdict } from '../../../utils/assessment'
import { formatMoney, moneyUnit, withCurrency } from '../../../utils/format'

const GBP = { code: 'GBP', symbol: '£' }
const EUR = { code: 'EUR', symbol: '€' }

describe('money formatting', () => {
  it('puts the symbol before the amount, a true minus before the symbol, and a dash for nothing', () => {
    expect(formatMoney(1_234_567.4, GBP)).toBe('£1,234,567')
    expect(formatMoney(-169_000, EUR)).toBe('−€169,000')
    expect(formatMoney(-0.2, GBP)).toBe('£0')
    expect(formatMoney(12.5, GBP, 2)).toBe('£12.50')
    expect(formatMoney(null, GBP)).toBe('–')
    expect(formatMoney(Number.NaN, GBP)).toBe('–')
  })

  it('names units in the currency, never the word "currency"', () => {
    expect(moneyUnit(GBP, 'MWh')).toBe('£/MWh')
    expect(moneyUnit(EUR)).toBe('€')
    expect(withCurrency('currency/kW', EUR)).toBe('€/kW')
    expect(withCurrency('currency/(m3/s)', GBP)).toBe('£ per m³/s')
    expect(withCurrency('currency', GBP)).toBe('£')
    expect(withCurrency('t CO2/MWh', GBP)).toBe('t CO2/MWh')
  })
})

describe('whether it pays, in words', () => {
  const losing = {
    capex: 400_000, annualOpex: 1_900, annualRevenue: 420, npv: -169_000, lcoe: 1_830, exportPrice: 100,
    breakEvenPrice: 1_830, pays: false, shortfalls: ['revenue-below-opex', 'negative-npv'] as ('revenue-below-opex' | 'negative-npv')[],
  }

  it('says plainly that a scheme does not pay, why, and the price it would need', () => {
    expect(moneySentence(losing, GBP)).toBe(
      'Does not pay: revenue £420 a year is below the operating cost £1,900 a year; NPV −£169,000 at £100 per MWh; it would need £1,830 per MWh to break even.',
    )
  })

  it('says a scheme pays, and where it breaks even', () => {
    expect(moneySentence({ ...losing, annualRevenue: 30_000, npv: 42_992, lcoe: 80, breakEvenPrice: 80, pays: true, shortfalls: [] }, EUR))
      .toBe('Pays: NPV €42,992 at €100 per MWh; it breaks even at €80 per MWh.')
  })

  it('works out the verdict for a run stored without it (break-even from the LCOE)', () => {
    const older = { capex: 400_000, annualOpex: 1_900, annualRevenue: 420, npv: -169_000, lcoe: 1_830 }
    expect(moneyVerdict(older)).toEqual({ pays: false, revenueBelowOpex: true, negativeNpv: true, breakEvenPrice: 1_830 })
    expect(moneySentence(older, GBP)).toMatch(/^Does not pay: .*NPV −£169,000 at the export price; it would need £1,830 per MWh/)
  })

  it('shows the money flag\'s reason in the currency, other flags as the engine wrote them', () => {
    const flag = { id: 'does-not-pay' as const, raised: true, safety: false, reason: 'engine words' }
    expect(flagReason(flag, losing, GBP)).toMatch(/^Does not pay: revenue £420/)
    expect(flagReason(flag, null, GBP)).toBe('engine words')
    expect(flagReason({ ...flag, id: 'cavitation' }, losing, GBP)).toBe('engine words')
  })
})
