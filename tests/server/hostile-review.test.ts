import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import { CommentInputSchema, CommentListQuerySchema, ReviewDecisionSchema, ReviewSubmitSchema } from '../../shared/schemas/review'
import { SummaryLinkInputSchema, SummaryLinkListQuerySchema } from '../../shared/schemas/summaryLink'
import { bodiesFor, expectFieldRefusal, expectSafe, bodyReaderRefuses, orgRows, queriesFor, refusedBodies, refuses, show } from './hostile-arbitraries'
import { makePeople, siteWithAssessment } from './review-helpers'

// Hostile bodies and queries on the review routes (submit, decision), the comment thread and
// summary links: never a 5xx, a refused body is a 400 naming its field, and nothing stored changes.

let team: Awaited<ReturnType<typeof makePeople>>
let site: Awaited<ReturnType<typeof siteWithAssessment>>

const TABLES = ['site_reviews', 'review_events', 'comments', 'summary_links', 'audit_log', 'outbox']

beforeAll(async () => {
  team = await makePeople('hostile-rv')
  site = await siteWithAssessment(team.engineer.client, team.orgId, 'Hostile review weir')
  // Submitted, so a decision body is read in the state where a good one would be accepted.
  const sub = await team.engineer.client.post(`/api/sites/${site.siteId}/review/submit`, { assessmentId: site.assessmentId, note: 'Please look' })
  expect(sub.status, show(sub.body)).toBe(200)
  expect((await team.engineer.client.post(`/api/sites/${site.siteId}/comments`, { body: 'A first comment', month: 7 })).status).toBe(201)
  expect((await team.engineer.client.post(`/api/sites/${site.siteId}/summary-links`, { expiresIn_d: 10, note: 'For the landowner' })).status).toBe(201)
})

describe('hostile bodies on review, comment and summary-link routes', () => {
  it('are refused with a 400 naming the field, and change nothing stored', async () => {
    const before = orgRows(team.orgId, TABLES)
    const routes = [
      { path: `/api/sites/${site.siteId}/review/decision`, who: team.reviewer, schema: ReviewDecisionSchema, good: { decision: 'accepted-with-conditions', reason: 'Fine', conditions: 'Monitor oxygen' } },
      { path: `/api/sites/${site.siteId}/comments`, who: team.engineer, schema: CommentInputSchema, good: { body: 'Looks right', assessmentId: site.assessmentId, month: 3, flagId: 'cavitation' } },
      { path: `/api/sites/${site.siteId}/summary-links`, who: team.engineer, schema: SummaryLinkInputSchema, good: { expiresIn_d: 30, note: 'For the farm' } },
      { path: `/api/sites/${site.siteId}/review/submit`, who: team.engineer, schema: ReviewSubmitSchema, good: { assessmentId: site.assessmentId, note: 'Again' } },
    ]
    for (const route of routes) {
      await fc.assert(
        fc.asyncProperty(refusedBodies(route.schema, bodiesFor(route.good)), async (body) => {
          const res = await route.who.client.request('POST', route.path, JSON.stringify(body))
          expectFieldRefusal(res, `POST ${route.path} ${show(body)}`, body)
        }),
        { numRuns: 60 },
      )
    }
    expect(orgRows(team.orgId, TABLES)).toEqual(before)
  })

  it('a submit the schema accepts, sent while the site is under review, is a 409 or 422 and changes nothing', async () => {
    const before = orgRows(team.orgId, TABLES)
    const accepted = bodiesFor({ assessmentId: site.assessmentId, note: 'Again' }).filter((b) => !refuses(ReviewSubmitSchema, b) && !bodyReaderRefuses(JSON.stringify(b)))
    await fc.assert(
      fc.asyncProperty(fc.oneof(accepted, fc.record({ assessmentId: fc.integer({ min: 1, max: 2 ** 31 }), note: fc.string({ maxLength: 50 }) })), async (body) => {
        const res = await team.engineer.client.request('POST', `/api/sites/${site.siteId}/review/submit`, JSON.stringify(body))
        expectSafe(res, show(body))
        expect([409, 422], show(res.body)).toContain(res.status)
      }),
      { numRuns: 30 },
    )
    expect(orgRows(team.orgId, TABLES)).toEqual(before)
  })
})

describe('hostile queries on the comment and summary-link lists', () => {
  it('are a 200 when the schema takes them and a 400 naming the field when not, never a 5xx', async () => {
    const lists = [
      { path: `/api/sites/${site.siteId}/comments`, who: team.viewer, schema: CommentListQuerySchema, keys: ['page', 'pageSize'] },
      { path: `/api/sites/${site.siteId}/summary-links`, who: team.engineer, schema: SummaryLinkListQuerySchema, keys: ['page', 'pageSize', 'state'] },
      { path: `/api/orgs/${team.orgId}/summary-links`, who: team.admin, schema: SummaryLinkListQuerySchema, keys: ['page', 'pageSize', 'state'] },
    ]
    const before = orgRows(team.orgId, TABLES)
    for (const list of lists) {
      await fc.assert(
        fc.asyncProperty(queriesFor(list.keys, fc.oneof(fc.constantFrom('active', 'expired', 'revoked', '1', '2', '200', '201'), fc.string({ maxLength: 20 }), fc.constantFrom('9007199254740991', '4611686018427387904', '1e15', '-1', '0', '1.5', 'NaN', 'Infinity', '0x10'))), async ({ query, search }) => {
          const res = await list.who.client.get(`${list.path}?${search}`)
          if (refuses(list.schema, query)) expectFieldRefusal(res, `${list.path}?${search}`)
          else {
            expect(res.status, `${list.path}?${search} ${show(res.body)}`).toBe(200)
            expect(Array.isArray(res.body.comments ?? res.body.links)).toBe(true)
          }
        }),
        { numRuns: 60 },
      )
    }
    // A page far past the end is empty, not an error.
    for (const list of lists) {
      const far = await list.who.client.get(`${list.path}?page=9007199254740991&pageSize=200`)
      expect(far.status, show(far.body)).toBe(200)
      expect(far.body.comments ?? far.body.links).toEqual([])
    }
    expect(orgRows(team.orgId, TABLES)).toEqual(before)
  })
})
