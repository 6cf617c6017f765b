// Longer than most files: one recipe per route, so every route of the API is called by every kind of caller.
import { readdirSync, readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import { ACCESS_TABLE, CALLERS, NOT_AUTH_4XX, type Caller, type Expected } from './access-matrix.table'
import { Client, GOOD_PASSWORD, addMember, signUp, uniqueEmail, type Reply, type UploadFile } from './client'
import { latestToken } from './mailbox'
import { createOption, optionBody } from './options-helpers'
import { lastOutboxId, makePeople, outboxSince, siteWithAssessment, tokenFromMail } from './review-helpers'
import { createSite, siteBody } from './sites-helpers'

// The access matrix: every route file under server/api × every kind of caller (access-matrix.table.ts),
// each call made for real against one set of fixtures, every mismatch listed at once. Writes get a
// valid body, so `ok` means the write happened; destructive calls act on a throwaway record made by
// A's admin just before each call.

// ——— routes from the files ———

const API_DIR = join(process.cwd(), 'server/api')
/** The methods a file without a method suffix is called with (it takes every method). */
const ANY_METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const
const METHOD_SUFFIXES = new Set(['get', 'post', 'put', 'patch', 'delete', 'head', 'options', 'connect', 'trace'])

interface RouteFile {
  key: string
  method: string
  pattern: string
  file: string
}

function walk(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((d) => (d.isDirectory() ? walk(join(dir, d.name)) : d.name.endsWith('.ts') ? [join(dir, d.name)] : []))
}

/** `orgs/[orgId]/members/[userId].patch.ts` → PATCH /api/orgs/:orgId/members/:userId; no suffix → every method; `[...]` → `**`. */
function routeOf(file: string): RouteFile[] {
  const rel = relative(API_DIR, file).split(/[\\/]/)
  const parts = rel.pop()!.replace(/\.ts$/, '').split('.')
  const method = parts.length > 1 && METHOD_SUFFIXES.has(parts.at(-1)!) ? parts.pop()!.toUpperCase() : null
  const name = parts.join('.')
  const segments = name === 'index' ? rel : [...rel, name]
  const pattern = '/api' + segments.map((s) => '/' + (s.startsWith('[...') ? '**' : s.replace(/\[(\w+)\]/g, ':$1'))).join('')
  return (method ? [method] : ANY_METHODS).map((m) => ({ key: `${m} ${pattern}`, method: m, pattern, file: relative(process.cwd(), file) }))
}

const ROUTES = walk(API_DIR).flatMap(routeOf)

// ——— fixtures ———

const PNG = Uint8Array.from(Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64'))
/** A year of invented daily flows (m³/s) for A1's flow record. */
const FLOW_CSV =
  'date,flow\n' +
  Array.from({ length: 365 }, (_, i) => {
    const day = new Date(Date.UTC(2021, 0, 1 + i)).toISOString().slice(0, 10)
    return `${day},${(3 + 2 * Math.cos((2 * Math.PI * (i - 30)) / 365)).toFixed(3)}`
  }).join('\n')
const example = (name: string) => JSON.parse(readFileSync(join(process.cwd(), `docs/examples/${name}.request.json`), 'utf8')) as unknown

type Person = { client: Client; email: string; id: number }
let who: Record<Exclude<Caller, 'anonymous'>, Person>
/** Ids and tokens of the fixtures. */
const fx = {} as {
  orgA: number
  orgB: number
  siteA1: number
  siteB1: number
  siteA2: number
  optionA2: number
  optionId: number
  option2Id: number
  assessmentId: number
  commentId: number
  attachmentId: number
  summaryLinkId: number
  summaryToken: string
  invitationId: number
  invitationToken: string
  extraMemberId: number
  orgCAdmin: Client
  orgC: number
  loginPerson: { email: string }
}

/** Throws (failing the fixture) unless `res` has `status`. */
function must<T>(res: Reply<T>, status: number, what: string): Reply<T> {
  if (res.status !== status) throw new Error(`fixture ${what}: expected ${status}, got ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`)
  return res
}

/** Sends an invitation as `admin` of `orgId` and returns its id and the token from its e-mail. */
async function invite(admin: Client, orgId: number, body: { email: string; role: string; siteId?: number }) {
  const before = lastOutboxId()
  const res = must(await admin.post(`/api/orgs/${orgId}/invitations`, body), 201, `invite ${body.email}`)
  const mail = outboxSince(before).find((m) => m.to_address === body.email && m.kind === 'invitation')
  if (!mail) throw new Error(`fixture invite ${body.email}: no invitation e-mail in the outbox`)
  return { id: res.body.id as number, token: tokenFromMail(mail.text, '/invitations') }
}

/** Gives the single-site reviewer a grant on `siteId` the real way: an invitation with a siteId, accepted while signed in. */
async function grantSiteReviewer(siteId: number) {
  const { token } = await invite(who.admin.client, fx.orgA, { email: who.siteReviewer.email, role: 'reviewer', siteId })
  must(await who.siteReviewer.client.post(`/api/invitations/${token}/accept`, {}), 200, `grant on site ${siteId}`)
}

/** A throwaway site of A made by its admin; the single-site reviewer gets a grant on it when they are the caller. */
async function throwawaySite(caller: Caller) {
  const site = await createSite(who.admin.client, fx.orgA, { name: `Throwaway weir for ${caller}` })
  if (caller === 'siteReviewer') await grantSiteReviewer(site.id)
  return site.id
}

const uploadRecord = () => who.admin.client.upload(`/api/sites/${fx.siteA1}/flow-record`, { file: { name: 'a1.csv', type: 'text/csv', data: FLOW_CSV } })
/** A commissioning record of A1 against its assessment. */
const commissioningBody = (caller: Caller) => ({
  assessmentId: fx.assessmentId, measuredAt: '2026-06-01T11:00', measuredBy: `Reading taken for ${caller}`, riverFlow_m3s: 4, waterTemp_C: 12,
  manometerFluid: 'mercury', reading_m: 0.1, upstreamOxygen_mgL: 7, downstreamOxygen_mgL: 8, oxygenMeasuredAt: 'below-weir',
})
const uploadPng = () => who.admin.client.upload(`/api/sites/${fx.siteA1}/attachments`, { file: { name: 'crest.png', type: 'image/png', data: PNG } })
const reviewState = async () => must(await who.admin.client.get(`/api/sites/${fx.siteA1}/review`), 200, 'review state').body.state as string
const submitA1 = async () => must(await who.admin.client.post(`/api/sites/${fx.siteA1}/review/submit`, { assessmentId: fx.assessmentId }), 200, 'submit A1')
/** Puts A1's review in `submitted`, so a decision can be made. */
async function ensureSubmitted() {
  if ((await reviewState()) !== 'submitted') await submitA1()
}
/** Takes A1's review out of `submitted` (sent back), so it can be submitted again. */
async function ensureNotSubmitted() {
  if ((await reviewState()) === 'submitted') {
    must(await who.admin.client.post(`/api/sites/${fx.siteA1}/review/decision`, { decision: 'returned', reason: 'Sent back so it can be submitted again' }), 200, 'return A1')
  }
}

beforeAll(async () => {
  const team = await makePeople('am')
  who = {
    admin: team.admin,
    engineer: team.engineer,
    reviewer: team.reviewer,
    viewer: team.viewer,
    outsider: team.outsider,
    siteReviewer: undefined as unknown as Person,
  }
  fx.orgA = team.orgId
  fx.orgB = team.outsiderOrgId
  const a1 = await siteWithAssessment(team.engineer.client, fx.orgA, 'Matrix weir A1')
  fx.siteA1 = a1.siteId
  fx.optionId = a1.optionId
  fx.assessmentId = a1.assessmentId
  fx.option2Id = (await createOption(team.engineer.client, fx.siteA1, { name: 'Second option' })).id
  fx.siteA2 = (await createSite(team.admin.client, fx.orgA, { name: 'Matrix weir A2' })).id
  fx.optionA2 = (await createOption(team.admin.client, fx.siteA2, { name: 'Option at A2' })).id
  fx.siteB1 = (await createSite(team.outsider.client, fx.orgB, { name: 'Matrix weir B1' })).id
  must(await uploadRecord(), 201, 'flow record of A1')
  fx.attachmentId = must(await uploadPng(), 201, 'attachment of A1').body.id
  fx.commentId = must(await team.admin.client.post(`/api/sites/${fx.siteA1}/comments`, { body: 'Crest level checked against the survey.' }), 201, 'comment').body.id
  const link = must(await team.admin.client.post(`/api/sites/${fx.siteA1}/summary-links`, { expiresIn_d: 30 }), 201, 'summary link').body
  fx.summaryLinkId = link.id
  fx.summaryToken = link.token
  const pending = await invite(team.admin.client, fx.orgA, { email: uniqueEmail('am-pending'), role: 'viewer' })
  fx.invitationId = pending.id
  fx.invitationToken = pending.token

  // The single-site reviewer: accepts A's invitation for A1 only, creating their account.
  const srEmail = uniqueEmail('am-site-reviewer')
  const srInvite = await invite(team.admin.client, fx.orgA, { email: srEmail, role: 'reviewer', siteId: fx.siteA1 })
  const srClient = new Client()
  const accepted = must(await srClient.post(`/api/invitations/${srInvite.token}/accept`, { name: 'Test site reviewer', password: GOOD_PASSWORD }), 200, 'site reviewer accepts')
  who.siteReviewer = { client: srClient, email: srEmail, id: accepted.body.user.id }

  // A member whose role the admin may set, so no caller's role changes; a person to sign in as when signed out.
  const extra = await signUp('am-extra')
  await addMember(team.admin.client, fx.orgA, extra, 'viewer')
  fx.extraMemberId = extra.user.id
  fx.loginPerson = { email: (await signUp('am-login')).email }
  // A third organisation that invites each caller's own address.
  const orgC = await signUp('am-org-c')
  fx.orgCAdmin = orgC.client
  fx.orgC = orgC.orgId

  // The callers are who the table says: the single-site reviewer is no member of A, and each session works.
  const me = must(await srClient.get('/api/me'), 200, 'site reviewer me').body
  expect(me.memberships.map((m: { orgId: number }) => m.orgId)).not.toContain(fx.orgA)
  must(await team.outsider.client.get(`/api/sites/${fx.siteB1}`), 200, 'outsider reads their own site')
  must(await team.viewer.client.get(`/api/sites/${fx.siteA1}`), 200, 'viewer reads A1')
}, 60_000)

// ——— how to call each route ———

interface Call {
  /** Route parameters beyond the defaults (orgId → A, id → the record of its kind on A1…). */
  params?: Record<string, string | number>
  query?: string
  body?: unknown
  /** A multipart upload instead of a JSON body. */
  upload?: Record<string, UploadFile>
}
interface Recipe {
  /** Prepares one call for `caller`: throwaway records, a current version, a fresh token. */
  prepare?: (caller: Caller) => Promise<Call> | Call
  /** `fresh`: call from a new session of the caller (signed in anew), for routes that change the session. */
  session?: 'fresh'
}

/** Default route parameters: each id is the fixture of its kind on site A1 (or of organisation A). */
function defaultParams(pattern: string): Record<string, string | number> {
  const byPrefix: [string, Record<string, string | number>][] = [
    ['/api/orgs/:orgId', { orgId: fx.orgA, userId: fx.extraMemberId }],
    ['/api/sites/:id', { id: fx.siteA1 }],
    ['/api/options/:id', { id: fx.optionId }],
    ['/api/assessments/:id', { id: fx.assessmentId, file: 'summary.csv' }],
    ['/api/attachments/:id', { id: fx.attachmentId }],
    ['/api/summary-links/:id', { id: fx.summaryLinkId }],
    ['/api/public/summary/:token', { token: fx.summaryToken }],
    ['/api/invitations/:key', { key: fx.invitationToken }],
  ]
  return byPrefix.find(([prefix]) => pattern.startsWith(prefix))?.[1] ?? {}
}

function fill(pattern: string, params: Record<string, string | number>): string {
  return pattern
    .replace(/:(\w+)/g, (_, name: string) => {
      if (params[name] === undefined) throw new Error(`no value for :${name}`)
      return encodeURIComponent(String(params[name]))
    })
    .replace('**', 'access-matrix/no-such-route')
}

const siteVersion = async () => must(await who.admin.client.get(`/api/sites/${fx.siteA1}`), 200, 'read A1').body.version as number
const consentVersion = async (kind: string) =>
  (must(await who.admin.client.get(`/api/sites/${fx.siteA1}/consents`), 200, 'read consents').body.consents as { kind: string; version: number }[]).find((c) => c.kind === kind)!.version
const constraintsVersion = async () => must(await who.admin.client.get(`/api/sites/${fx.siteA1}/consents`), 200, 'read consents').body.constraints.version as number
const optionVersion = async () => must(await who.admin.client.get(`/api/options/${fx.optionId}`), 200, 'read option').body.version as number

/** One recipe per table row, in the order they run: reads, then writes, then destructive calls. */
const RECIPES: Record<string, Recipe> = {
  'GET /api/**': {},
  'POST /api/**': {},
  'PUT /api/**': {},
  'PATCH /api/**': {},
  'DELETE /api/**': {},
  'GET /api/health': {},
  'GET /api/me': {},
  'GET /api/orgs/:orgId/members': {},
  'GET /api/orgs/:orgId/audit': {},
  'GET /api/orgs/:orgId/settings': {},
  'GET /api/orgs/:orgId/outbox': {},
  'GET /api/orgs/:orgId/invitations': {},
  'GET /api/orgs/:orgId/summary-links': {},
  'GET /api/orgs/:orgId/portfolio': {},
  'GET /api/orgs/:orgId/options': {},
  'GET /api/orgs/:orgId/sites': {},
  'GET /api/orgs/:orgId/sites/map': {},
  'GET /api/sites/:id': {},
  'GET /api/sites/:id/hydrology': {},
  'GET /api/sites/:id/flow-record': {},
  'GET /api/sites/:id/flow-record.csv': {},
  'GET /api/sites/:id/attachments': {},
  'GET /api/sites/:id/commissioning': {},
  'GET /api/attachments/:id': {},
  'GET /api/sites/:id/options': {},
  'GET /api/sites/:id/consents': {},
  'GET /api/options/:id': {},
  'GET /api/options/:id/assessments': {},
  'GET /api/assessments/:id': {},
  'GET /api/assessments/:id/export/:file': {},
  'GET /api/compare': { prepare: () => ({ query: `options=${fx.optionId},${fx.option2Id}` }) },
  'GET /api/sites/:id/review': {},
  'GET /api/sites/:id/comments': {},
  'GET /api/sites/:id/summary-links': {},
  'GET /api/public/summary/:token': {},
  'POST /api/public/summary/:token': {},
  'PUT /api/public/summary/:token': {},
  'PATCH /api/public/summary/:token': {},
  'DELETE /api/public/summary/:token': { prepare: () => ({ body: undefined }) },
  'GET /api/invitations/:key': {},
  'POST /api/engine/assess': { prepare: () => ({ body: example('assess') }) },
  'POST /api/engine/sweep': { prepare: () => ({ body: example('sweep') }) },
  'POST /api/engine/sensitivity': { prepare: () => ({ body: example('sensitivity') }) },
  'POST /api/options/:id/sweep': { prepare: () => ({ body: { grid: { throatDiameters_m: [0.4, 0.5], units: [1, 2], throatDepths_m: [2.5] } } }) },

  // ——— writes ———
  'POST /api/auth/signup': {
    session: 'fresh',
    prepare: (caller) => ({ body: { name: `Signs up as ${caller}`, email: uniqueEmail('am-signup'), password: GOOD_PASSWORD, organisationName: `Org signed up by ${caller}` } }),
  },
  'POST /api/auth/login': {
    session: 'fresh',
    prepare: (caller) => ({ body: { email: caller === 'anonymous' ? fx.loginPerson.email : who[caller].email, password: GOOD_PASSWORD } }),
  },
  'POST /api/auth/logout': { session: 'fresh' },
  'POST /api/auth/password-reset': { prepare: () => ({ body: { email: uniqueEmail('am-reset-ask') } }) },
  'POST /api/auth/password-reset/:token': {
    prepare: async () => {
      const person = await signUp('am-reset')
      const before = lastOutboxId()
      must(await new Client().post('/api/auth/password-reset', { email: person.email }), 202, 'ask for a reset')
      const mail = outboxSince(before).find((m) => m.to_address === person.email && m.kind === 'password-reset')
      if (!mail) throw new Error('fixture reset: no password-reset e-mail in the outbox')
      return { params: { token: tokenFromMail(mail.text, '/reset-password') }, body: { password: 'a fresh long passphrase' } }
    },
  },
  'POST /api/orgs': { prepare: (caller) => ({ body: { name: `Matrix org of ${caller}` } }) },
  'POST /api/auth/verify-email/:token': {
    prepare: async () => {
      const email = uniqueEmail('am-verify')
      must(await new Client().post('/api/auth/signup', { name: 'Verifies', email, password: GOOD_PASSWORD, organisationName: 'Verify org' }), 202, 'sign up before verifying')
      return { params: { token: latestToken(email, 'verify-email', '/verify-email') } }
    },
  },
  'PATCH /api/me': { prepare: (caller) => ({ body: { lastOrgId: caller === 'outsider' ? fx.orgB : fx.orgA } }) },
  'GET /api/account/sessions': {},
  'DELETE /api/account/sessions/:id': {
    // A second session of the caller, ended from the first.
    prepare: async (caller) => {
      if (caller === 'anonymous') return { params: { id: 1 } }
      must(await new Client().post('/api/auth/login', { email: who[caller].email, password: GOOD_PASSWORD }), 200, `second session of ${caller}`)
      const list = must(await who[caller].client.get('/api/account/sessions'), 200, 'sessions').body.sessions as { id: number; current: boolean }[]
      return { params: { id: list.find((s) => !s.current)!.id } }
    },
  },
  'POST /api/account/sessions/end-others': {},
  'POST /api/account/password': { prepare: () => ({ body: { currentPassword: 'not the current one', newPassword: 'whatever new passphrase' } }) },
  'POST /api/account/verification': {},
  'PATCH /api/orgs/:orgId/members/:userId': { prepare: () => ({ body: { role: 'viewer' } }) },
  'PATCH /api/orgs/:orgId/settings': { prepare: () => ({ body: { currency: { code: 'GBP', symbol: '£' } } }) },
  'POST /api/orgs/:orgId/invitations': { prepare: () => ({ body: { email: uniqueEmail('am-invited'), role: 'viewer' } }) },
  'POST /api/invitations/:key/accept': {
    prepare: async (caller) => {
      const email = caller === 'anonymous' ? uniqueEmail('am-org-c-guest') : who[caller].email
      const { token } = await invite(fx.orgCAdmin, fx.orgC, { email, role: 'viewer' })
      return { params: { key: token }, body: caller === 'anonymous' ? { name: 'New guest of C', password: GOOD_PASSWORD } : {} }
    },
  },
  'POST /api/orgs/:orgId/sites': { prepare: (caller) => ({ body: siteBody({ name: `Matrix weir by ${caller}` }) }) },
  'PATCH /api/sites/:id': { prepare: async (caller) => ({ body: { version: await siteVersion(), notes: `Checked by ${caller}` } }) },
  'POST /api/sites/:id/flow-record': { prepare: () => ({ upload: { file: { name: 'again.csv', type: 'text/csv', data: FLOW_CSV } } }) },
  'POST /api/sites/:id/attachments': { prepare: () => ({ upload: { file: { name: 'pool.png', type: 'image/png', data: PNG } } }) },
  'POST /api/sites/:id/options': { prepare: (caller) => ({ body: optionBody({ name: `Option by ${caller}` }) }) },
  'POST /api/sites/:id/commissioning': { prepare: (caller) => ({ body: commissioningBody(caller) }) },
  'PATCH /api/options/:id': { prepare: async (caller) => ({ body: { version: await optionVersion(), notes: `Tuned by ${caller}` } }) },
  'PATCH /api/sites/:id/consents/:kind': { prepare: async (caller) => ({ params: { kind: 'heritage' }, body: { version: await consentVersion('heritage'), notes: `Listed-building search by ${caller}` } }) },
  'PATCH /api/sites/:id/constraints': { prepare: async () => ({ body: { version: await constraintsVersion(), nearestDwelling_m: 180 } }) },
  'POST /api/options/:id/assessments': { prepare: () => ({ body: {} }) },
  'POST /api/options/:id/sweep/save': { prepare: (caller) => ({ body: { throatDiameter_m: 0.45, units: 2, throatDepth_m: 2.5, name: `Sweep point saved by ${caller}` } }) },
  'POST /api/sites/:id/comments': { prepare: (caller) => ({ body: { body: `Comment from ${caller}`, assessmentId: fx.assessmentId } }) },
  'POST /api/sites/:id/summary-links': { prepare: () => ({ body: { expiresIn_d: 7, note: 'For the landowner' } }) },
  'POST /api/sites/:id/review/submit': {
    prepare: async () => {
      await ensureNotSubmitted()
      return { body: { assessmentId: fx.assessmentId, note: 'Ready for review' } }
    },
  },
  'POST /api/sites/:id/review/decision': {
    prepare: async (caller) => {
      await ensureSubmitted()
      return { body: { decision: 'returned', reason: `Sent back by ${caller}: show the low-flow months` } }
    },
  },
  'GET /api/sites/:id/review/brief': {
    prepare: async () => {
      if ((await reviewState()) === 'draft') await submitA1()
      return {}
    },
  },

  // ——— destructive: each call acts on a fresh record ———
  'DELETE /api/sites/:id/flow-record': {
    prepare: async () => {
      must(await uploadRecord(), 201, 'flow record before delete')
      return {}
    },
  },
  'DELETE /api/attachments/:id': { prepare: async () => ({ params: { id: must(await uploadPng(), 201, 'attachment before delete').body.id } }) },
  'DELETE /api/commissioning/:id': {
    prepare: async (caller) => ({ params: { id: must(await who.admin.client.post(`/api/sites/${fx.siteA1}/commissioning`, commissioningBody(caller)), 201, 'record before delete').body.id } }),
  },
  'DELETE /api/summary-links/:id': {
    prepare: async () => ({ params: { id: must(await who.admin.client.post(`/api/sites/${fx.siteA1}/summary-links`, {}), 201, 'link before revoke').body.id } }),
  },
  'DELETE /api/orgs/:orgId/members/:userId': {
    // A member added just for this call, so each caller removes someone who is still there.
    prepare: async () => {
      const person = await signUp('am-removable')
      await addMember(who.admin.client, fx.orgA, person, 'viewer')
      return { params: { userId: person.user.id } }
    },
  },
  'DELETE /api/invitations/:key': {
    prepare: async () => ({ params: { key: (await invite(who.admin.client, fx.orgA, { email: uniqueEmail('am-revoked'), role: 'viewer' })).id } }),
  },
  'DELETE /api/options/:id': { prepare: async (caller) => ({ params: { id: (await createOption(who.admin.client, fx.siteA1, { name: `Doomed option (${caller})` })).id } }) },
  'DELETE /api/sites/:id': { prepare: async (caller) => ({ params: { id: await throwawaySite(caller) } }) },
  'POST /api/sites/:id/restore': {
    prepare: async (caller) => {
      const id = await throwawaySite(caller)
      must(await who.admin.client.delete(`/api/sites/${id}`), 200, 'delete before restore')
      return { params: { id } }
    },
  },
}

// ——— checks ———

function matches(expected: Expected, status: number): boolean {
  if (status >= 500) return false
  if (expected === 'ok' || expected === 'public') return status >= 200 && status < 300
  if (expected === '4xx-not-auth') return (NOT_AUTH_4XX as readonly number[]).includes(status)
  return status === expected
}

async function clientFor(caller: Caller, session: Recipe['session']): Promise<Client> {
  if (caller === 'anonymous') return new Client()
  if (session !== 'fresh') return who[caller].client
  const client = new Client()
  must(await client.post('/api/auth/login', { email: who[caller].email, password: GOOD_PASSWORD }), 200, `sign in anew as ${caller}`)
  return client
}

const messageOf = (body: unknown) => (body && typeof body === 'object' && 'message' in body ? String((body as { message: unknown }).message) : String(body).slice(0, 200))

describe('access matrix', () => {
  it('has one table row for every route file under server/api, and a route file for every row', () => {
    const found = new Map(ROUTES.map((r) => [r.key, r.file]))
    const problems = [
      ...[...found].filter(([key]) => !(key in ACCESS_TABLE)).map(([key, file]) => `${key} (${file}) has no row in access-matrix.table.ts`),
      ...Object.keys(ACCESS_TABLE).filter((key) => !found.has(key)).map((key) => `${key} is in the table but no file under server/api answers it`),
      ...Object.keys(ACCESS_TABLE).filter((key) => !(key in RECIPES)).map((key) => `${key} has no call recipe in access-matrix.test.ts`),
      ...Object.keys(RECIPES).filter((key) => !(key in ACCESS_TABLE)).map((key) => `${key} has a call recipe but no table row`),
    ]
    expect(problems, problems.join('\n')).toEqual([])
    expect(ROUTES.length).toBeGreaterThan(60)
  })

  it('answers every caller of every route as the table says, and never 5xx', async () => {
    const found = new Set(ROUTES.map((r) => r.key))
    const mismatches: string[] = []
    let calls = 0
    for (const [key, recipe] of Object.entries(RECIPES)) {
      const row = ACCESS_TABLE[key]
      if (!row || !found.has(key)) continue // the first test names these
      const [method, pattern] = key.split(' ') as [string, string]
      for (const caller of CALLERS) {
        const expected = row[caller]
        let res: Reply
        try {
          const call = (await recipe.prepare?.(caller)) ?? {}
          const client = await clientFor(caller, recipe.session)
          const path = fill(pattern, { ...defaultParams(pattern), ...call.params }) + (call.query ? `?${call.query}` : '')
          const body = 'body' in call ? call.body : method === 'GET' || method === 'DELETE' ? undefined : {}
          res = call.upload ? await client.upload(path, call.upload) : await client.request(method, path, body)
        } catch (error) {
          mismatches.push(`${key} as ${caller}: could not make the call: ${(error as Error).message}`)
          continue
        }
        calls++
        if (!matches(expected, res.status)) mismatches.push(`${key} as ${caller}: expected ${expected}, got ${res.status}: ${messageOf(res.body)}`)
      }
    }
    expect(mismatches, `${mismatches.length} of the matrix's cells differ:\n${mismatches.join('\n')}`).toEqual([])
    expect(calls).toBe(Object.keys(ACCESS_TABLE).length * CALLERS.length)
  }, 120_000)

  it('gives the single-site reviewer nothing on another site of the same organisation (404)', async () => {
    const reads = ROUTES.filter((r) => r.method === 'GET' && (r.pattern.startsWith('/api/sites/:id') || r.pattern.startsWith('/api/options/:id')))
    expect(reads.length).toBeGreaterThan(10)
    const wrong: string[] = []
    for (const r of reads) {
      const id = r.pattern.startsWith('/api/options/') ? fx.optionA2 : fx.siteA2
      const res = await who.siteReviewer.client.get(fill(r.pattern, { id }))
      if (res.status !== 404) wrong.push(`${r.key} on A2 as siteReviewer: expected 404, got ${res.status}: ${messageOf(res.body)}`)
    }
    // The same person on A1, where the grant is, does get in: the 404s above are the grant's limit.
    must(await who.siteReviewer.client.get(`/api/sites/${fx.siteA1}`), 200, 'site reviewer reads A1')
    expect(wrong, wrong.join('\n')).toEqual([])
  })
})
