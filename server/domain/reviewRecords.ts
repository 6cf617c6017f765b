// Longer than most files: submitting, deciding and commenting share one site lock, one event log and one mailer.
import { sql, type Kysely } from 'kysely'
import type { Database, ReviewEventRow, SiteRow } from '../../db/schema'
import type { AssessResult, FlagId } from '../../shared/engine/results'
import {
  REVIEW_DECIDE_ROLES,
  REVIEW_STATE_LABELS,
  REVIEW_SUBMIT_ROLES,
  COMMENT_ROLES,
  type CommentDto,
  type PersonRef,
  type ReviewAssessmentRef,
  type ReviewDecision,
  type ReviewDto,
  type ReviewEventDto,
  type ReviewState,
  type ReviewBriefDto,
  type ReviewChangeDto,
  type CommentInput,
  siteReviewPath,
} from '../../shared/schemas/review'
import type { ReservedFlow } from '../../shared/schemas/site'
import type { Role } from '../../shared/utils/roles'
import { CONSENT_KINDS, requiredConsentsLine, type ConsentKind } from '../../shared/utils/consents'
import { peopleById } from './accounts'
import { loadConsentSummary } from './consents'
import { conflict, unprocessable } from './errors'
import { sendAll, type Mailer } from './mail/outbox'
import { organisationCurrency } from './organisations'
import { commentMentionMail } from './mail/templates/commentMention'
import { reviewDecidedMail } from './mail/templates/reviewDecided'
import { reviewSubmittedMail } from './mail/templates/reviewSubmitted'
import { latestCommissioningLine } from './commissioning'
import { commentPointsAt, findMentions, reviewActionsIn, reviewBrief, reviewTransition } from './review'
import { inTransaction } from './transaction'

// The review as stored: submitting a site for review and deciding it (the state machine of
// review.ts applied in a transaction), comments, the reviewer's brief, loading a site's review,
// history and comments as the API shows them, and who the review's e-mails go to.

const ref = (names: Map<number, string>, id: number | null): PersonRef | null => (id !== null && names.has(id) ? { id, name: names.get(id)! } : null)

/** The consent kinds stored as JSON on a review row (unknown kinds dropped). */
function consentKindsOf(json: string | null | undefined): ConsentKind[] {
  const list: unknown = json ? JSON.parse(json) : []
  return Array.isArray(list) ? list.filter((k): k is ConsentKind => (CONSENT_KINDS as readonly unknown[]).includes(k)) : []
}

/** One review_events row as the API shows it. */
export function reviewEventDto(row: ReviewEventRow, names: Map<number, string>): ReviewEventDto {
  return {
    id: row.id,
    kind: row.kind,
    from: row.from_state,
    to: row.to_state,
    by: ref(names, row.user_id),
    assessmentId: row.assessment_id,
    note: row.note,
    reason: row.reason,
    conditions: row.conditions,
    requiredConsents: consentKindsOf(row.required_consents),
    at: row.created_at,
  }
}

/** An assessment of the site with its option's name and headline figures, or null when it is not this site's. */
export async function reviewAssessmentRef(db: Kysely<Database>, siteId: number, assessmentId: number): Promise<ReviewAssessmentRef | null> {
  const row = await db
    .selectFrom('assessments')
    .innerJoin('options', 'options.id', 'assessments.option_id')
    .select([
      'assessments.id',
      'assessments.option_id',
      'options.name as option_name',
      'assessments.engine_version',
      'assessments.created_at',
      'assessments.annual_energy_mwh',
      'assessments.net_oxygen_gain_slf_mgl',
      'assessments.flags_raised',
    ])
    .where('assessments.id', '=', assessmentId)
    .where('assessments.site_id', '=', siteId)
    .executeTakeFirst()
  if (!row) return null
  return {
    id: row.id,
    optionId: row.option_id,
    optionName: row.option_name,
    engineVersion: row.engine_version,
    createdAt: row.created_at,
    annualEnergy_MWh: row.annual_energy_mwh,
    netOxygenGainSummerLowFlow_mgL: row.net_oxygen_gain_slf_mgl,
    flagsRaised: JSON.parse(row.flags_raised) as FlagId[],
  }
}

/** GET /api/sites/[id]/review for a caller holding `role` on the site. */
export async function loadReview(db: Kysely<Database>, site: SiteRow, role: Role): Promise<ReviewDto> {
  const [current, events] = await Promise.all([
    db.selectFrom('site_reviews').selectAll().where('site_id', '=', site.id).executeTakeFirst(),
    db.selectFrom('review_events').selectAll().where('site_id', '=', site.id).orderBy('id').execute(),
  ])
  const state: ReviewState = current?.state ?? 'draft'
  const names = await peopleById(db, [current?.submitted_by ?? null, current?.decided_by ?? null, ...events.map((e) => e.user_id)])
  const assessment = current?.assessment_id ? await reviewAssessmentRef(db, site.id, current.assessment_id) : null
  const actions = reviewActionsIn(state)
  const decided = state === 'accepted' || state === 'accepted-with-conditions' || state === 'returned'
  return {
    siteId: site.id,
    state,
    stateLabel: REVIEW_STATE_LABELS[state],
    assessment,
    submittedBy: ref(names, current?.submitted_by ?? null),
    submittedAt: current?.submitted_at ?? null,
    decision:
      decided && current?.decided_at
        ? { decision: state as ReviewDecision, reason: current.reason ?? '', conditions: current.conditions, requiredConsents: consentKindsOf(current.required_consents), by: ref(names, current.decided_by), at: current.decided_at }
        : null,
    history: events.map((e) => reviewEventDto(e, names)),
    can: {
      submit: actions.submit && (REVIEW_SUBMIT_ROLES as readonly Role[]).includes(role),
      decide: actions.decide && (REVIEW_DECIDE_ROLES as readonly Role[]).includes(role),
      comment: (COMMENT_ROLES as readonly Role[]).includes(role),
    },
  }
}

/** A person who may receive review e-mail. */
export interface Recipient {
  id: number
  name: string
  email: string
}

/** The site's reviewers: the organisation's members with the reviewer role and everyone granted this site. */
export async function siteReviewers(db: Kysely<Database>, site: Pick<SiteRow, 'id' | 'org_id'>): Promise<Recipient[]> {
  const [members, granted] = await Promise.all([
    db.selectFrom('memberships').innerJoin('users', 'users.id', 'memberships.user_id').select(['users.id', 'users.name', 'users.email']).where('memberships.org_id', '=', site.org_id).where('memberships.role', '=', 'reviewer').execute(),
    db.selectFrom('site_grants').innerJoin('users', 'users.id', 'site_grants.user_id').select(['users.id', 'users.name', 'users.email']).where('site_grants.site_id', '=', site.id).execute(),
  ])
  return uniquePeople([...members, ...granted])
}

/** The organisation's members with the given roles. */
export async function membersWithRoles(db: Kysely<Database>, orgId: number, roles: readonly Role[]): Promise<Recipient[]> {
  return db
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['users.id', 'users.name', 'users.email'])
    .where('memberships.org_id', '=', orgId)
    .where('memberships.role', 'in', [...roles])
    .orderBy('users.id')
    .execute()
}

/** Everyone who can read the site: the organisation's members and its single-site reviewers. */
export async function siteReaders(db: Kysely<Database>, site: Pick<SiteRow, 'id' | 'org_id'>): Promise<Recipient[]> {
  const [members, granted] = await Promise.all([
    db.selectFrom('memberships').innerJoin('users', 'users.id', 'memberships.user_id').select(['users.id', 'users.name', 'users.email']).where('memberships.org_id', '=', site.org_id).execute(),
    db.selectFrom('site_grants').innerJoin('users', 'users.id', 'site_grants.user_id').select(['users.id', 'users.name', 'users.email']).where('site_grants.site_id', '=', site.id).execute(),
  ])
  return uniquePeople([...members, ...granted])
}

/** The people, each once, by id. */
export function uniquePeople<T extends { id: number }>(people: readonly T[]): T[] {
  const seen = new Map<number, T>()
  for (const p of people) if (!seen.has(p.id)) seen.set(p.id, p)
  return [...seen.values()]
}

/** Comment rows with their author's name as the API shows them. */
export async function commentDtos(db: Kysely<Database>, rows: readonly { id: number; site_id: number; body: string; user_id: number | null; assessment_id: number | null; month: number | null; flag_id: string | null; mentions: string; created_at: string }[]): Promise<CommentDto[]> {
  const mentionIds = rows.flatMap((r) => JSON.parse(r.mentions) as number[])
  const names = await peopleById(db, [...rows.map((r) => r.user_id), ...mentionIds])
  return rows.map((r) => ({
    id: r.id,
    siteId: r.site_id,
    body: r.body,
    author: ref(names, r.user_id),
    assessmentId: r.assessment_id,
    month: r.month,
    flagId: r.flag_id as FlagId | null,
    mentions: (JSON.parse(r.mentions) as number[]).map((id) => ref(names, id)).filter((p): p is PersonRef => p !== null),
    createdAt: r.created_at,
  }))
}

/** Who acts on a review, as the e-mails name them. */
export interface Actor {
  id: number
  name: string
}

/**
 * Submits a site for review with one of its assessments (again after it was returned): 422 when the
 * assessment is not this site's, 409 naming the state when the review cannot be submitted now. The
 * site's reviewers (but the submitter) get an e-mail. Returns the new state, the event, and the
 * state before for the audit line.
 */
export async function submitReview(
  db: Kysely<Database>,
  args: { site: SiteRow; user: Actor; assessmentId: number; note: string | null; now: string; mailer: Mailer },
): Promise<ReviewChangeDto & { before: { state: ReviewState; assessmentId: number | null } }> {
  const { site, user, assessmentId, now: at } = args
  const note = args.note || null
  const assessment = await reviewAssessmentRef(db, site.id, assessmentId)
  if (!assessment) throw unprocessable('assessmentId', 'is not an assessment of this site')
  const done = await inTransaction(db, async (trx) => {
    const current = await trx.selectFrom('site_reviews').selectAll().where('site_id', '=', site.id).executeTakeFirst()
    const step = reviewTransition(current?.state ?? 'draft', { kind: 'submit' })
    if (!step.ok) throw conflict(step.message, { state: step.from })
    const values = { state: step.to, assessment_id: assessmentId, submitted_by: user.id, submitted_at: at, decided_by: null, decided_at: null, reason: null, conditions: null, required_consents: '[]', updated_at: at }
    if (current) await trx.updateTable('site_reviews').set(values).where('site_id', '=', site.id).execute()
    else await trx.insertInto('site_reviews').values({ site_id: site.id, org_id: site.org_id, ...values }).execute()
    const row = await trx
      .insertInto('review_events')
      .values({ site_id: site.id, org_id: site.org_id, kind: 'submitted', from_state: step.from, to_state: step.to, user_id: user.id, assessment_id: assessmentId, note, created_at: at })
      .returningAll()
      .executeTakeFirstOrThrow()
    return { row, before: current ? { state: current.state, assessmentId: current.assessment_id } : { state: 'draft' as const, assessmentId: null } }
  })
  const org = await db.selectFrom('organisations').select('name').where('id', '=', site.org_id).executeTakeFirstOrThrow()
  const reviewers = (await siteReviewers(db, site)).filter((r) => r.id !== user.id)
  const mail = reviewSubmittedMail({
    siteName: site.name,
    organisationName: org.name,
    submitterName: user.name,
    optionName: assessment.optionName,
    resubmitted: done.before.state === 'returned',
    note,
    link: args.mailer.link(siteReviewPath(site.id)),
  })
  await sendAll(args.mailer, reviewers.map((r) => ({ to: r.email, ...mail, kind: 'review-submitted' as const, orgId: site.org_id })))
  return { state: done.row.to_state, event: reviewEventDto(done.row, new Map([[user.id, user.name]])), before: done.before }
}

/**
 * Decides a submitted review with a reason (and conditions when accepting with conditions): 409
 * naming the state in any state but `submitted`. The submitter and the organisation's engineers
 * (but the decider) get an e-mail.
 */
export async function decideReview(
  db: Kysely<Database>,
  args: { site: SiteRow; user: Actor; decision: ReviewDecision; reason: string; conditions: string | null; requiredConsents?: readonly ConsentKind[]; now: string; mailer: Mailer },
): Promise<ReviewChangeDto> {
  const { site, user, decision, reason, conditions, now: at } = args
  const required = JSON.stringify(args.requiredConsents ?? [])
  const done = await inTransaction(db, async (trx) => {
    const current = await trx.selectFrom('site_reviews').selectAll().where('site_id', '=', site.id).executeTakeFirst()
    const step = reviewTransition(current?.state ?? 'draft', { kind: 'decide', decision })
    if (!step.ok || !current) throw conflict(step.ok ? 'review: the review is draft' : step.message, { state: step.from })
    await trx
      .updateTable('site_reviews')
      .set({ state: step.to, decided_by: user.id, decided_at: at, reason, conditions, required_consents: required, updated_at: at })
      .where('site_id', '=', site.id)
      .execute()
    const row = await trx
      .insertInto('review_events')
      .values({ site_id: site.id, org_id: site.org_id, kind: 'decided', from_state: step.from, to_state: step.to, user_id: user.id, assessment_id: current.assessment_id, reason, conditions, required_consents: required, created_at: at })
      .returningAll()
      .executeTakeFirstOrThrow()
    return { row, submittedBy: current.submitted_by }
  })
  const engineers = await membersWithRoles(db, site.org_id, ['engineer'])
  const submitter = done.submittedBy === null ? [] : await db.selectFrom('users').select(['id', 'name', 'email']).where('id', '=', done.submittedBy).execute()
  const to = uniquePeople([...submitter, ...engineers]).filter((p) => p.id !== user.id)
  const mail = reviewDecidedMail({ siteName: site.name, deciderName: user.name, decisionLabel: REVIEW_STATE_LABELS[decision], reason, conditions, requires: requiredConsentsLine(args.requiredConsents ?? []), link: args.mailer.link(siteReviewPath(site.id)) })
  await sendAll(args.mailer, to.map((p) => ({ to: p.email, ...mail, kind: 'review-decided' as const, orgId: site.org_id })))
  return { state: done.row.to_state, event: reviewEventDto(done.row, new Map([[user.id, user.name]])) }
}

/**
 * Adds a comment to a site's thread, pointing at one of its assessments (422 when not this site's),
 * a month or a flag; the people it mentions (@e-mail or @full name) among those who can read the
 * site, but the author, get an e-mail. Returns the comment and whom it mentioned.
 */
export async function addComment(
  db: Kysely<Database>,
  args: { site: SiteRow; user: Actor; input: CommentInput; now?: string; mailer: Mailer },
): Promise<{ comment: CommentDto; mentions: number[] }> {
  const { site, user, input } = args
  if (input.assessmentId !== undefined && !(await reviewAssessmentRef(db, site.id, input.assessmentId))) {
    throw unprocessable('assessmentId', 'is not an assessment of this site')
  }
  const mentioned = findMentions(input.body, await siteReaders(db, site)).filter((p) => p.id !== user.id)
  const row = await db
    .insertInto('comments')
    .values({
      site_id: site.id,
      org_id: site.org_id,
      user_id: user.id,
      body: input.body,
      assessment_id: input.assessmentId ?? null,
      month: input.month ?? null,
      flag_id: input.flagId ?? null,
      mentions: JSON.stringify(mentioned.map((p) => p.id)),
      ...(args.now ? { created_at: args.now } : {}),
    })
    .returningAll()
    .executeTakeFirstOrThrow()
  const pointsAt = commentPointsAt({ assessmentId: row.assessment_id, month: row.month, flagId: input.flagId ?? null })
  const mail = commentMentionMail({ siteName: site.name, authorName: user.name, body: row.body, pointsAt, link: args.mailer.link(siteReviewPath(site.id)) })
  await sendAll(args.mailer, mentioned.map((p) => ({ to: p.email, ...mail, kind: 'comment-mention' as const, orgId: site.org_id })))
  return { comment: (await commentDtos(db, [row]))[0]!, mentions: mentioned.map((p) => p.id) }
}

/** One page of a site's comment thread, oldest first. */
export async function listComments(db: Kysely<Database>, siteId: number, page: number, pageSize: number): Promise<{ total: number; comments: CommentDto[] }> {
  const [rows, total] = await Promise.all([
    db.selectFrom('comments').selectAll().where('site_id', '=', siteId).orderBy('id').limit(pageSize).offset((page - 1) * pageSize).execute(),
    db.selectFrom('comments').select((eb) => eb.fn.countAll<number>().as('n')).where('site_id', '=', siteId).executeTakeFirstOrThrow(),
  ])
  return { total: Number(total.n), comments: await commentDtos(db, rows) }
}

/**
 * What the reviewer judges, read from the stored result of the assessment under review (never
 * recomputed). 409 while draft, or when the assessment under review no longer exists.
 */
export async function loadReviewBrief(db: Kysely<Database>, site: SiteRow): Promise<ReviewBriefDto> {
  const current = await db.selectFrom('site_reviews').select(['state', 'assessment_id']).where('site_id', '=', site.id).executeTakeFirst()
  if (!current) throw conflict('review: the review is draft (not yet submitted): there is no assessment under review', { state: 'draft' })
  const assessment = current.assessment_id === null ? null : await reviewAssessmentRef(db, site.id, current.assessment_id)
  const payload =
    assessment &&
    (await db
      .selectFrom('assessment_payloads')
      .select([
        'result_json',
        sql<string>`json_extract(input_json, '$.reservedFlow')`.as('reserved_json'),
        sql<number | null>`json_extract(input_json, '$.settings.acceptableOxygenLoss_mgL')`.as('acceptable_loss_mgl'),
      ])
      .where('assessment_id', '=', assessment.id)
      .executeTakeFirst())
  if (!assessment || !payload) {
    throw conflict(`review: the assessment under review no longer exists (the review is ${current.state}); submit another`, { state: current.state })
  }
  const result = JSON.parse(payload.result_json) as AssessResult
  const setting = (payload.reserved_json ? JSON.parse(payload.reserved_json) : JSON.parse(site.reserved_flow)) as ReservedFlow
  const brief = reviewBrief(result, setting, payload.acceptable_loss_mgl)
  const [currency, consents, commissioning] = await Promise.all([organisationCurrency(db, site.org_id), loadConsentSummary(db, site.id), latestCommissioningLine(db, site.id)])
  return { siteId: site.id, siteName: site.name, assessment, ...brief, money: { ...brief.money, currency }, consents, commissioning }
}
