// Heads from the weir's hydraulics through the API: a bad body names the field, a good one is stored, and an
// assessment of the site takes its gross head, tail and throat depth from the hydraulics at each flow.
import { beforeAll, describe, expect, it } from 'vitest'
import { createAssessment, createOption } from './options-helpers'
import { createSite, makeTeam, siteBody } from './sites-helpers'

let team: Awaited<ReturnType<typeof makeTeam>>
const weir = { grossHead_m: 1.6, crestWidth_m: 22, shape: 'sharp-crested-vertical-face', waterQuality: 'clean' }
const hydraulics = { crestHeight_m: 1.9, dischargeCoefficient: null, tail: { kind: 'manning', channelWidth_m: 14, bedSlope: 0.0015, roughnessN: 0.04 } }

beforeAll(async () => {
  team = await makeTeam('weir-hydraulics')
})

describe('the weir hydraulics of a site', () => {
  it('answers 400 naming the field for a bad value, on create and on change', async () => {
    const bad = await team.engineer.post(`/api/orgs/${team.orgId}/sites`, siteBody({ weir: { ...weir, hydraulics: { ...hydraulics, tail: { ...hydraulics.tail, roughnessN: 0.5 } } } }))
    expect(bad.status).toBe(400)
    expect(bad.body.message).toBe('weir.hydraulics.tail.roughnessN: must be between 0.01 and 0.2')

    const site = await createSite(team.engineer, team.orgId, { weir })
    const cases: [unknown, RegExp][] = [
      [{ ...hydraulics, crestHeight_m: -1 }, /^weir\.hydraulics\.crestHeight_m:/],
      [{ ...hydraulics, tail: { kind: 'weir' } }, /^weir\.hydraulics\.tail\.kind: must be 'manning' or 'table'/],
      [{ ...hydraulics, tail: { kind: 'table', rows: [{ flow_m3s: 5, depth_m: 1 }] } }, /^weir\.hydraulics\.tail\.rows:/],
      [{ ...hydraulics, tail: { kind: 'table', rows: [{ flow_m3s: 5, depth_m: 1 }, { flow_m3s: 2, depth_m: 1.2 }] } }, /^weir\.hydraulics\.tail\.rows\.1\.flow_m3s:/],
      [{ ...hydraulics, dischargeCoefficient: 3 }, /^weir\.hydraulics\.dischargeCoefficient:/],
    ]
    for (const [h, message] of cases) {
      const res = await team.engineer.patch(`/api/sites/${site.id}`, { version: site.version, weir: { ...weir, hydraulics: h } })
      expect(res.status, JSON.stringify(h)).toBe(400)
      expect(res.body.message, JSON.stringify(h)).toMatch(message)
    }
  })

  it('stores good hydraulics, and an assessment takes each flow\'s heads from them', async () => {
    const site = await createSite(team.engineer, team.orgId, { weir: { ...weir, hydraulics } })
    expect((site.weir as { hydraulics: unknown }).hydraulics).toEqual(hydraulics)
    const option = await createOption(team.engineer, site.id, { name: 'Hydraulic heads' })
    const a = await createAssessment(team.engineer, option.id)
    const rows = a.result.perFlow as { grossHead_m: number, tailDepth_m: number | null, throatDepth_m: number, weirDrowned: boolean }[]
    expect(rows.every((r) => r.tailDepth_m !== null && r.tailDepth_m > 0)).toBe(true)
    const heads = rows.map((r) => r.grossHead_m)
    expect(Math.max(...heads) - Math.min(...heads)).toBeGreaterThan(0.2)
    expect(new Set(rows.map((r) => r.throatDepth_m)).size).toBeGreaterThan(1)
    expect(a.input.site.hydraulics).toEqual(hydraulics)

    // back to the head table: the hydraulics are cleared and every flow has the gross head again
    const patched = await team.engineer.patch(`/api/sites/${site.id}`, { version: site.version, weir: { ...weir, hydraulics: null } })
    expect(patched.status).toBe(200)
    expect(patched.body.weir.hydraulics).toBeNull()
  })
})
