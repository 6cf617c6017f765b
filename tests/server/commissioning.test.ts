import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import { CommissioningInputSchema } from '../../shared/schemas/commissioning'
import type { Client } from './client'
import { bodiesFor, expectFieldRefusal, expectSafe, orgRows, refusedBodies, refuses, show } from './hostile-arbitraries'
import { makePeople, siteWithAssessment } from './review-helpers'
import { createSite } from './sites-helpers'

// Commissioning records: who may add, read and remove them, the 400s naming the field, and the
// verdict stored with the record against the assessment it checks.

let t: Awaited<ReturnType<typeof makePeople>>
let siteId: number
let assessmentId: number

const body = (over: Record<string, unknown> = {}) => ({
  assessmentId,
  measuredAt: '2026-05-12T10:30',
  measuredBy: 'Ada Fellgate',
  riverFlow_m3s: 4,
  waterTemp_C: 14,
  manometerFluid: 'mercury',
  reading_m: 0.1,
  readingUnit: 'm-of-manometer-fluid',
  upstreamOxygen_mgL: 8,
  downstreamOxygen_mgL: 9,
  oxygenMeasuredAt: 'unit-outlet',
  notes: 'Readings taken from the bank platform.',
  ...over,
})
const post = (client: Client, over: Record<string, unknown> = {}, id = siteId) => client.post(`/api/sites/${id}/commissioning`, body(over))

beforeAll(async () => {
  t = await makePeople('comm')
  const s = await siteWithAssessment(t.engineer.client, t.orgId, 'Commissioned weir')
  siteId = s.siteId
  assessmentId = s.assessmentId
}, 60_000)

describe('POST /api/sites/[id]/commissioning', () => {
  it('stores a record with the measured and assessed figures, and a verdict that matches them', async () => {
    const first = await post(t.engineer.client)
    expect(first.status, JSON.stringify(first.body)).toBe(201)
    const r = first.body
    expect(r).toMatchObject({ siteId, assessmentId, measuredBy: 'Ada Fellgate', manometerDensity_kgm3: 13546, oxygenMeasuredAt: 'unit-outlet', enteredBy: { name: t.engineer.name } })
    expect(r.engineVersion).toMatch(/^\d+\.\d+\.\d+$/)
    expect(r.result.assessed.unitsRunning).toBeGreaterThan(0)
    const assessed = r.result.assessed.unitFlow_m3s as number
    const measured = r.result.measured.flow.flow_m3s as number
    expect(r.result.flowVerdict.difference).toBeCloseTo(measured / assessed - 1, 9)

    // Q grows as √h: the reading that gives the assessed flow performs as assessed, 64 % of it is 20 % below.
    const h = 0.1 * (assessed / measured) ** 2
    const same = await post(t.admin.client, { reading_m: h })
    expect(same.status).toBe(201)
    expect(same.body.result.flowVerdict.kind).toBe('as-assessed')
    const low = await post(t.engineer.client, { reading_m: h * 0.64, measuredAt: '2026-05-13T09:00' })
    expect(low.body.result.flowVerdict).toMatchObject({ kind: 'below' })
    expect(low.body.result.flowVerdict.difference).toBeCloseTo(-0.2, 6)

    const list = await t.viewer.client.get(`/api/sites/${siteId}/commissioning`)
    expect(list.status).toBe(200)
    expect(list.body.records[0].id).toBe(low.body.id)
    expect(list.body.assessments.map((a: { assessmentId: number }) => a.assessmentId)).toContain(assessmentId)
    expect(list.body.assessments[0]).toMatchObject({ throatDiameter_m: expect.any(Number), dischargeCoefficient: expect.any(Number) })
  })

  it('answers 400 naming each bad field', async () => {
    const bad = await post(t.engineer.client, { reading_m: 0 })
    expect(bad.status).toBe(400)
    expect(bad.body.message).toBe('reading_m: must be more than 0')
    const many = await post(t.engineer.client, { measuredBy: ' ', waterTemp_C: 50, manometerFluid: 'custom', measuredAt: 'yesterday' })
    expect(many.status).toBe(400)
    const paths = many.body.data.issues.map((i: { path: string }) => i.path)
    expect(paths).toEqual(expect.arrayContaining(['measuredAt', 'measuredBy', 'waterTemp_C', 'manometerDensity_kgm3']))
    const nearWater = await post(t.engineer.client, { manometerFluid: 'custom', manometerDensity_kgm3: 1000 })
    expect(nearWater.body.message).toMatch(/^manometerDensity_kgm3: must be below 950/)
  })

  it('answers 422 naming the field for an upstream at saturation and for another site\'s assessment', async () => {
    const saturated = await post(t.engineer.client, { upstreamOxygen_mgL: 14, downstreamOxygen_mgL: 14 })
    expect(saturated.status).toBe(422)
    expect(saturated.body.message).toMatch(/^upstreamOxygen_mgL: is at or above saturation/)
    const otherSite = await createSite(t.engineer.client, t.orgId, { name: 'Other weir' })
    const elsewhere = await post(t.engineer.client, {}, otherSite.id)
    expect(elsewhere.status).toBe(422)
    expect(elsewhere.body.message).toMatch(/^assessmentId: /)
  })

  it('lets engineers and admins write, reviewers and viewers read only, and hides the site from outsiders', async () => {
    expect((await post(t.reviewer.client)).status).toBe(403)
    expect((await post(t.viewer.client)).status).toBe(403)
    expect((await post(t.outsider.client)).status).toBe(404)
    expect((await t.outsider.client.get(`/api/sites/${siteId}/commissioning`)).status).toBe(404)
    expect((await t.reviewer.client.get(`/api/sites/${siteId}/commissioning`)).status).toBe(200)
  })
})

describe('hostile bodies', () => {
  it('a body the schema refuses is a 400 naming its field and stores nothing; one it accepts is stored or refused with a 4xx, never a 5xx', async () => {
    const tables = ['commissioning_records']
    const before = orgRows(t.orgId, tables)
    await fc.assert(
      fc.asyncProperty(refusedBodies(CommissioningInputSchema, bodiesFor(body())), async (b) => {
        const res = await t.engineer.client.request('POST', `/api/sites/${siteId}/commissioning`, JSON.stringify(b))
        expectFieldRefusal(res, show(b), b)
      }),
      { numRuns: 60 },
    )
    expect(orgRows(t.orgId, tables)).toEqual(before)
    // Accepted bodies at the edges of every range: the engine answers or refuses a field, never fails.
    const edge = (min: number, max: number) => fc.oneof(fc.constantFrom(min, max), fc.double({ min, max, noNaN: true }))
    const accepted = fc.record({
      riverFlow_m3s: edge(1e-6, 1_000_000), waterTemp_C: edge(0, 40), reading_m: edge(1e-6, 20),
      upstreamOxygen_mgL: edge(0, 30), downstreamOxygen_mgL: edge(0, 30), upstreamTapDiameter_m: fc.oneof(fc.constant(null), edge(1e-6, 20)),
      dischargeCoefficient: fc.oneof(fc.constant(null), edge(1e-6, 1)), manometerFluid: fc.constantFrom('mercury', 'gauge-oil', 'water'),
      readingUnit: fc.constantFrom('m-of-water', 'm-of-manometer-fluid'), oxygenMeasuredAt: fc.constantFrom('unit-outlet', 'below-weir'),
    }).map((over) => body(over)).filter((b) => !refuses(CommissioningInputSchema, b))
    await fc.assert(
      fc.asyncProperty(accepted, async (b) => {
        const res = await t.engineer.client.request('POST', `/api/sites/${siteId}/commissioning`, JSON.stringify(b))
        expectSafe(res, show(b))
        expect([201, 422], show(res.body)).toContain(res.status)
        if (res.status === 201) {
          const r = res.body.result
          for (const x of [r.measured.flow.flow_m3s, r.measured.oxygen.deficitClosed, r.measured.oxygen.saturation_mgL, r.assessed.unitFlow_m3s, r.assessed.downstreamOxygen_mgL]) expect(Number.isFinite(x), show(r)).toBe(true)
        }
      }),
      { numRuns: 25 },
    )
  })
})

describe('the latest record in the reviewer\'s brief and the landowner summary', () => {
  it('shows the newest measurement\'s verdicts in a line', async () => {
    const site = await siteWithAssessment(t.engineer.client, t.orgId, 'Briefed weir')
    const link = await t.engineer.client.post(`/api/sites/${site.siteId}/summary-links`, { expiresIn_d: 7 })
    const before = await t.engineer.client.get(`/api/public/summary/${link.body.token}`)
    expect(before.body.commissioning).toBeNull()
    const made = await post(t.engineer.client, { assessmentId: site.assessmentId, measuredAt: '2026-05-12T10:30' }, site.siteId)
    expect(made.status).toBe(201)
    expect((await t.engineer.client.post(`/api/sites/${site.siteId}/review/submit`, { assessmentId: site.assessmentId })).status).toBe(200)
    const brief = await t.reviewer.client.get(`/api/sites/${site.siteId}/review/brief`)
    expect(brief.status).toBe(200)
    expect(brief.body.commissioning).toMatchObject({ measuredAt: '2026-05-12T10:30', measuredBy: 'Ada Fellgate', flow: made.body.result.flowVerdict, oxygen: made.body.result.oxygenVerdict })
    expect(brief.body.commissioning.sentence).toMatch(/^Measured on 12 May 2026: /)
    const after = await t.engineer.client.get(`/api/public/summary/${link.body.token}`)
    expect(after.body.commissioning).toBe(brief.body.commissioning.sentence)
  })
})

describe('DELETE /api/commissioning/[id]', () => {
  it('marks the record deleted for engineers and admins, 403 for a reviewer, 404 after', async () => {
    const made = await post(t.engineer.client, { measuredAt: '2026-04-01T08:00' })
    const id = made.body.id as number
    expect((await t.reviewer.client.delete(`/api/commissioning/${id}`)).status).toBe(403)
    expect((await t.outsider.client.delete(`/api/commissioning/${id}`)).status).toBe(404)
    const gone = await t.engineer.client.delete(`/api/commissioning/${id}`)
    expect(gone.status).toBe(200)
    expect((await t.engineer.client.delete(`/api/commissioning/${id}`)).status).toBe(404)
    const list = await t.engineer.client.get(`/api/sites/${siteId}/commissioning`)
    expect(list.body.records.map((r: { id: number }) => r.id)).not.toContain(id)
    const log = await t.admin.client.get(`/api/orgs/${t.orgId}/audit?pageSize=200`)
    const actions = log.body.entries.map((e: { action: string }) => e.action)
    expect(actions).toEqual(expect.arrayContaining(['commissioning.recorded', 'commissioning.deleted']))
  })
})
