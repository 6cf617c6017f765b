import { describe, expect, it } from 'vitest'
import { ConsentPatchSchema, ConstraintsPatchSchema } from '../../../shared/schemas/consent'
import { ReviewDecisionSchema } from '../../../shared/schemas/review'
import { CONSENT_KIND_INFO, CONSENT_KINDS, consentCounts, eelScreeningCheck, permissionsLine, requiredConsentsLine, type ConsentKind, type ConsentStatus } from '../../../shared/utils/consents'

describe('eel screening', () => {
  it('is triggered by a diversion of 20 m³ a day or more', () => {
    // Eels (England and Wales) Regulations 2009, SI 2009/3344: diversions of 20 m³ or more in 24 h
    const exactly = eelScreeningCheck(20 / 86_400)
    expect(exactly.diversionPerDay_m3).toBeCloseTo(20, 9)
    expect(exactly.triggered).toBe(true)
    expect(eelScreeningCheck(19.9 / 86_400).triggered).toBe(false)
  })

  it('says how much a scheme diverts: two units of 0.25 m³/s divert 43,200 m³ a day', () => {
    const c = eelScreeningCheck(0.5) // 0.5 m³/s × 86,400 s
    expect(c.diversionPerDay_m3).toBe(43_200)
    expect(c.message).toBe('triggered: diverts up to 43,200 m³ a day')
    expect(c.source).toContain('SI 2009/3344')
  })

  it('is not known without an assessment', () => {
    expect(eelScreeningCheck(null)).toMatchObject({ triggered: null, diversionPerDay_m3: null })
  })
})

describe('the consents list in brief', () => {
  const items = (statuses: ConsentStatus[]) => CONSENT_KINDS.map((kind, i) => ({ kind, status: statuses[i] ?? ('not-started' as ConsentStatus) }))

  it('counts every status and names a refused permission for the landowner', () => {
    const list = items(['granted', 'applied', 'refused', 'granted-with-conditions', 'applied', 'not-needed', 'granted'])
    expect(consentCounts(list)).toMatchObject({ granted: 2, 'granted-with-conditions': 1, applied: 2, refused: 1, 'not-needed': 1, 'not-started': 4 })
    expect(permissionsLine(list)).toBe('Permissions: 3 of 10 granted, 2 applied for, 1 refused (flood-risk permit)')
  })

  it('gives every kind a label, a reason and a source', () => {
    for (const k of CONSENT_KINDS) {
      expect(CONSENT_KIND_INFO[k].label.length, k).toBeGreaterThan(3)
      expect(CONSENT_KIND_INFO[k].why.length, k).toBeGreaterThan(20)
      expect(CONSENT_KIND_INFO[k].source.length, k).toBeGreaterThan(3)
    }
  })

  it('writes what a decision requires', () => {
    expect(requiredConsentsLine(['flood-risk-permit'] as ConsentKind[])).toBe('requires: flood-risk permit granted')
    expect(requiredConsentsLine([])).toBe('')
  })
})

describe('consent bodies', () => {
  const issues = (r: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) => (r.error?.issues ?? []).map((i) => `${i.path.join('.')}: ${i.message}`)

  it('refuses a decision date before the application date, naming decidedOn', () => {
    expect(issues(ConsentPatchSchema.safeParse({ version: 0, appliedOn: '2026-05-02', decidedOn: '2026-05-01' }))).toEqual(['decidedOn: must not be before the application date (2026-05-02)'])
    expect(ConsentPatchSchema.safeParse({ version: 0, appliedOn: '2026-05-02', decidedOn: '2026-05-02' }).success).toBe(true)
  })

  it('refuses a day that does not exist and an unknown status', () => {
    expect(issues(ConsentPatchSchema.safeParse({ version: 1, appliedOn: '2026-02-30' }))).toEqual(['appliedOn: is not a real date'])
    expect(issues(ConsentPatchSchema.safeParse({ version: 1, status: 'pending' }))[0]).toMatch(/^status: must be one of not-started/)
  })

  it('keeps the nearest dwelling at 1 m or more', () => {
    expect(issues(ConstraintsPatchSchema.safeParse({ version: 0, nearestDwelling_m: 0 }))).toEqual(['nearestDwelling_m: must be at least 1 m'])
  })

  it('lets a decision require consents, defaulting to none, but not a return', () => {
    expect(ReviewDecisionSchema.parse({ decision: 'accepted', reason: 'ok' }).requiredConsents).toEqual([])
    expect(ReviewDecisionSchema.parse({ decision: 'accepted', reason: 'ok', requiredConsents: ['flood-risk-permit'] }).requiredConsents).toEqual(['flood-risk-permit'])
    expect(issues(ReviewDecisionSchema.safeParse({ decision: 'returned', reason: 'no', requiredConsents: ['noise'] }))).toEqual(['requiredConsents: only goes with an acceptance'])
    expect(issues(ReviewDecisionSchema.safeParse({ decision: 'accepted', reason: 'ok', requiredConsents: ['noise', 'noise'] }))).toEqual(['requiredConsents: lists a kind twice'])
  })
})
