import { beforeAll, describe, expect, it } from 'vitest'
import { createAssessment, createOption } from './options-helpers'
import { lastOutboxId, makePeople, outboxSince, siteWithAssessment } from './review-helpers'

// A site's consents and constraints list over HTTP: every kind listed, who may read and change it,
// refusals naming the field, the version check, another organisation's site, the noise and eel
// checks from the option and its stored assessment, and a review decision requiring permissions.

let team: Awaited<ReturnType<typeof makePeople>>
let site: Awaited<ReturnType<typeof siteWithAssessment>>
const list = (siteId = site.siteId) => `/api/sites/${siteId}/consents`

beforeAll(async () => {
  team = await makePeople('cn')
  site = await siteWithAssessment(team.engineer.client, team.orgId, 'Consents weir')
})

describe('the consents list', () => {
  it('lists every kind, unsaved ones not started, for every role of the organisation', async () => {
    for (const who of ['admin', 'engineer', 'reviewer', 'viewer'] as const) {
      const res = await team[who].client.get(list())
      expect(res.status, who).toBe(200)
      expect(res.body.consents).toHaveLength(11)
      expect(res.body.canEdit, who).toBe(who === 'admin' || who === 'engineer')
    }
    const res = await team.viewer.client.get(list())
    expect(res.body.consents[0]).toMatchObject({ kind: 'abstraction-licence', status: 'not-started', statusLabel: 'Not started', version: 0 })
    expect(res.body.counts['not-started']).toBe(11)
    expect(res.body.gaugingWarning).toBeNull()
  })

  it('answers 404 to someone outside the organisation, for reading and changing', async () => {
    expect((await team.outsider.client.get(list())).status).toBe(404)
    expect((await team.outsider.client.patch(`${list()}/heritage`, { version: 0, status: 'applied' })).status).toBe(404)
  })

  it('lets engineers and admins change a permission, and refuses reviewers and viewers with 403', async () => {
    expect((await team.reviewer.client.patch(`${list()}/landowner`, { version: 0, status: 'granted' })).status).toBe(403)
    expect((await team.viewer.client.patch(`${list()}/landowner`, { version: 0, status: 'granted' })).status).toBe(403)
    const res = await team.engineer.client.patch(`${list()}/flood-risk-permit`, { version: 0, status: 'applied', appliedOn: '2026-03-02', reference: 'FRP/0042' })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ kind: 'flood-risk-permit', status: 'applied', appliedOn: '2026-03-02', reference: 'FRP/0042', version: 1 })
    expect(res.body.updatedBy.id).toBe(team.engineer.id)
    const again = await team.admin.client.patch(`${list()}/flood-risk-permit`, { version: 1, status: 'granted-with-conditions', decidedOn: '2026-04-10', conditions: 'No works in March.' })
    expect(again.status).toBe(200)
    expect(again.body).toMatchObject({ status: 'granted-with-conditions', appliedOn: '2026-03-02', decidedOn: '2026-04-10', version: 2 })
    const read = await team.viewer.client.get(list())
    expect(read.body.consents.find((c: { kind: string }) => c.kind === 'flood-risk-permit')).toMatchObject({ status: 'granted-with-conditions', reference: 'FRP/0042', conditions: 'No works in March.' })
  })

  it('answers 409 with the current version when someone else saved since', async () => {
    const first = await team.engineer.client.patch(`${list()}/heritage`, { version: 0, notes: 'Not listed.' })
    expect(first.status).toBe(200)
    const stale = await team.admin.client.patch(`${list()}/heritage`, { version: 0, status: 'not-needed' })
    expect(stale.status).toBe(409)
    expect(stale.body.message).toMatch(/^version: /)
    expect(stale.body.data.currentVersion).toBe(1)
    expect((await team.viewer.client.get(list())).body.consents.find((c: { kind: string }) => c.kind === 'heritage').status).toBe('not-started')
  })

  it('refuses bad input with 400 naming the field, and an unknown kind', async () => {
    const badDate = await team.engineer.client.patch(`${list()}/noise`, { version: 0, appliedOn: '2026-13-01' })
    expect(badDate.status).toBe(400)
    expect(badDate.body.message).toMatch(/^appliedOn: /)
    const order = await team.engineer.client.patch(`${list()}/noise`, { version: 0, appliedOn: '2026-05-02', decidedOn: '2026-05-01' })
    expect(order.status).toBe(400)
    expect(order.body.message).toMatch(/^decidedOn: must not be before/)
    const status = await team.engineer.client.patch(`${list()}/noise`, { version: 0, status: 'maybe' })
    expect(status.status).toBe(400)
    expect(status.body.message).toMatch(/^status: /)
    const noVersion = await team.engineer.client.patch(`${list()}/noise`, { status: 'applied' })
    expect(noVersion.status).toBe(400)
    expect(noVersion.body.message).toMatch(/^version: /)
    const kind = await team.engineer.client.patch(`${list()}/planning`, { version: 0, status: 'applied' })
    expect(kind.status).toBe(400)
    expect(kind.body.message).toMatch(/^kind: /)
  })

  it('refuses a decision date before the stored application date with 422 naming decidedOn', async () => {
    // flood-risk-permit was applied for on 2026-03-02 above
    const cur = (await team.engineer.client.get(list())).body.consents.find((c: { kind: string }) => c.kind === 'flood-risk-permit')
    const res = await team.engineer.client.patch(`${list()}/flood-risk-permit`, { version: cur.version, decidedOn: '2026-01-01' })
    expect(res.status).toBe(422)
    expect(res.body.message).toMatch(/^decidedOn: must not be before the application date \(2026-03-02\)/)
  })
})

describe('the checks', () => {
  it('works out eel screening from the stored assessment and the noise at the dwelling from the option', async () => {
    const before = (await team.engineer.client.get(list())).body
    expect(before.eelScreening.triggered).toBe(true)
    expect(before.eelScreening.message).toMatch(/^triggered: diverts up to [\d,]+ m³ a day$/)
    expect(before.noise.check).toBeNull()
    expect(before.noise.missing).toMatch(/sound power/)

    const option = await createOption(team.engineer.client, site.siteId, { name: 'Quiet pair', design: { turbine: { soundPower_dBA: 95 } } })
    await createAssessment(team.engineer.client, option.id)
    const c = await team.engineer.client.patch(`/api/sites/${site.siteId}/constraints`, { version: 0, nearestDwelling_m: 150, isGaugingStation: true })
    expect(c.status, JSON.stringify(c.body)).toBe(200)
    expect(c.body).toMatchObject({ nearestDwelling_m: 150, noiseLimit_dBA: null, isGaugingStation: true, version: 1 })
    const after = (await team.viewer.client.get(list())).body
    expect(after.scheme.optionName).toBe('Quiet pair')
    // two 95 dB(A) turbines at 150 m: 95 + 10·lg 2 − (20·lg 150 + 11) = 43.49 dB(A) (ISO 9613-2:1996, 7.1)
    expect(after.noise.check.atDwelling_dBA).toBeCloseTo(43.49, 2)
    expect(after.noise).toMatchObject({ limit_dBA: 40, limitIsDefault: true })
    expect(after.noise.check.aboveLimit).toBe(true)
    expect(after.gaugingWarning).toMatch(/gauging station/)
  })

  it('refuses a bad dwelling distance naming the field, a stale version with 409, and a reviewer with 403', async () => {
    const bad = await team.engineer.client.patch(`/api/sites/${site.siteId}/constraints`, { version: 1, nearestDwelling_m: -3 })
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^nearestDwelling_m: /)
    expect((await team.engineer.client.patch(`/api/sites/${site.siteId}/constraints`, { version: 0, noiseLimit_dBA: 35 })).status).toBe(409)
    expect((await team.reviewer.client.patch(`/api/sites/${site.siteId}/constraints`, { version: 1, noiseLimit_dBA: 35 })).status).toBe(403)
  })

  it('refuses an option sound power outside 40–140 dB(A), naming the field', async () => {
    const res = await team.engineer.client.post(`/api/sites/${site.siteId}/options`, { name: 'Too loud', design: { units: 1, throatDiameter_m: 0.5, outletDiameter_m: 1, throatDepth_m: 2.5, air: { pipeDiameter_m: 0.4, pipeLength_m: 8 }, turbine: { soundPower_dBA: 200 } } })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^design\.turbine\.soundPower_dBA: /)
  })
})

describe('a review decision requiring permissions', () => {
  it('stores the kinds with the decision and shows the consents in the brief', async () => {
    const sub = await team.engineer.client.post(`/api/sites/${site.siteId}/review/submit`, { assessmentId: site.assessmentId })
    expect(sub.status).toBe(200)
    const brief = await team.reviewer.client.get(`/api/sites/${site.siteId}/review/brief`)
    expect(brief.status).toBe(200)
    expect(brief.body.consents.counts['granted-with-conditions']).toBe(1)
    expect(brief.body.consents.outstanding).toContain('Landowner consent')
    expect(brief.body.consents.gaugingWarning).toMatch(/gauging station/)
    const bad = await team.reviewer.client.post(`/api/sites/${site.siteId}/review/decision`, { decision: 'accepted', reason: 'Fine', requiredConsents: ['planning'] })
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^requiredConsents\.0: /)
    const mailedBefore = lastOutboxId()
    const res = await team.reviewer.client.post(`/api/sites/${site.siteId}/review/decision`, { decision: 'accepted', reason: 'Fine once the landowner agrees', requiredConsents: ['landowner'] })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.event.requiredConsents).toEqual(['landowner'])
    const review = await team.viewer.client.get(`/api/sites/${site.siteId}/review`)
    expect(review.body.decision.requiredConsents).toEqual(['landowner'])
    const mail = outboxSince(mailedBefore).find((m) => m.kind === 'review-decided')
    expect(mail?.text).toContain('The decision requires: landowner consent granted.')
  })
})
