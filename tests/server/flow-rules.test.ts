// Flow rules on a site (hands-off flow, maximum take, share kept, pass flow): stored, returned, refused
// with a 400 naming the field, carried into a stored assessment, whose result shows the depleted reach.
import { beforeAll, describe, expect, it } from 'vitest'
import { createAssessment, createOption } from './options-helpers'
import { createSite, makeTeam, siteBody } from './sites-helpers'

let team: Awaited<ReturnType<typeof makeTeam>>

beforeAll(async () => {
  team = await makeTeam('flow-rules')
})

const HIGH = { preset: 'high-sensitivity', maxTake: { kind: 'mean-multiple', multiple: 1 }, keptShare_pct: 50, passFlow_m3s: 0 }

describe('flow rules on a site', () => {
  it('a new site without flow rules gets the rules that change nothing', async () => {
    const site = await createSite(team.engineer, team.orgId)
    expect(site.flowRules).toEqual({ preset: 'none', maxTake: { kind: 'none' }, keptShare_pct: 0, passFlow_m3s: 0 })
  })

  it('stores rules given at creation and by PATCH, and returns them', async () => {
    const site = await createSite(team.engineer, team.orgId, { flowRules: HIGH, reservedFlow: { kind: 'percentile', exceedance: 80 } })
    expect(site.flowRules).toEqual(HIGH)
    const custom = { ...HIGH, preset: 'custom', passFlow_m3s: 0.2 }
    const res = await team.engineer.patch(`/api/sites/${site.id}`, { version: site.version, flowRules: custom })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const again = await team.viewer.get(`/api/sites/${site.id}`)
    expect(again.body.flowRules).toEqual(custom)
    expect(again.body.reservedFlow).toEqual({ kind: 'percentile', exceedance: 80 })
  })

  it('answers 400 naming the field for bad rules, and keeps what was stored', async () => {
    const site = await createSite(team.engineer, team.orgId, { flowRules: HIGH })
    const cases: [Record<string, unknown>, string][] = [
      [{ ...HIGH, keptShare_pct: 120 }, 'flowRules.keptShare_pct: must be between 0 and 100'],
      [{ ...HIGH, keptShare_pct: -1 }, 'flowRules.keptShare_pct: must be between 0 and 100'],
      [{ ...HIGH, passFlow_m3s: -0.5 }, 'flowRules.passFlow_m3s: must be 0 or more'],
      [{ ...HIGH, maxTake: { kind: 'fixed', flow_m3s: 'lots' } }, 'flowRules.maxTake.flow_m3s: must be a number'],
      [{ ...HIGH, maxTake: { kind: 'mean-multiple', multiple: 11 } }, 'flowRules.maxTake.multiple: must be between 0 and 10'],
      [{ ...HIGH, maxTake: { kind: 'forever' } }, "flowRules.maxTake.kind: must be 'none', 'fixed' or 'mean-multiple'"],
      [{ ...HIGH, preset: 'strict' }, "flowRules.preset: must be 'none', 'low-sensitivity', 'high-sensitivity' or 'custom'"],
    ]
    for (const [flowRules, message] of cases) {
      const res = await team.engineer.patch(`/api/sites/${site.id}`, { version: site.version, flowRules })
      expect(res.status, message).toBe(400)
      expect(res.body.message).toBe(message)
      const created = await team.engineer.post(`/api/orgs/${team.orgId}/sites`, siteBody({ flowRules }))
      expect(created.status, message).toBe(400)
      expect(created.body.message).toBe(message)
    }
    const stored = await team.viewer.get(`/api/sites/${site.id}`)
    expect(stored.body.flowRules).toEqual(HIGH)
    expect(stored.body.version).toBe(site.version)
  })

  it('a stored assessment runs under the site\'s rules and shows the depleted reach', async () => {
    const site = await createSite(team.engineer, team.orgId, { flowRules: { ...HIGH, preset: 'custom', passFlow_m3s: 0.1 } })
    const option = await createOption(team.engineer, site.id)
    const a = await createAssessment(team.engineer, option.id)
    expect(a.input.flowRules).toEqual({ ...HIGH, preset: 'custom', passFlow_m3s: 0.1 })
    const reach = a.result.depletedReach
    expect(reach.keptShare_pct).toBe(50)
    expect(reach.passFlow_m3s).toBe(0.1)
    expect(reach.curve).toHaveLength(13)
    for (const row of reach.curve) expect(row.withScheme_m3s).toBeLessThanOrEqual(row.natural_m3s)
    // half of the flow above the hands-off and pass flows always stays: never the hands-off flow alone
    expect(reach.annualHandsOffOnly_d).toBe(0)
    const csv = new TextDecoder().decode((await team.viewer.download(`/api/assessments/${a.id}/export/depletedReach.csv`)).bytes).trim().split(/\r\n/)
    expect(csv[0]).toBe('Exceedance (% of time),River flow without the scheme (m³/s),Flow over the weir with the scheme (m³/s)')
    expect(csv).toHaveLength(14)
  })
})
