import { describe, expect, it } from 'vitest'
import { assess } from '../../../shared/engine/assess'
import { HOME_KWH_PER_YEAR } from '../../../shared/schemas/summaryLink'
import { CAUTIONS } from '../../../shared/utils/cautions'
import { buildPublicSummary, homesEquivalent, schemeInPlainWords, summaryLinkState, type SummarySources } from '../../../server/domain/summaryLinks'
import { draft, parse } from '../engine/fixtures'

const input = parse(draft())
const result = assess(input)
const sources = (over: Partial<SummarySources> = {}): SummarySources => ({
  site: { name: 'Test weir', river_name: 'Test Water', lat: 54.5, lng: -2.6, reach: JSON.stringify({ type: 'LineString', coordinates: [[-2.6, 54.5], [-2.59, 54.51]] }), gross_head_m: 2, target_oxygen_mgl: 6 },
  organisationName: 'Test Org',
  currency: { code: 'GBP', symbol: '£' },
  creatorName: 'Ada Engineer',
  expiresAt: '2030-01-01T00:00:00.000Z',
  review: { state: 'accepted-with-conditions', reason: 'Gain holds', conditions: 'Monitor monthly', decidedAt: '2026-03-01T10:00:00.000Z' },
  assessment: { kind: 'under-review', createdAt: '2026-02-01T10:00:00.000Z', engineVersion: result.engineVersion, optionName: 'Two units', design: input.option, result, acceptableOxygenLoss_mgL: input.settings.acceptableOxygenLoss_mgL },
  ...over,
})

describe('homesEquivalent', () => {
  it('counts whole homes at the illustrative 2,700 kWh a year', () => {
    expect(HOME_KWH_PER_YEAR).toBe(2700) // illustrative, stated on the page
    expect(homesEquivalent(27)).toBe(10)
    expect(homesEquivalent(26.99)).toBe(9)
    expect(homesEquivalent(0)).toBe(0)
  })
})

describe('buildPublicSummary', () => {
  const s = buildPublicSummary(sources())

  it('has exactly the landowner fields and no ids', () => {
    expect(Object.keys(s).sort()).toEqual(['basis', 'cautions', 'commissioning', 'contact', 'energy', 'expiresAt', 'howSure', 'money', 'permissions', 'review', 'river', 'scheme', 'site'])
    const keys: string[] = []
    const walk = (v: unknown) => {
      if (Array.isArray(v)) v.forEach(walk)
      else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) {
        keys.push(k)
        walk(x)
      }
    }
    walk(s)
    expect(keys.filter((k) => /id$/i.test(k))).toEqual([])
    expect(JSON.stringify(s)).not.toMatch(/@/)
  })

  it('states the energy, the homes figure and its assumption as illustrative', () => {
    expect(s.energy).toMatchObject({ annualEnergy_MWh: result.summary.annualEnergy_MWh, homesEquivalent: homesEquivalent(result.summary.annualEnergy_MWh), annualUsePerHome_kWh: 2700, source: 'illustrative' })
    expect(s.energy!.assumption).toMatch(/^Illustrative/)
  })

  it('describes what would be built in plain words, and the river by month', () => {
    expect(s.scheme).toMatchObject({ units: 2, throatDiameter_m: 0.6, outletDiameter_m: 1.2, optionName: 'Two units' })
    expect(schemeInPlainWords({ units: 1, throatDiameter_m: 0.5, outletDiameter_m: 1 })).toMatch(/^One venturi unit .* 0\.50 m throat .* 1\.00 m/)
    expect(s.river!.months).toHaveLength(12)
    expect(s.river!.months[7]).toEqual({ month: 8, name: result.months[7]!.name, without_mgL: result.months[7]!.downstreamWithout_mgL, with_mgL: result.months[7]!.downstreamWith_mgL, target_mgL: result.months[7]!.target_mgL })
    expect(s.river!.summary).toMatch(/summer low flow/)
  })

  it('shows the decision, the cautions and who to contact', () => {
    expect(s.review).toEqual({ state: 'accepted-with-conditions', stateLabel: 'Accepted with conditions', decisionText: 'Gain holds', conditions: 'Monitor monthly', decidedAt: '2026-03-01T10:00:00.000Z' })
    expect(s.cautions.slice(0, CAUTIONS.length)).toEqual(CAUTIONS.map((c) => ({ ...c })))
    expect(s.contact).toEqual({ organisationName: 'Test Org', preparedBy: 'Ada Engineer' })
  })

  it('keeps a pending decision out, and has no figures without an assessment', () => {
    const bare = buildPublicSummary(sources({ review: { state: 'submitted', reason: 'old reason', conditions: 'old', decidedAt: null }, assessment: null }))
    expect(bare.review.decisionText).toBeNull()
    expect(bare.review.conditions).toBeNull()
    expect(bare.energy).toBeNull()
    expect(bare.scheme).toBeNull()
    expect(bare.river).toBeNull()
    expect(bare.howSure).toBeNull()
  })

  it('says how sure the figures are in plain sentences from the stored numbers, and that an older run cannot', () => {
    const mc = { seed: 1, draws: 200, energy_MWh: { p90: 8.24, p50: 9.6, p10: 11 }, netLossProbability: 0.2 } as NonNullable<typeof result.uncertainty>
    const sure = buildPublicSummary(sources({ assessment: { ...sources().assessment!, result: { ...result, uncertainty: mc }, acceptableOxygenLoss_mgL: 0 } }))
    expect(sure.howSure).toEqual({
      recordP90Energy_MWh: null, // an entered curve holds no years
      energyP90_MWh: 8.24,
      netLossProbability: 0.2,
      sentences: [
        'In 9 draws of 10 of the uncertain inputs, the scheme would make at least 8.2 MWh in an average year.',
        'In 1 draw of 5 of the uncertain inputs, the river would lose oxygen in its worst month.',
      ],
    })
    // a run without the Monte Carlo or a record (assess alone, an entered curve): nothing to say, and no made-up figure
    expect(s.howSure).toEqual({ recordP90Energy_MWh: null, energyP90_MWh: null, netLossProbability: null, sentences: [] })
    const older = structuredClone(result) as Partial<typeof result>
    delete older.uncertainty
    delete older.years
    const old = buildPublicSummary(sources({ assessment: { ...sources().assessment!, result: older as typeof result } }))
    expect(old.howSure!.sentences).toEqual([expect.stringMatching(/older run/)])
  })
})

describe('summaryLinkState', () => {
  it('is revoked before expired before active', () => {
    const now = '2026-06-01T00:00:00.000Z'
    expect(summaryLinkState({ revoked_at: '2026-01-01T00:00:00.000Z', expires_at: '2025-01-01T00:00:00.000Z' }, now)).toBe('revoked')
    expect(summaryLinkState({ revoked_at: null, expires_at: now }, now)).toBe('expired')
    expect(summaryLinkState({ revoked_at: null, expires_at: '2026-06-01T00:00:00.001Z' }, now)).toBe('active')
  })
})
