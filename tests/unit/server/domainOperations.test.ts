import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { migrateToLatest, openDatabase } from '../../../db/connection'
import { DEMO_ACCOUNTS, DEMO_SITES } from '../../../db/demo-scenario'
import { seedDemo } from '../../../db/seed'
import { DomainError } from '../../../server/domain/errors'
import type { Mailer, MailMessage } from '../../../server/domain/mail/outbox'
import { loadPortfolio } from '../../../server/domain/portfolio'
import { decideReview, submitReview } from '../../../server/domain/reviewRecords'
import { createSite, listSites, siteMapPoints, updateSite } from '../../../server/domain/sites'
import { SiteListQuerySchema } from '../../../shared/schemas/siteList'
import { PortfolioQuerySchema } from '../../../shared/schemas/portfolio'

// Domain operations run against an in-memory SQLite database with the migrations and the demo
// scenario, with no server: the site text filter every list shares, the optimistic version check,
// and the review state machine as stored.

let db: ReturnType<typeof openDatabase>
let orgId: number
beforeEach(async () => {
  db = openDatabase(':memory:')
  await migrateToLatest(db)
  orgId = (await seedDemo(db, async (pw) => `fake:${pw}`)).orgId
}, 60_000) // the demo stores a real assessment, Monte Carlo included, for each of its options
afterEach(async () => {
  await db.destroy()
})

const person = (role: string) => db.selectFrom('users').innerJoin('memberships', 'memberships.user_id', 'users.id').select(['users.id', 'users.name']).where('memberships.role', '=', role as never).where('users.email', '=', DEMO_ACCOUNTS.find((a) => a.role === role)!.email).executeTakeFirstOrThrow()

/** A mailer that keeps what it is given. */
function keepingMailer(): Mailer & { sent: MailMessage[] } {
  const sent: MailMessage[] = []
  return { sent, queue: async (m) => (sent.push(m), { outboxId: 0, delivery: Promise.resolve({ outboxId: 0, sent: false, error: null }) }), link: (p) => `http://app.example${p}` }
}

describe('the site text filter', () => {
  it('finds text in the site or river name, any case, with % and _ taken literally, in the list, the map and the portfolio alike', async () => {
    const base = DEMO_SITES[0]!.site
    await createSite(db, { orgId, userId: null, input: { ...base, name: 'Mill 100% weir', riverName: 'Test Beck' } })
    await createSite(db, { orgId, userId: null, input: { ...base, name: 'Mill 1000 weir', riverName: 'Test Beck' } })
    await createSite(db, { orgId, userId: null, input: { ...base, name: 'Under_score weir', riverName: 'Test Beck' } })
    await createSite(db, { orgId, userId: null, input: { ...base, name: 'Underxscore weir', riverName: 'Test Beck' } })
    const names = async (q: string) => {
      const list = (await listSites(db, orgId, SiteListQuerySchema.parse({ q, pageSize: '200' }))).sites.map((s) => s.name).sort()
      const map = (await siteMapPoints(db, orgId, { q })).map((s) => s.name).sort()
      const { format: _f, ...query } = PortfolioQuerySchema.parse({ q, pageSize: '200' })
      const portfolio = (await loadPortfolio(db, orgId, query, 'page')).rows.map((r) => r.name).sort()
      expect(map).toEqual(list)
      expect(portfolio).toEqual(list)
      return list
    }
    expect(await names('100%')).toEqual(['Mill 100% weir'])
    expect(await names('under_')).toEqual(['Under_score weir'])
    expect(await names('test BECK')).toEqual(['Mill 100% weir', 'Mill 1000 weir', 'Under_score weir', 'Underxscore weir'])
    expect((await names('brackwin')).length).toBe(DEMO_SITES.filter((s) => s.site.riverName === 'Brackwin Water').length)
  })
})

describe('site updates', () => {
  it('refuse a stale version with a 409 naming the current one, and change nothing', async () => {
    const site = await createSite(db, { orgId, userId: null, input: DEMO_SITES[0]!.site })
    const { site: changed } = await updateSite(db, site.id, { version: 1, notes: 'first' }, '2026-01-01T00:00:00.000Z')
    expect(changed.version).toBe(2)
    const stale = await updateSite(db, site.id, { version: 1, notes: 'second' }, '2026-01-02T00:00:00.000Z').catch((e: unknown) => e)
    expect(stale).toBeInstanceOf(DomainError)
    expect(stale).toMatchObject({ status: 409, data: { currentVersion: 2 } })
    expect((stale as Error).message).toMatch(/^version: /)
    expect((await db.selectFrom('sites').select('notes').where('id', '=', site.id).executeTakeFirstOrThrow()).notes).toBe('first')
  })
})

describe('the review as stored', () => {
  it('goes draft → submitted → returned → submitted, mails the reviewers and engineers, and refuses steps the state does not allow', async () => {
    const reviewed = await db.selectFrom('site_reviews').select('site_id').execute()
    const assessment = await db.selectFrom('assessments').select(['id', 'site_id']).where('site_id', 'not in', reviewed.map((r) => r.site_id)).executeTakeFirstOrThrow()
    const site = await db.selectFrom('sites').selectAll().where('id', '=', assessment.site_id).executeTakeFirstOrThrow()
    const engineer = await person('engineer')
    const reviewer = await person('reviewer')
    const mailer = keepingMailer()

    const early = await decideReview(db, { site, user: reviewer, decision: 'accepted', reason: 'fine', conditions: null, now: '2026-02-01T00:00:00.000Z', mailer }).catch((e: unknown) => e)
    expect(early).toMatchObject({ status: 409, data: { state: 'draft' } })

    const submitted = await submitReview(db, { site, user: engineer, assessmentId: assessment.id, note: 'please look', now: '2026-02-02T00:00:00.000Z', mailer })
    expect(submitted).toMatchObject({ state: 'submitted', before: { state: 'draft', assessmentId: null }, event: { kind: 'submitted', from: 'draft', to: 'submitted' } })
    expect(mailer.sent.map((m) => [m.kind, m.to])).toEqual([['review-submitted', DEMO_ACCOUNTS.find((a) => a.role === 'reviewer')!.email]])

    const twice = await submitReview(db, { site, user: engineer, assessmentId: assessment.id, note: null, now: '2026-02-03T00:00:00.000Z', mailer }).catch((e: unknown) => e)
    expect(twice).toMatchObject({ status: 409, data: { state: 'submitted' } })

    const returned = await decideReview(db, { site, user: reviewer, decision: 'returned', reason: 'more flow data', conditions: null, now: '2026-02-04T00:00:00.000Z', mailer })
    expect(returned.state).toBe('returned')
    expect(mailer.sent.at(-1)).toMatchObject({ kind: 'review-decided', to: DEMO_ACCOUNTS.find((a) => a.role === 'engineer')!.email })

    const again = await submitReview(db, { site, user: engineer, assessmentId: assessment.id, note: null, now: '2026-02-05T00:00:00.000Z', mailer })
    expect(again.before.state).toBe('returned')
    expect(mailer.sent.at(-1)!.subject).toMatch(/resubmit|again/i)
    const events = await db.selectFrom('review_events').select(['from_state', 'to_state']).where('site_id', '=', site.id).orderBy('id').execute()
    expect(events).toEqual([
      { from_state: 'draft', to_state: 'submitted' },
      { from_state: 'submitted', to_state: 'returned' },
      { from_state: 'returned', to_state: 'submitted' },
    ])

    const foreign = await submitReview(db, { site, user: engineer, assessmentId: 999_999, note: null, now: '2026-02-06T00:00:00.000Z', mailer }).catch((e: unknown) => e)
    expect(foreign).toMatchObject({ status: 422, field: 'assessmentId' })
  })
})
