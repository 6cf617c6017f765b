import { weirHeadsLine } from '../../shared/utils/weirHeads'
import { sql, type Kysely } from 'kysely'
import type { Database, SiteRow, SummaryLinkRow } from '../../db/schema'
import { storedVerdict, type StoredMoney } from '../../shared/engine/money'
import { baselineLineOf } from '../../shared/engine/baseline'
import type { AssessResult } from '../../shared/engine/results'
import type { OptionDesign } from '../../shared/schemas/option'
import type { Currency } from '../../shared/schemas/organisation'
import { REVIEW_STATE_LABELS, type ReviewState } from '../../shared/schemas/review'
import type { Reach } from '../../shared/schemas/site'
import { HOME_KWH_PER_YEAR, type PublicSummaryDto, type SummaryLinkDto, type SummaryLinkState } from '../../shared/schemas/summaryLink'
import { CAUTIONS } from '../../shared/utils/cautions'
import { whatStaysSentence } from '../../shared/utils/depletedReachWords'
import { howSureOf, howSureSentences } from '../../shared/utils/howSure'
import { loadConsentSummary } from './consents'
import { latestCommissioningLine } from './commissioning'
import { conflict } from './errors'
import { hashLinkToken, linkTokenMatches, newLinkToken } from './tokens'

// Summary links: their list rows, and the landowner summary one opens. The summary is built only
// from named fields (never a row spread), so nothing but what PublicSummaryDto lists can leave.

/** The state of a link at `now`: revoked wins over expired. */
export function summaryLinkState(row: Pick<SummaryLinkRow, 'revoked_at' | 'expires_at'>, now = new Date().toISOString()): SummaryLinkState {
  if (row.revoked_at) return 'revoked'
  return row.expires_at <= now ? 'expired' : 'active'
}

/** A link row (with its site's and creator's names) as its managers see it. */
export function summaryLinkDto(row: SummaryLinkRow & { site_name: string; creator_name: string | null }): SummaryLinkDto {
  return {
    id: row.id,
    siteId: row.site_id,
    siteName: row.site_name,
    note: row.note,
    state: summaryLinkState(row),
    createdAt: row.created_at,
    expiresAt: row.expires_at,
    revokedAt: row.revoked_at,
    viewCount: row.view_count,
    lastViewedAt: row.last_viewed_at,
    createdBy: row.created_by !== null && row.creator_name ? { id: row.created_by, name: row.creator_name } : null,
  }
}

/** Summary-link rows with their site and creator names, for list routes to filter and page. */
export function summaryLinkQuery(db: Kysely<Database>) {
  return db
    .selectFrom('summary_links')
    .innerJoin('sites', 'sites.id', 'summary_links.site_id')
    .leftJoin('users', 'users.id', 'summary_links.created_by')
    .selectAll('summary_links')
    .select(['sites.name as site_name', 'users.name as creator_name'])
}

/** SQL condition for a link state (for list filters). */
export function summaryLinkStateCondition(state: SummaryLinkState, now = new Date().toISOString()) {
  if (state === 'revoked') return sql<boolean>`summary_links.revoked_at is not null`
  if (state === 'expired') return sql<boolean>`summary_links.revoked_at is null and summary_links.expires_at <= ${now}`
  return sql<boolean>`summary_links.revoked_at is null and summary_links.expires_at > ${now}`
}

const fmt = (x: number, digits = 2) => x.toFixed(digits)

/** What would be built, in plain words. */
export function schemeInPlainWords(design: Pick<OptionDesign, 'units' | 'throatDiameter_m' | 'outletDiameter_m'>): string {
  const units = design.units === 1 ? 'One venturi unit' : `${design.units} venturi units`
  return (
    `${units} set in the weir, each a pipe that narrows to a ${fmt(design.throatDiameter_m)} m throat and widens again to ${fmt(design.outletDiameter_m)} m where it meets the pool below. ` +
    'River water runs through them; the suction at the narrow throat draws air down a pipe from the bank, the air turns a small turbine that makes electricity, and the bubbles add oxygen to the river.'
  )
}

/** Whole homes whose yearly use the energy would cover, at the illustrative figure. */
export const homesEquivalent = (annualEnergy_MWh: number) => Math.max(0, Math.floor((annualEnergy_MWh * 1000) / HOME_KWH_PER_YEAR))

/** Everything the summary is built from. */
export interface SummarySources {
  site: Pick<SiteRow, 'name' | 'river_name' | 'lat' | 'lng' | 'reach' | 'gross_head_m' | 'target_oxygen_mgl'>
  organisationName: string
  /** The organisation's currency: the summary's amounts are in it. */
  currency: Currency
  creatorName: string | null
  expiresAt: string
  review: { state: ReviewState; reason: string | null; conditions: string | null; decidedAt: string | null }
  assessment: {
    kind: 'under-review' | 'latest'
    createdAt: string
    engineVersion: string
    optionName: string
    design: Pick<OptionDesign, 'units' | 'throatDiameter_m' | 'outletDiameter_m'>
    result: AssessResult
    /** The acceptable oxygen loss the run used, mg/L; null when the stored input does not say. */
    acceptableOxygenLoss_mgL: number | null
  } | null
  /** The consents list in one plain line, with the gauging-station warning. */
  permissions?: { line: string; gaugingWarning: string | null } | null
  /** The latest commissioning record's plain line, if the scheme has been measured. */
  commissioning?: string | null
}

/** The landowner summary from its sources: only the named fields, no ids, no e-mail addresses. */
export function buildPublicSummary(s: SummarySources): PublicSummaryDto {
  const a = s.assessment
  const decided = s.review.state === 'accepted' || s.review.state === 'accepted-with-conditions' || s.review.state === 'returned'
  const cautions = CAUTIONS.map((c) => ({ title: c.title, text: c.text }))
  if (a) {
    for (const f of a.result.summary.flags) if (f.raised && f.safety) cautions.push({ title: `Check raised: ${f.id.replaceAll('-', ' ')}`, text: f.reason })
  }
  let river: PublicSummaryDto['river'] = null
  if (a) {
    const slf = a.result.summary.summerLowFlow
    const gain = a.result.summary.netOxygenGainSummerLowFlow_mgL
    const monthName = a.result.months.find((m) => m.month === slf.month)?.name ?? `month ${slf.month}`
    const target = a.result.months[0]?.target_mgL ?? s.site.target_oxygen_mgl
    river = {
      target_mgL: target,
      months: a.result.months.map((m) => ({ month: m.month, name: m.name, without_mgL: m.downstreamWithout_mgL, with_mgL: m.downstreamWith_mgL, target_mgL: m.target_mgL })),
      summary:
        gain >= 0
          ? `At summer low flow (${monthName}, about ${fmt(slf.flow_m3s)} m³/s) the scheme would add about ${fmt(gain)} mg/L of dissolved oxygen below the weir, compared with the weir alone.`
          : `At summer low flow (${monthName}, about ${fmt(slf.flow_m3s)} m³/s) the river below the weir would carry about ${fmt(-gain)} mg/L less dissolved oxygen than with the weir alone.`,
      ...(a.result.depletedReach ? { whatStays: whatStaysSentence(a.result.depletedReach) } : {}),
    }
    // only where heads come from the weir's hydraulics: a site with a head table has no such line
    const heads = weirHeadsLine(a.result.perFlow)
    if (heads) river.weirHeads = heads.plain
  }
  let howSure: PublicSummaryDto['howSure'] = null
  if (a) {
    const h = howSureOf(a.result, a.acceptableOxygenLoss_mgL)
    howSure = {
      recordP90Energy_MWh: h.record?.p90Energy_MWh ?? null,
      energyP90_MWh: h.monteCarlo?.energyP90_MWh ?? null,
      netLossProbability: h.monteCarlo?.netLossProbability ?? null,
      sentences: howSureSentences(h),
    }
  }
  return {
    site: {
      name: s.site.name,
      riverName: s.site.river_name,
      location: { lat: s.site.lat, lng: s.site.lng },
      reach: s.site.reach ? (JSON.parse(s.site.reach) as Reach) : null,
      grossHead_m: s.site.gross_head_m,
    },
    scheme: a
      ? { optionName: a.optionName, units: a.design.units, throatDiameter_m: a.design.throatDiameter_m, outletDiameter_m: a.design.outletDiameter_m, description: schemeInPlainWords(a.design) }
      : null,
    basis: a ? { kind: a.kind, assessedAt: a.createdAt, engineVersion: a.engineVersion } : null,
    energy: a
      ? {
          annualEnergy_MWh: a.result.summary.annualEnergy_MWh,
          homesEquivalent: homesEquivalent(a.result.summary.annualEnergy_MWh),
          annualUsePerHome_kWh: HOME_KWH_PER_YEAR,
          assumption: `Illustrative: a home is taken to use ${HOME_KWH_PER_YEAR.toLocaleString('en-GB')} kWh of electricity a year; real homes use more or less.`,
          source: 'illustrative',
          baseline: baselineLineOf(a.result),
        }
      : null,
    money: a ? { ...publicMoney(a.result.money), currency: s.currency } : null,
    river,
    howSure,
    review: {
      state: s.review.state,
      stateLabel: REVIEW_STATE_LABELS[s.review.state],
      decisionText: decided ? s.review.reason : null,
      conditions: decided ? s.review.conditions : null,
      decidedAt: decided ? s.review.decidedAt : null,
    },
    cautions,
    contact: { organisationName: s.organisationName, preparedBy: s.creatorName },
    expiresAt: s.expiresAt,
    permissions: s.permissions ?? null,
    commissioning: s.commissioning ?? null,
  }
}

/** The money figures the summary shows (named fields only), the verdict worked out again for an older run. */
function publicMoney(m: StoredMoney): Omit<NonNullable<PublicSummaryDto['money']>, 'currency'> {
  return {
    capex: m.capex, annualOpex: m.annualOpex, annualRevenue: m.annualRevenue, npv: m.npv, lcoe: m.lcoe,
    ...(m.exportPrice === undefined ? {} : { exportPrice: m.exportPrice }),
    ...storedVerdict(m),
  }
}

/** Loads the sources of a live link's summary: the assessment under review, else the site's latest of a live option. */
export async function loadPublicSummary(db: Kysely<Database>, link: SummaryLinkRow, site: SiteRow): Promise<PublicSummaryDto> {
  const [org, creator, review, consents] = await Promise.all([
    db.selectFrom('organisations').select(['name', 'currency_code', 'currency_symbol']).where('id', '=', site.org_id).executeTakeFirstOrThrow(),
    link.created_by === null ? undefined : db.selectFrom('users').select('name').where('id', '=', link.created_by).executeTakeFirst(),
    db.selectFrom('site_reviews').selectAll().where('site_id', '=', site.id).executeTakeFirst(),
    loadConsentSummary(db, site.id),
  ])
  const pick = (q: ReturnType<typeof assessmentQuery>) => q.executeTakeFirst()
  const assessmentQuery = () =>
    db
      .selectFrom('assessments')
      .innerJoin('options', 'options.id', 'assessments.option_id')
      .innerJoin('assessment_payloads', 'assessment_payloads.assessment_id', 'assessments.id')
      .select([
        'assessments.created_at',
        'assessments.engine_version',
        'options.name as option_name',
        'assessment_payloads.result_json',
        sql<string>`json_extract(assessment_payloads.input_json, '$.option')`.as('option_json'),
        sql<number | null>`json_extract(assessment_payloads.input_json, '$.settings.acceptableOxygenLoss_mgL')`.as('acceptable_loss_mgl'),
      ])
      .where('assessments.site_id', '=', site.id)
  let kind: 'under-review' | 'latest' = 'under-review'
  let row = review?.assessment_id ? await pick(assessmentQuery().where('assessments.id', '=', review.assessment_id)) : undefined
  if (!row) {
    kind = 'latest'
    row = await pick(assessmentQuery().where('options.deleted_at', 'is', null).orderBy('assessments.id', 'desc').limit(1))
  }
  return buildPublicSummary({
    site,
    organisationName: org.name,
    currency: { code: org.currency_code, symbol: org.currency_symbol },
    creatorName: creator?.name ?? null,
    expiresAt: link.expires_at,
    permissions: { line: consents.line, gaugingWarning: consents.gaugingWarning },
    commissioning: (await latestCommissioningLine(db, site.id))?.sentence ?? null,
    review: { state: review?.state ?? 'draft', reason: review?.reason ?? null, conditions: review?.conditions ?? null, decidedAt: review?.decided_at ?? null },
    assessment: row
      ? {
          kind,
          createdAt: row.created_at,
          engineVersion: row.engine_version,
          optionName: row.option_name,
          design: JSON.parse(row.option_json) as OptionDesign,
          result: JSON.parse(row.result_json) as AssessResult,
          acceptableOxygenLoss_mgL: row.acceptable_loss_mgl,
        }
      : null,
  })
}

const DAY_MS = 24 * 60 * 60 * 1000

/** One page of summary links (of a site, or of every site of an organisation), newest first, with the total. */
export async function listSummaryLinks(
  db: Kysely<Database>,
  scope: { siteId: number } | { orgId: number },
  query: { state?: SummaryLinkState; page: number; pageSize: number },
): Promise<{ total: number; links: SummaryLinkDto[] }> {
  let q = 'siteId' in scope ? summaryLinkQuery(db).where('summary_links.site_id', '=', scope.siteId) : summaryLinkQuery(db).where('summary_links.org_id', '=', scope.orgId)
  if (query.state) q = q.where(summaryLinkStateCondition(query.state))
  const [rows, total] = await Promise.all([
    q.orderBy('summary_links.id', 'desc').limit(query.pageSize).offset((query.page - 1) * query.pageSize).execute(),
    q.clearSelect().select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
  ])
  return { total: Number(total.n), links: rows.map(summaryLinkDto) }
}

/**
 * Makes a summary link for a site at `now` (default: the database's clock); the token is returned
 * here only (the database keeps its hash). `token` is for the demo's fixed link; any other link gets
 * a fresh random one.
 */
export async function createSummaryLink(
  db: Kysely<Database>,
  args: { site: Pick<SiteRow, 'id' | 'org_id' | 'name'>; user: { id: number; name: string }; expiresIn_d: number; note: string | null; now?: number; token?: string },
): Promise<{ link: SummaryLinkDto; token: string }> {
  const token = args.token ?? newLinkToken()
  const expiresAt = new Date((args.now ?? Date.now()) + args.expiresIn_d * DAY_MS).toISOString()
  const row = await db
    .insertInto('summary_links')
    .values({
      site_id: args.site.id,
      org_id: args.site.org_id,
      token_hash: hashLinkToken(token),
      note: args.note || null,
      created_by: args.user.id,
      expires_at: expiresAt,
      ...(args.now === undefined ? {} : { created_at: new Date(args.now).toISOString() }),
    })
    .returningAll()
    .executeTakeFirstOrThrow()
  return { link: summaryLinkDto({ ...row, site_name: args.site.name, creator_name: args.user.name }), token }
}

/** The link with this id, whatever its state; undefined when there is none. */
export async function summaryLinkById(db: Kysely<Database>, linkId: number): Promise<SummaryLinkRow | undefined> {
  return db.selectFrom('summary_links').selectAll().where('id', '=', linkId).executeTakeFirst()
}

/** Revokes a link at once (409 when it already was); it stays in the lists as revoked. Returns it and its state before. */
export async function revokeSummaryLink(
  db: Kysely<Database>,
  args: { link: SummaryLinkRow; siteName: string; userId: number; now: string },
): Promise<{ link: SummaryLinkDto; before: SummaryLinkState }> {
  const { link, now } = args
  const updated = await db
    .updateTable('summary_links')
    .set({ revoked_at: now, revoked_by: args.userId })
    .where('id', '=', link.id)
    .where('revoked_at', 'is', null)
    .returningAll()
    .executeTakeFirst()
  if (!updated) throw conflict(`summary link: already revoked (${link.revoked_at})`)
  const creator = link.created_by === null ? undefined : await db.selectFrom('users').select('name').where('id', '=', link.created_by).executeTakeFirst()
  return { link: summaryLinkDto({ ...updated, site_name: args.siteName, creator_name: creator?.name ?? null }), before: summaryLinkState(link, now) }
}

/** The link a presented token stands for, whatever its state, or null when no link has it. */
export async function summaryLinkByToken(db: Kysely<Database>, token: string): Promise<SummaryLinkRow | null> {
  const link = await db.selectFrom('summary_links').selectAll().where('token_hash', '=', hashLinkToken(token)).executeTakeFirst()
  return link && linkTokenMatches(token, link.token_hash) ? link : null
}

/**
 * The landowner summary behind a link, or null when the link no longer works (expired, revoked, or
 * its site deleted). `countView` counts the opening.
 */
export async function openSummary(db: Kysely<Database>, link: SummaryLinkRow, now: string, countView: boolean): Promise<PublicSummaryDto | null> {
  if (summaryLinkState(link, now) !== 'active') return null
  const site = await db.selectFrom('sites').selectAll().where('id', '=', link.site_id).where('deleted_at', 'is', null).executeTakeFirst()
  if (!site) return null
  const summary = await loadPublicSummary(db, link, site)
  if (countView) {
    await db
      .updateTable('summary_links')
      .set((eb) => ({ view_count: eb('view_count', '+', 1), last_viewed_at: now }))
      .where('id', '=', link.id)
      .execute()
  }
  return summary
}
