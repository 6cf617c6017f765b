// Longer than most files: the review's whole state machine, its refusals and its e-mails, case by case.
import { beforeAll, describe, expect, it } from 'vitest'
import { Client, GOOD_PASSWORD, uniqueEmail } from './client'
import { lastOutboxId, makePeople, outboxSince, siteWithAssessment, tokenFromMail, type Person, type TeamRole } from './review-helpers'

// The review of a site over HTTP: the state machine (every illegal step a 409 naming the state),
// the roles on every route, the history, the brief, comments with mentions, the e-mails each event
// produces, and a reviewer invited to one site only.

let team: Awaited<ReturnType<typeof makePeople>>
let site: Awaited<ReturnType<typeof siteWithAssessment>>
let otherSite: Awaited<ReturnType<typeof siteWithAssessment>>

const review = (siteId: number) => `/api/sites/${siteId}/review`

beforeAll(async () => {
  team = await makePeople('rv')
  site = await siteWithAssessment(team.engineer.client, team.orgId, 'Review state weir')
  otherSite = await siteWithAssessment(team.engineer.client, team.orgId, 'Second review weir')
})

describe('the review state machine', () => {
  it('starts in draft with nothing under review', async () => {
    const res = await team.viewer.client.get(review(site.siteId))
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ state: 'draft', assessment: null, decision: null, history: [] })
    expect(res.body.can).toEqual({ submit: false, decide: false, comment: false })
    const eng = await team.engineer.client.get(review(site.siteId))
    expect(eng.body.can).toEqual({ submit: true, decide: false, comment: true })
  })

  it('refuses a decision on a draft with 409 naming the state', async () => {
    const res = await team.reviewer.client.post(`${review(site.siteId)}/decision`, { decision: 'accepted', reason: 'Looks fine' })
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/^review: .*draft/)
    expect(res.body.data.state).toBe('draft')
  })

  it('goes draft → submitted → returned → submitted → accepted-with-conditions, and refuses every other step', async () => {
    const sub = await team.engineer.client.post(`${review(site.siteId)}/submit`, { assessmentId: site.assessmentId, note: 'First look, please' })
    expect(sub.status, JSON.stringify(sub.body)).toBe(200)
    expect(sub.body.state).toBe('submitted')
    expect(sub.body.event).toMatchObject({ kind: 'submitted', from: 'draft', to: 'submitted', assessmentId: site.assessmentId, note: 'First look, please' })

    const again = await team.engineer.client.post(`${review(site.siteId)}/submit`, { assessmentId: site.assessmentId })
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/submitted/)

    const ret = await team.reviewer.client.post(`${review(site.siteId)}/decision`, { decision: 'returned', reason: 'Reserved flow basis unclear' })
    expect(ret.status).toBe(200)
    expect(ret.body.state).toBe('returned')
    const decideReturned = await team.reviewer.client.post(`${review(site.siteId)}/decision`, { decision: 'accepted', reason: 'x' })
    expect(decideReturned.status).toBe(409)
    expect(decideReturned.body.message).toMatch(/returned/)

    const resub = await team.admin.client.post(`${review(site.siteId)}/submit`, { assessmentId: site.assessmentId, note: 'Basis now Q95' })
    expect(resub.status).toBe(200)
    expect(resub.body.event).toMatchObject({ from: 'returned', to: 'submitted' })

    const noConditions = await team.reviewer.client.post(`${review(site.siteId)}/decision`, { decision: 'accepted-with-conditions', reason: 'Fine with a limit' })
    expect(noConditions.status).toBe(400)
    expect(noConditions.body.message).toMatch(/^conditions:/)

    const ok = await team.reviewer.client.post(`${review(site.siteId)}/decision`, {
      decision: 'accepted-with-conditions',
      reason: 'Oxygen gain holds at summer low flow',
      conditions: 'Keep the reserved flow over the fish pass at all times.',
    })
    expect(ok.status).toBe(200)
    expect(ok.body.state).toBe('accepted-with-conditions')

    for (const [who, path, body] of [
      [team.engineer, 'submit', { assessmentId: site.assessmentId }],
      [team.reviewer, 'decision', { decision: 'returned', reason: 'again' }],
      [team.admin, 'decision', { decision: 'accepted', reason: 'again' }],
    ] as const) {
      const res = await who.client.post(`${review(site.siteId)}/${path}`, body)
      expect(res.status, path).toBe(409)
      expect(res.body.message).toMatch(/accepted-with-conditions/)
    }
  })

  it('keeps the whole history: who, from, to, reason, conditions, assessment, when', async () => {
    const res = await team.viewer.client.get(review(site.siteId))
    expect(res.body.state).toBe('accepted-with-conditions')
    expect(res.body.assessment.id).toBe(site.assessmentId)
    expect(res.body.decision).toMatchObject({ decision: 'accepted-with-conditions', conditions: 'Keep the reserved flow over the fish pass at all times.', by: { id: team.reviewer.id } })
    const steps = res.body.history.map((h: { from: string; to: string; by: { id: number } }) => `${h.from}>${h.to}@${h.by.id}`)
    expect(steps).toEqual([
      `draft>submitted@${team.engineer.id}`,
      `submitted>returned@${team.reviewer.id}`,
      `returned>submitted@${team.admin.id}`,
      `submitted>accepted-with-conditions@${team.reviewer.id}`,
    ])
    expect(res.body.history[1]).toMatchObject({ reason: 'Reserved flow basis unclear', conditions: null, assessmentId: site.assessmentId })
    expect(res.body.history.every((h: { at: string }) => !Number.isNaN(Date.parse(h.at)))).toBe(true)
  })

  it('treats accepted as final too', async () => {
    const s = await siteWithAssessment(team.engineer.client, team.orgId, 'Accepted weir')
    expect((await team.engineer.client.post(`${review(s.siteId)}/submit`, { assessmentId: s.assessmentId })).status).toBe(200)
    expect((await team.admin.client.post(`${review(s.siteId)}/decision`, { decision: 'accepted', reason: 'Clear case' })).status).toBe(200)
    const sub = await team.engineer.client.post(`${review(s.siteId)}/submit`, { assessmentId: s.assessmentId })
    expect(sub.status).toBe(409)
    expect(sub.body.data.state).toBe('accepted')
    const dec = await team.reviewer.client.post(`${review(s.siteId)}/decision`, { decision: 'returned', reason: 'x' })
    expect(dec.status).toBe(409)
  })
})

describe('review input', () => {
  it('names the bad field with 400', async () => {
    const cases: [string, unknown, RegExp][] = [
      ['submit', {}, /^assessmentId:/],
      ['submit', { assessmentId: 'abc' }, /^assessmentId:/],
      ['decision', { decision: 'maybe', reason: 'x' }, /^decision:/],
      ['decision', { decision: 'accepted' }, /^reason:/],
      ['decision', { decision: 'accepted', reason: '   ' }, /^reason:/],
      ['decision', { decision: 'returned', reason: 'x', conditions: 'not with returned' }, /^conditions:/],
    ]
    for (const [path, body, message] of cases) {
      const who = path === 'submit' ? team.engineer : team.reviewer
      const res = await who.client.post(`${review(otherSite.siteId)}/${path}`, body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.message).toMatch(message)
    }
    const badId = await team.engineer.client.get('/api/sites/abc/review')
    expect(badId.status).toBe(400)
    expect(badId.body.message).toMatch(/^id:/)
  })

  it('refuses an assessment of another site with 422 and leaves the review in draft', async () => {
    const res = await team.engineer.client.post(`${review(otherSite.siteId)}/submit`, { assessmentId: site.assessmentId })
    expect(res.status).toBe(422)
    expect(res.body.message).toMatch(/^assessmentId:/)
    expect((await team.engineer.client.get(review(otherSite.siteId))).body.state).toBe('draft')
  })
})

describe('roles on every review route', () => {
  const expectStatus = async (who: TeamRole | 'signed-out', method: 'GET' | 'POST', path: string, body: unknown, expected: number) => {
    const client = who === 'signed-out' ? new Client() : team[who].client
    const res = await client.request(method, path, body)
    expect(res.status, `${who} ${method} ${path}`).toBe(expected)
  }

  it('let every member read the review, the brief and the comments; outsiders get 404, signed-out 401', async () => {
    const s = site.siteId
    for (const path of [review(s), `${review(s)}/brief`, `/api/sites/${s}/comments`]) {
      for (const who of ['admin', 'engineer', 'reviewer', 'viewer'] as const) await expectStatus(who, 'GET', path, undefined, 200)
      await expectStatus('outsider', 'GET', path, undefined, 404)
      await expectStatus('signed-out', 'GET', path, undefined, 401)
    }
  })

  it('let engineers and admins submit, reviewers and admins decide, all but viewers comment', async () => {
    const s = await siteWithAssessment(team.engineer.client, team.orgId, 'Roles weir')
    const submit = `${review(s.siteId)}/submit`
    const decision = `${review(s.siteId)}/decision`
    const comments = `/api/sites/${s.siteId}/comments`
    const sub = { assessmentId: s.assessmentId }
    const dec = { decision: 'returned', reason: 'Try again' }
    for (const who of ['reviewer', 'viewer'] as const) await expectStatus(who, 'POST', submit, sub, 403)
    await expectStatus('outsider', 'POST', submit, sub, 404)
    await expectStatus('signed-out', 'POST', submit, sub, 401)
    await expectStatus('engineer', 'POST', submit, sub, 200)
    for (const who of ['engineer', 'viewer'] as const) await expectStatus(who, 'POST', decision, dec, 403)
    await expectStatus('outsider', 'POST', decision, dec, 404)
    await expectStatus('signed-out', 'POST', decision, dec, 401)
    await expectStatus('reviewer', 'POST', decision, dec, 200)
    await expectStatus('admin', 'POST', submit, sub, 200)
    await expectStatus('admin', 'POST', decision, dec, 200)
    for (const who of ['admin', 'engineer', 'reviewer'] as const) await expectStatus(who, 'POST', comments, { body: `from ${who}` }, 201)
    await expectStatus('viewer', 'POST', comments, { body: 'landowner' }, 403)
    await expectStatus('outsider', 'POST', comments, { body: 'stranger' }, 404)
    await expectStatus('signed-out', 'POST', comments, { body: 'nobody' }, 401)
  })
})

describe('the review brief', () => {
  it('answers 409 naming draft before anything is submitted', async () => {
    const res = await team.reviewer.client.get(`${review(otherSite.siteId)}/brief`)
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/draft/)
  })

  it('reads the stored result of the assessment under review', async () => {
    const res = await team.reviewer.client.get(`${review(site.siteId)}/brief`)
    expect(res.status).toBe(200)
    const stored = (await team.reviewer.client.get(`/api/assessments/${site.assessmentId}`)).body
    expect(res.body.assessment.id).toBe(site.assessmentId)
    expect(res.body.reservedFlow.flow_m3s).toBe(stored.result.hydrology.reservedFlow_m3s)
    expect(res.body.reservedFlow.setting).toEqual(stored.input.reservedFlow)
    expect(res.body.reservedFlow.basis).toMatch(/Q95/)
    expect(typeof res.body.reservedFlow.keptAtEveryFlow).toBe('boolean')
    expect(res.body.oxygenByMonth).toHaveLength(12)
    const july = res.body.oxygenByMonth[6]
    expect(july.month).toBe(7)
    expect(july.without_mgL).toBe(stored.result.months[6].downstreamWithout_mgL)
    expect(july.with_mgL).toBe(stored.result.months[6].downstreamWith_mgL)
    expect(july.target_mgL).toBe(stored.result.months[6].target_mgL)
    expect(july.meetsTargetWith).toBe(july.with_mgL >= july.target_mgL)
    expect(res.body.netGainSummerLowFlow.value_mgL).toBe(stored.result.summary.netOxygenGainSummerLowFlow_mgL)
    const gas = stored.result.summary.flags.find((f: { id: string }) => f.id === 'gas-supersaturation')
    expect(res.body.gasSupersaturation).toMatchObject({ raised: gas.raised, reason: gas.reason })
    expect(res.body.flags).toHaveLength(stored.result.summary.flags.length)
    // How sure: the stored Monte Carlo, with the acceptable loss of the stored input; an entered curve has no record years.
    const mc = stored.result.uncertainty
    expect(res.body.howSure).toEqual({
      stored: true,
      monteCarlo: { draws: mc.draws, energyP90_MWh: mc.energy_MWh.p90, energyP50_MWh: mc.energy_MWh.p50, netLossProbability: mc.netLossProbability, acceptableOxygenLoss_mgL: stored.input.settings.acceptableOxygenLoss_mgL },
      record: null,
    })
    expect(typeof res.body.howSure.monteCarlo.energyP90_MWh).toBe('number')
  })
})

describe('comments', () => {
  it('point at an assessment, a month or a flag, and reject bad pointers naming the field', async () => {
    const path = `/api/sites/${site.siteId}/comments`
    const ok = await team.reviewer.client.post(path, { body: 'July looks tight', assessmentId: site.assessmentId, month: 7, flagId: 'oxygen-below-target' })
    expect(ok.status).toBe(201)
    expect(ok.body).toMatchObject({ body: 'July looks tight', assessmentId: site.assessmentId, month: 7, flagId: 'oxygen-below-target', author: { id: team.reviewer.id } })
    for (const [body, field] of [
      [{ body: '' }, 'body'],
      [{ body: 'x', month: 13 }, 'month'],
      [{ body: 'x', month: 0 }, 'month'],
      [{ body: 'x', flagId: 'no-such-flag' }, 'flagId'],
      [{ body: 'x'.repeat(5001) }, 'body'],
    ] as const) {
      const res = await team.reviewer.client.post(path, body)
      expect(res.status, JSON.stringify(body).slice(0, 60)).toBe(400)
      expect(res.body.message).toMatch(new RegExp(`^${field}:`))
    }
    const foreign = await team.reviewer.client.post(path, { body: 'x', assessmentId: otherSite.assessmentId })
    expect(foreign.status).toBe(422)
    expect(foreign.body.message).toMatch(/^assessmentId:/)
    const list = await team.viewer.client.get(path)
    expect(list.status).toBe(200)
    expect(list.body.comments.at(-1).body).toBe('July looks tight')
  })

  it('notify the members mentioned by e-mail or by name, and nobody else', async () => {
    const before = lastOutboxId()
    const body = `@${team.engineer.email} can you check the throat depth? cc @${team.admin.name}.`
    const res = await team.reviewer.client.post(`/api/sites/${site.siteId}/comments`, { body })
    expect(res.status).toBe(201)
    expect(res.body.mentions.map((m: { id: number }) => m.id).sort()).toEqual([team.engineer.id, team.admin.id].sort())
    const mails = outboxSince(before)
    expect(mails.map((m) => m.to_address).sort()).toEqual([team.engineer.email, team.admin.email].sort())
    for (const m of mails) {
      expect(m.kind).toBe('comment-mention')
      expect(m.org_id).toBe(team.orgId)
      expect(m.subject).toContain('Review state weir')
      expect(m.text).toContain('can you check the throat depth')
      expect(m.text).toContain(`/sites/${site.siteId}?tab=review`)
    }
    const outsiderMention = lastOutboxId()
    await team.reviewer.client.post(`/api/sites/${site.siteId}/comments`, { body: `@${team.outsider.email} not a member` })
    expect(outboxSince(outsiderMention)).toHaveLength(0)
  })
})

describe('review e-mails', () => {
  it('go to the site\'s reviewers on submit, and to the submitter and engineers on a decision', async () => {
    const s = await siteWithAssessment(team.engineer.client, team.orgId, 'Mail weir')
    const before = lastOutboxId()
    await team.engineer.client.post(`${review(s.siteId)}/submit`, { assessmentId: s.assessmentId, note: 'Please look at August' })
    const submitted = outboxSince(before)
    expect(submitted.map((m) => [m.kind, m.to_address])).toEqual([['review-submitted', team.reviewer.email]])
    expect(submitted[0]!.text).toContain('Please look at August')
    expect(submitted[0]!.html).toContain('Mail weir')

    const mid = lastOutboxId()
    await team.reviewer.client.post(`${review(s.siteId)}/decision`, { decision: 'accepted-with-conditions', reason: 'Gain is real', conditions: 'Monitor <oxygen> monthly' })
    const decided = outboxSince(mid)
    expect(decided.every((m) => m.kind === 'review-decided')).toBe(true)
    expect(decided.map((m) => m.to_address)).toEqual([team.engineer.email])
    expect(decided[0]!.text).toContain('Monitor <oxygen> monthly')
    expect(decided[0]!.html).toContain('Monitor &lt;oxygen&gt; monthly')

    const outbox = await team.admin.client.get(`/api/orgs/${team.orgId}/outbox?kind=review-decided`)
    expect(outbox.status).toBe(200)
    expect(outbox.body.messages[0]).toMatchObject({ to: team.engineer.email, kind: 'review-decided', sentAt: null, error: null })
  })

  it('are audited with before and after', async () => {
    const res = await team.admin.client.get(`/api/orgs/${team.orgId}/audit?action=review.&targetType=site`)
    expect(res.status).toBe(200)
    const actions = new Set(res.body.entries.map((e: { action: string }) => e.action))
    expect(actions).toEqual(new Set(['review.submitted', 'review.decided']))
    const decided = res.body.entries.find((e: { action: string; targetId: number }) => e.action === 'review.decided' && e.targetId === site.siteId)
    expect(decided.detail.before).toEqual({ state: 'submitted' })
    expect(decided.detail.after).toMatchObject({ state: 'accepted-with-conditions' })
  })
})

describe('a reviewer invited to one site only', () => {
  let guest: Person
  let guestSite: Awaited<ReturnType<typeof siteWithAssessment>>

  beforeAll(async () => {
    guestSite = await siteWithAssessment(team.engineer.client, team.orgId, 'Guest review weir')
    const email = uniqueEmail('guest')
    const before = lastOutboxId()
    const inv = await team.admin.client.post(`/api/orgs/${team.orgId}/invitations`, { email, role: 'reviewer', siteId: guestSite.siteId })
    expect(inv.status, JSON.stringify(inv.body)).toBe(201)
    const token = tokenFromMail(outboxSince(before)[0]!.text, '/invitations')
    const client = new Client()
    const accepted = await client.post(`/api/invitations/${token}/accept`, { name: 'Guest Officer', password: GOOD_PASSWORD })
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
    guest = { client, email, id: accepted.body.user.id, name: 'Guest Officer' }
  })

  it('reads that site, its hydrology, options, assessments, review and comments', async () => {
    const s = guestSite.siteId
    for (const path of [`/api/sites/${s}`, `/api/sites/${s}/hydrology`, `/api/sites/${s}/options`, `/api/options/${guestSite.optionId}`, `/api/assessments/${guestSite.assessmentId}`, review(s), `/api/sites/${s}/comments`]) {
      const res = await guest.client.get(path)
      expect(res.status, path).toBe(200)
    }
  })

  it('reviews it: gets the submit e-mail, comments and decides', async () => {
    const before = lastOutboxId()
    await team.engineer.client.post(`${review(guestSite.siteId)}/submit`, { assessmentId: guestSite.assessmentId })
    expect(outboxSince(before).map((m) => m.to_address).sort()).toEqual([team.reviewer.email, guest.email].sort())
    expect((await guest.client.get(`${review(guestSite.siteId)}/brief`)).status).toBe(200)
    expect((await guest.client.post(`/api/sites/${guestSite.siteId}/comments`, { body: `Fine by me, @${team.engineer.name}` })).status).toBe(201)
    const dec = await guest.client.post(`${review(guestSite.siteId)}/decision`, { decision: 'accepted', reason: 'Agency view: acceptable' })
    expect(dec.status).toBe(200)
    expect(dec.body.event.by).toEqual({ id: guest.id, name: 'Guest Officer' })
  })

  it('cannot submit or change the site (403)', async () => {
    expect((await guest.client.post(`${review(guestSite.siteId)}/submit`, { assessmentId: guestSite.assessmentId })).status).toBe(403)
    expect((await guest.client.patch(`/api/sites/${guestSite.siteId}`, { name: 'Renamed', version: 1 })).status).toBe(403)
    expect((await guest.client.post(`/api/sites/${guestSite.siteId}/summary-links`, {})).status).toBe(403)
  })

  it('gets 404 on another site of the same organisation and on the organisation itself', async () => {
    for (const path of [`/api/sites/${otherSite.siteId}`, review(otherSite.siteId), `${review(otherSite.siteId)}/brief`, `/api/sites/${otherSite.siteId}/comments`, `/api/assessments/${otherSite.assessmentId}`, `/api/orgs/${team.orgId}/sites`, `/api/orgs/${team.orgId}/members`]) {
      const res = await guest.client.get(path)
      expect(res.status, path).toBe(404)
    }
    const dec = await guest.client.post(`${review(otherSite.siteId)}/decision`, { decision: 'accepted', reason: 'x' })
    expect(dec.status).toBe(404)
  })
})
