import type { ReviewEventRow, SiteRow } from '../../db/schema'
import type { FlagId } from '../../shared/engine/assess'
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
} from '../../shared/schemas/review'
import type { Role } from '../../shared/utils/roles'

// Database side of the review: loading a site's review, its history and comments as the API shows
// them, and who the review's e-mails go to. The state machine itself is pure, in review.ts.

/** The current state of a site's review (draft when it has never been submitted). */
export async function reviewStateOf(siteId: number): Promise<ReviewState> {
  const row = await useDb().selectFrom('site_reviews').select('state').where('site_id', '=', siteId).executeTakeFirst()
  return row?.state ?? 'draft'
}

/** Names of the given user ids. */
export async function peopleById(ids: readonly (number | null)[]): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))]
  if (!wanted.length) return new Map()
  const rows = await useDb().selectFrom('users').select(['id', 'name']).where('id', 'in', wanted).execute()
  return new Map(rows.map((r) => [r.id, r.name]))
}

const ref = (names: Map<number, string>, id: number | null): PersonRef | null => (id !== null && names.has(id) ? { id, name: names.get(id)! } : null)

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
    at: row.created_at,
  }
}

/** An assessment of the site with its option's name and headline figures, or null when it is not this site's. */
export async function reviewAssessmentRef(siteId: number, assessmentId: number): Promise<ReviewAssessmentRef | null> {
  const row = await useDb()
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
    annualEnergyMWh: row.annual_energy_mwh,
    netOxygenGainSlfMgL: row.net_oxygen_gain_slf_mgl,
    flagsRaised: JSON.parse(row.flags_raised) as FlagId[],
  }
}

/** GET /api/sites/[id]/review for a caller holding `role` on the site. */
export async function loadReview(site: SiteRow, role: Role): Promise<ReviewDto> {
  const db = useDb()
  const [current, events] = await Promise.all([
    db.selectFrom('site_reviews').selectAll().where('site_id', '=', site.id).executeTakeFirst(),
    db.selectFrom('review_events').selectAll().where('site_id', '=', site.id).orderBy('id').execute(),
  ])
  const state: ReviewState = current?.state ?? 'draft'
  const names = await peopleById([current?.submitted_by ?? null, current?.decided_by ?? null, ...events.map((e) => e.user_id)])
  const assessment = current?.assessment_id ? await reviewAssessmentRef(site.id, current.assessment_id) : null
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
        ? { decision: state as ReviewDecision, reason: current.reason ?? '', conditions: current.conditions, by: ref(names, current.decided_by), at: current.decided_at }
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
export async function siteReviewers(site: Pick<SiteRow, 'id' | 'org_id'>): Promise<Recipient[]> {
  const db = useDb()
  const [members, granted] = await Promise.all([
    db.selectFrom('memberships').innerJoin('users', 'users.id', 'memberships.user_id').select(['users.id', 'users.name', 'users.email']).where('memberships.org_id', '=', site.org_id).where('memberships.role', '=', 'reviewer').execute(),
    db.selectFrom('site_grants').innerJoin('users', 'users.id', 'site_grants.user_id').select(['users.id', 'users.name', 'users.email']).where('site_grants.site_id', '=', site.id).execute(),
  ])
  return uniquePeople([...members, ...granted])
}

/** The organisation's members with the given roles. */
export async function membersWithRoles(orgId: number, roles: readonly Role[]): Promise<Recipient[]> {
  return useDb()
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['users.id', 'users.name', 'users.email'])
    .where('memberships.org_id', '=', orgId)
    .where('memberships.role', 'in', [...roles])
    .orderBy('users.id')
    .execute()
}

/** Everyone who can read the site: the organisation's members and its single-site reviewers. */
export async function siteReaders(site: Pick<SiteRow, 'id' | 'org_id'>): Promise<Recipient[]> {
  const db = useDb()
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
export async function commentDtos(rows: readonly { id: number; site_id: number; body: string; user_id: number | null; assessment_id: number | null; month: number | null; flag_id: string | null; mentions: string; created_at: string }[]): Promise<CommentDto[]> {
  const mentionIds = rows.flatMap((r) => JSON.parse(r.mentions) as number[])
  const names = await peopleById([...rows.map((r) => r.user_id), ...mentionIds])
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
