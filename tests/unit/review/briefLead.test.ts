// The brief leads with what the officer must see first: the raised flags, the worst month for the
// river, and whether upstream oxygen was measured or stands in (utils/review.ts briefLead), read
// from the brief the server builds out of a stored result (server/domain/review.ts).
import { describe, expect, it } from 'vitest'
import { assess } from '../../../shared/engine/assess'
import { reviewBrief } from '../../../server/domain/review'
import { briefLead } from '../../../utils/review'
import { draft, parse } from '../engine/fixtures'

const d = draft()
const input = parse({ ...d, site: { ...d.site, months: d.site.months.map((m, i) => ({ ...m, upstreamMeasured: i < 3 || i > 9 ? false : true })) } })
const result = assess(input)
const brief = reviewBrief(result, input.reservedFlow, input.settings.acceptableOxygenLoss_mgL)

describe('the lead of the reviewer brief', () => {
  it('carries whether each month\'s upstream oxygen was measured', () => {
    expect(brief.oxygenByMonth.map((m) => m.upstreamMeasured)).toEqual(result.months.map((m) => m.upstreamMeasured))
    expect(brief.oxygenByMonth.filter((m) => !m.upstreamMeasured).map((m) => m.name)).toEqual(['Jan', 'Feb', 'Mar', 'Nov', 'Dec'])
  })

  it('names every raised flag and only those, the worst month for the river, and the months whose upstream oxygen stands in', () => {
    const lead = briefLead(brief)
    expect(lead.raised.map((f) => f.id)).toEqual(result.summary.flags.filter((f) => f.raised).map((f) => f.id))
    const worst = result.months.reduce((w, m) => (m.netGain_mgL < w.netGain_mgL ? m : w))
    expect(lead.worstMonth?.month).toBe(worst.month)
    expect(lead.worstMonth?.netGain_mgL).toBe(worst.netGain_mgL)
    expect(lead.upstream).toEqual({ measured: 7, standIn: ['Jan', 'Feb', 'Mar', 'Nov', 'Dec'] })
  })

  it('takes a month from a brief stored before the flag as measured, as the engine did', () => {
    const old = { ...brief, oxygenByMonth: brief.oxygenByMonth.map(({ upstreamMeasured: _drop, ...m }) => m) }
    expect(briefLead(old).upstream).toEqual({ measured: 12, standIn: [] })
  })
})
