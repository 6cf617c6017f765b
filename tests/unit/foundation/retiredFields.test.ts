import { describe, expect, it } from 'vitest'
import { z } from 'zod'
import { retiredFieldIssues } from '../../../shared/schemas/retiredFields'
import { SiteInputSchema } from '../../../shared/schemas/site'
import { InputError, validator } from '../../../server/utils/validate'

// The old camel-case unit names (kept here on purpose) are refused by name, wherever they sit.

describe('retiredFieldIssues', () => {
  it('finds old names at any depth and in arrays, in order, naming the new name', () => {
    const body = { altitudeM: 1, weir: { grossHeadM: 2, shape: 'x' }, months: [{ waterTemp_C: 3 }, { waterTempC: 4 }], design: { costs: { costPerKw: 5 } } }
    expect(retiredFieldIssues(body)).toEqual([
      { path: 'altitudeM', message: 'is no longer accepted: the field is now called altitude_m' },
      { path: 'weir.grossHeadM', message: 'is no longer accepted: the field is now called grossHead_m' },
      { path: 'months.1.waterTempC', message: 'is no longer accepted: the field is now called waterTemp_C' },
      { path: 'design.costs.costPerKw', message: 'is no longer accepted: the field is now called ratedPowerPrice' },
    ])
  })

  it('refuses civils per unit, naming the per-m³/s field that replaced it (its meaning changed too)', () => {
    expect(retiredFieldIssues({ design: { costs: { fixedCost: 1, civilsPerUnit: 40_000 } } })).toEqual([
      { path: 'design.costs.civilsPerUnit', message: 'is no longer accepted: civil works are now priced per m³/s of the design flow, in civilsPerDesignFlow' },
    ])
    expect(retiredFieldIssues({ design: { costs: { civilsPerDesignFlow: 78_000 } } })).toEqual([])
  })

  it('finds nothing in a body under the new names, in plain values, or in inherited names', () => {
    expect(retiredFieldIssues({ altitude_m: 1, weir: { grossHead_m: 2 }, notes: 'grossHeadM', tags: ['lifeYears'] })).toEqual([])
    expect(retiredFieldIssues({ constructor: 1, toString: 2, hasOwnProperty: 3 })).toEqual([])
    for (const v of [null, undefined, 3, 'altitudeM', []]) expect(retiredFieldIssues(v)).toEqual([])
  })

  it('lists at most 20, however many a body repeats', () => {
    const body = Array.from({ length: 1000 }, () => ({ lifeYears: 1 }))
    expect(retiredFieldIssues(body)).toHaveLength(20)
  })

  it('walks a deeply nested body without recursion', () => {
    let deep: Record<string, unknown> = { expiresInDays: 1 }
    for (let i = 0; i < 10_000; i++) deep = { a: deep }
    expect(retiredFieldIssues(deep)).toHaveLength(1)
  })
})

describe('validator', () => {
  it('refuses an old name before the schema would drop it, naming the field first', () => {
    const check = validator(z.object({ altitude_m: z.number().default(0) }), 'body')
    expect(check({ altitude_m: 5 })).toEqual({ altitude_m: 5 })
    expect(() => check({ altitudeM: 5 })).toThrow(InputError)
    expect(() => check({ altitudeM: 5 })).toThrow('altitudeM: is no longer accepted: the field is now called altitude_m')
  })

  it('lists every old name of a site body, with a count in the message', () => {
    try {
      validator(SiteInputSchema, 'body')({ name: 'W', weir: { grossHeadM: 1, crestWidthM: 2 }, targetOxygenMgL: 6 })
      expect.unreachable()
    } catch (error) {
      expect(error).toBeInstanceOf(InputError)
      expect((error as InputError).message).toBe('weir.grossHeadM: is no longer accepted: the field is now called grossHead_m (and 2 more)')
      expect((error as InputError).issues.map((i) => i.path)).toEqual(['weir.grossHeadM', 'weir.crestWidthM', 'targetOxygenMgL'])
    }
  })
})
