import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import { AuditQuerySchema, OutboxQuerySchema } from '../../shared/schemas/admin'
import { InvitationAcceptSchema, InvitationInputSchema, InvitationListQuerySchema, PasswordResetRequestSchema, PasswordResetSchema } from '../../shared/schemas/invitation'
import { SiteMapQuerySchema } from '../../shared/schemas/siteList'
import { FlowRecordQuerySchema } from '../../shared/schemas/flowRecord'
import { Client, signUp, uniqueEmail } from './client'
import { bodiesFor, expectFieldRefusal, expectSafe, orgRows, queriesFor, queryText, refusedBodies, refuses, show } from './hostile-arbitraries'
import { lastOutboxId, makePeople, outboxSince, siteWithAssessment, testDb, tokenFromMail } from './review-helpers'

// Hostile bodies and queries on invitations (create, accept), password reset (request, new
// password), and the lists with filters (audit trail, outbox, invitations, map, daily flow record):
// never a 5xx, a refused input is a 400 naming its field, and nothing stored changes.

let team: Awaited<ReturnType<typeof makePeople>>
let siteId: number
let inviteToken: string
let resetToken: string
let resetEmail: string

const TABLES = ['invitations', 'memberships', 'site_grants', 'audit_log', 'outbox']
/** Stored rows the auth routes touch (tables without org_id: whole). */
const authRows = () => ({
  users: testDb().prepare('select id, email, name, password_hash from users order by id').all(),
  resets: testDb().prepare('select * from password_resets order by id').all(),
  ...orgRows(team.orgId, TABLES),
})

beforeAll(async () => {
  team = await makePeople('hostile-adm')
  siteId = (await siteWithAssessment(team.engineer.client, team.orgId, 'Hostile admin weir')).siteId
  let mark = lastOutboxId()
  const invited = await team.admin.client.post(`/api/orgs/${team.orgId}/invitations`, { email: uniqueEmail('hostile-invitee'), role: 'viewer' })
  expect(invited.status, show(invited.body)).toBe(201)
  inviteToken = tokenFromMail(outboxSince(mark)[0]!.text, '/invitations')
  const person = await signUp('hostile-reset')
  resetEmail = person.email
  mark = lastOutboxId()
  expect((await new Client().post('/api/auth/password-reset', { email: resetEmail })).status).toBe(202)
  resetToken = tokenFromMail(outboxSince(mark)[0]!.text, '/reset-password')
  const csv = ['date,flow', ...Array.from({ length: 20 }, (_, i) => `2021-03-${String(i + 1).padStart(2, '0')},${1 + i / 10}`)].join('\n')
  expect((await team.engineer.client.upload(`/api/sites/${siteId}/flow-record`, { file: { name: 'flows.csv', type: 'text/csv', data: csv } })).status).toBe(201)
})

describe('hostile bodies on invitation and password-reset routes', () => {
  it('are refused with a 400 naming the field, and change no account, invitation or reset link', async () => {
    const before = authRows()
    const anon = new Client()
    const routes = [
      { label: 'invite', send: (b: unknown) => team.admin.client.request('POST', `/api/orgs/${team.orgId}/invitations`, JSON.stringify(b)), schema: InvitationInputSchema, good: { email: uniqueEmail('hostile-x'), role: 'reviewer', siteId } },
      { label: 'accept', send: (b: unknown) => anon.request('POST', `/api/invitations/${inviteToken}/accept`, JSON.stringify(b)), schema: InvitationAcceptSchema, good: { name: 'New person', password: 'a long enough password' } },
      { label: 'reset request', send: (b: unknown) => anon.request('POST', '/api/auth/password-reset', JSON.stringify(b)), schema: PasswordResetRequestSchema, good: { email: resetEmail } },
      { label: 'new password', send: (b: unknown) => anon.request('POST', `/api/auth/password-reset/${resetToken}`, JSON.stringify(b)), schema: PasswordResetSchema, good: { password: 'another long password' } },
    ]
    for (const route of routes) {
      await fc.assert(
        fc.asyncProperty(refusedBodies(route.schema, bodiesFor(route.good)), async (body) => {
          expectFieldRefusal(await route.send(body), `${route.label} ${show(body)}`, body)
        }),
        { numRuns: 60 },
      )
    }
    expect(authRows()).toEqual(before)
  })

  it('hostile link tokens are a 400 or 404, never a 5xx, and use no link', async () => {
    const before = authRows()
    // Not "." or "..": the client would resolve them away and ask another route.
    const token = fc
      .oneof(fc.string({ minLength: 1, maxLength: 60 }), queryText.filter((t) => t.trim() !== ''), fc.constantFrom('x'.repeat(201), `${inviteToken}x`, inviteToken.slice(1), '%00', '%2e%2e%2f', '"; drop table users; --'))
      .filter((t) => t !== '.' && t !== '..')
    await fc.assert(
      fc.asyncProperty(token, fc.constantFrom('accept', 'reset', 'show'), async (t, which) => {
        const anon = new Client()
        const path = which === 'reset' ? `/api/auth/password-reset/${encodeURIComponent(t)}` : `/api/invitations/${encodeURIComponent(t)}${which === 'accept' ? '/accept' : ''}`
        const res = which === 'show' ? await anon.get(path) : await anon.post(path, { name: 'Someone', password: 'a long enough password' })
        expectSafe(res, `${which} ${show(t)}`)
        expect([400, 404], `${which} ${show(t)} → ${res.status} ${show(res.body)}`).toContain(res.status)
      }),
      { numRuns: 60 },
    )
    expect(authRows()).toEqual(before)
  })
})

describe('hostile queries on the admin and site lists', () => {
  it('are a 200 when the schema takes them and a 400 naming the field when not, never a 5xx', async () => {
    const dates = fc.constantFrom('2021-03-05', '2021-03-31', '2021-02-30', '2021-13-01', '0000-01-01', '9999-12-31', '2021-03-05T10:00', '2021-03-05T25:00Z', '2021-03-05T10:00:00.000+14:00', '20210305', 'today')
    const values = fc.oneof(queryText, fc.string({ maxLength: 20 }), dates, fc.constantFrom('review.', 'site.created', 'invitation', 'site', 'user', 'UPPER', '%', '_', "'", 'invitation', 'password-reset', '1', '200', '201', '9007199254740991'))
    const lists = [
      { path: `/api/orgs/${team.orgId}/audit`, who: team.admin, schema: AuditQuerySchema, keys: ['page', 'pageSize', 'action', 'userId', 'targetType', 'from', 'to'], items: 'entries' },
      { path: `/api/orgs/${team.orgId}/outbox`, who: team.admin, schema: OutboxQuerySchema, keys: ['page', 'pageSize', 'kind'], items: 'messages' },
      { path: `/api/orgs/${team.orgId}/invitations`, who: team.admin, schema: InvitationListQuerySchema, keys: ['page', 'pageSize', 'state'], items: 'invitations' },
      { path: `/api/orgs/${team.orgId}/sites/map`, who: team.viewer, schema: SiteMapQuerySchema, keys: ['q', 'river'], items: 'sites' },
      { path: `/api/sites/${siteId}/flow-record`, who: team.viewer, schema: FlowRecordQuerySchema, keys: ['from', 'to'], items: 'days' },
    ]
    const before = authRows()
    for (const list of lists) {
      await fc.assert(
        fc.asyncProperty(queriesFor(list.keys, values), async ({ query, search }) => {
          const res = await list.who.client.get(`${list.path}?${search}`)
          if (refuses(list.schema, query)) expectFieldRefusal(res, `${list.path}?${search}`)
          else {
            expect(res.status, `${list.path}?${search} ${show(res.body)}`).toBe(200)
            expect(Array.isArray(res.body[list.items])).toBe(true)
          }
        }),
        { numRuns: 60 },
      )
    }
    // A page far past the end is empty, not an error.
    for (const list of lists.slice(0, 3)) {
      const far = await list.who.client.get(`${list.path}?page=9007199254740991&pageSize=200`)
      expect(far.status, show(far.body)).toBe(200)
      expect(far.body[list.items]).toEqual([])
    }
    expect(authRows()).toEqual(before)
  })
})
