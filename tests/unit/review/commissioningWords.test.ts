import { describe, expect, it } from 'vitest'
import { verdictOf } from '../../../shared/engine/commissioning'
import { commissioningSentence, measuredDay } from '../../../shared/utils/commissioningWords'

describe('a commissioning record in plain words', () => {
  it('says the day as written, without shifting it to another time zone', () => {
    expect(measuredDay('2027-05-12T23:30')).toBe('12 May 2027')
    expect(measuredDay('2027-01-01T00:10+02:00')).toBe('1 January 2027')
  })
  it('is one line when both perform as assessed, and names what fell short otherwise', () => {
    expect(commissioningSentence('2027-05-12T10:30', verdictOf(1.02, 1), verdictOf(0.95, 1))).toBe('Measured on 12 May 2027: performs as assessed')
    expect(commissioningSentence('2027-05-12T10:30', verdictOf(0.8, 1), verdictOf(1, 1)))
      .toBe('Measured on 12 May 2027: the flow through the unit is below the assessment by 20 %; the oxygen it adds performs as assessed')
    expect(commissioningSentence('2027-05-12T10:30', verdictOf(1, 0), verdictOf(1.3, 1)))
      .toBe('Measured on 12 May 2027: the flow through the unit could not be compared; the oxygen it adds is above the assessment by 30 %')
  })
})
