import { beforeAll, describe, expect, it } from 'vitest'
import { makePeople, siteWithAssessment } from './review-helpers'
import type { Client } from './client'

// An outsider must not learn whether an id exists in someone else's organisation: the 404 for an
// existing record of another organisation reads exactly like the 404 for an id that does not exist.
let outsider: Client
let ids: { siteId: number; optionId: number; assessmentId: number; linkId: number; invitationId: number }
const MISSING = 987654

beforeAll(async () => {
  const people = await makePeople('no-leak')
  outsider = people.outsider.client
  const made = await siteWithAssessment(people.engineer.client, people.orgId)
  const link = await people.engineer.client.post(`/api/sites/${made.siteId}/summary-links`, { expiresIn_d: 5 })
  expect(link.status).toBe(201)
  const invite = await people.admin.client.post(`/api/orgs/${people.orgId}/invitations`, { email: 'someone-new@test.example', role: 'viewer' })
  expect(invite.status).toBe(201)
  ids = { ...made, linkId: link.body.link?.id ?? link.body.id, invitationId: invite.body.invitation?.id ?? invite.body.id }
  expect(ids.linkId).toEqual(expect.any(Number))
  expect(ids.invitationId).toEqual(expect.any(Number))
})

describe('404 messages for another organisation\'s records', () => {
  it('match the message for a missing id, route by route', async () => {
    const routes: [string, (id: number) => string, keyof typeof ids][] = [
      ['GET', (id) => `/api/sites/${id}`, 'siteId'],
      ['GET', (id) => `/api/sites/${id}/hydrology`, 'siteId'],
      ['GET', (id) => `/api/options/${id}`, 'optionId'],
      ['GET', (id) => `/api/options/${id}/assessments`, 'optionId'],
      ['GET', (id) => `/api/assessments/${id}`, 'assessmentId'],
      ['DELETE', (id) => `/api/summary-links/${id}`, 'linkId'],
      ['DELETE', (id) => `/api/invitations/${id}`, 'invitationId'],
    ]
    for (const [method, path, key] of routes) {
      const theirs = await outsider.request(method, path(ids[key]))
      const missing = await outsider.request(method, path(MISSING))
      expect(theirs.status, path(ids[key])).toBe(404)
      expect(missing.status, path(MISSING)).toBe(404)
      expect(theirs.body.message, `${method} ${path(ids[key])}`).toBe(missing.body.message)
    }
  })
})
