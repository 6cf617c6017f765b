// The consents and constraints list of a site: its permissions (a kind nobody has saved is "not
// started"), the constraints the checks need, and the checks themselves (noise at the nearest
// dwelling, eel screening, a gauging station), read from stored rows only. Plain functions over a
// Kysely handle; routes, the seed and the brief call them.
import { sql, type Kysely } from 'kysely'
import type { Database, SiteConsentRow, SiteConstraintsRow, SiteRow } from '../../db/schema'
import { DEFAULT_NOISE_LIMIT, noiseCheck } from '../../shared/engine/noise'
import type { ConsentDto, ConsentListDto, ConsentNoiseDto, ConsentPatch, ConsentSchemeRef, ConsentSummaryDto, ConstraintsDto, ConstraintsPatch } from '../../shared/schemas/consent'
import {
  CONSENT_KIND_INFO,
  CONSENT_KINDS,
  CONSENT_STATUS_LABELS,
  GAUGING_STATION_WARNING,
  consentCounts,
  eelScreeningCheck,
  isOutstanding,
  permissionsLine,
  type ConsentKind,
  type ConsentStatus,
} from '../../shared/utils/consents'
import { peopleById } from './accounts'
import { conflict, unprocessable } from './errors'
import { inTransaction } from './transaction'

/** A permission row as the list shows it; `row` undefined gives the unsaved kind (not started, version 0). */
function consentDto(kind: ConsentKind, row: SiteConsentRow | undefined, names: Map<number, string>): ConsentDto {
  const info = CONSENT_KIND_INFO[kind]
  const status = (row?.status ?? 'not-started') as ConsentStatus
  const by = row?.updated_by ?? null
  return {
    kind,
    label: info.label,
    why: info.why,
    source: info.source,
    status,
    statusLabel: CONSENT_STATUS_LABELS[status],
    reference: row?.reference ?? '',
    appliedOn: row?.applied_on ?? null,
    decidedOn: row?.decided_on ?? null,
    conditions: row?.conditions ?? '',
    notes: row?.notes ?? '',
    version: row?.version ?? 0,
    updatedAt: row?.updated_at ?? null,
    updatedBy: by !== null && names.has(by) ? { id: by, name: names.get(by)! } : null,
  }
}

function constraintsDto(row: SiteConstraintsRow | undefined): ConstraintsDto {
  return {
    nearestDwelling_m: row?.nearest_dwelling_m ?? null,
    noiseLimit_dBA: row?.noise_limit_dba ?? null,
    isGaugingStation: !!row?.is_gauging_station,
    version: row?.version ?? 0,
  }
}

/** Every permission of a site, in CONSENT_KINDS order, unsaved kinds as not started. */
export async function siteConsents(db: Kysely<Database>, siteId: number): Promise<ConsentDto[]> {
  const rows = await db.selectFrom('site_consents').selectAll().where('site_id', '=', siteId).execute()
  const byKind = new Map(rows.map((r) => [r.kind, r]))
  const names = await peopleById(db, rows.map((r) => r.updated_by))
  return CONSENT_KINDS.map((k) => consentDto(k, byKind.get(k), names))
}

async function constraintsRow(db: Kysely<Database>, siteId: number): Promise<SiteConstraintsRow | undefined> {
  return db.selectFrom('site_constraints').selectAll().where('site_id', '=', siteId).executeTakeFirst()
}

/**
 * The scheme the checks are about: the option of the assessment under review, else of the site's
 * newest assessment of a live option, else the newest live option; null for a site without options.
 * Its design flow (units × one unit's capacity at the gross head) comes from that assessment's stored result.
 */
export async function consentScheme(db: Kysely<Database>, siteId: number): Promise<(ConsentSchemeRef & { designFlow_m3s: number | null }) | null> {
  const underReview = await db
    .selectFrom('site_reviews')
    .innerJoin('assessments', 'assessments.id', 'site_reviews.assessment_id')
    .innerJoin('options', 'options.id', 'assessments.option_id')
    .select('assessments.id')
    .where('site_reviews.site_id', '=', siteId)
    .where('options.deleted_at', 'is', null)
    .executeTakeFirst()
  const newest = underReview ?? (await db
    .selectFrom('assessments')
    .innerJoin('options', 'options.id', 'assessments.option_id')
    .select('assessments.id')
    .where('assessments.site_id', '=', siteId)
    .where('options.deleted_at', 'is', null)
    .orderBy('assessments.id', 'desc')
    .limit(1)
    .executeTakeFirst())
  const optionColumns = [
    'options.id as option_id',
    'options.name as option_name',
    sql<number | null>`json_extract(options.design, '$.units')`.as('units'),
    sql<number | null>`json_extract(options.design, '$.turbine.soundPower_dBA')`.as('sound_power'),
  ] as const
  if (newest) {
    const row = await db
      .selectFrom('assessments')
      .innerJoin('options', 'options.id', 'assessments.option_id')
      .innerJoin('assessment_payloads', 'assessment_payloads.assessment_id', 'assessments.id')
      .select([...optionColumns, sql<number | null>`json_extract(assessment_payloads.result_json, '$.money.designFlow_m3s')`.as('design_flow')])
      .where('assessments.id', '=', newest.id)
      .executeTakeFirst()
    if (row) return schemeRef(row, newest.id, row.design_flow)
  }
  const option = await db
    .selectFrom('options')
    .select([...optionColumns])
    .where('site_id', '=', siteId)
    .where('deleted_at', 'is', null)
    .orderBy('id', 'desc')
    .limit(1)
    .executeTakeFirst()
  return option ? schemeRef(option, null, null) : null
}

function schemeRef(row: { option_id: number; option_name: string; units: number | null; sound_power: number | null }, assessmentId: number | null, designFlow: number | null) {
  return {
    optionId: row.option_id,
    optionName: row.option_name,
    units: typeof row.units === 'number' && row.units >= 1 ? row.units : 1,
    soundPower_dBA: typeof row.sound_power === 'number' ? row.sound_power : null,
    assessmentId,
    designFlow_m3s: typeof designFlow === 'number' ? designFlow : null,
  }
}

/** The noise check at the nearest dwelling, or what is missing for it. */
function noiseOf(constraints: ConstraintsDto, scheme: ConsentSchemeRef | null): ConsentNoiseDto {
  const limitIsDefault = constraints.noiseLimit_dBA === null
  const limit = constraints.noiseLimit_dBA ?? DEFAULT_NOISE_LIMIT.value
  const base = {
    limit_dBA: limit,
    limitIsDefault,
    limitSource: limitIsDefault ? DEFAULT_NOISE_LIMIT.source : 'set for this site',
    source: 'ISO 9613-2:1996, 7.1: spherical spreading from a point source, L_p = L_W − 20·lg(d) − 11 dB; units summed as incoherent sources, no ground or air absorption',
  }
  const missing = !scheme
    ? 'add an option to the site'
    : scheme.soundPower_dBA === null
      ? `enter the air turbine's sound power level in option "${scheme.optionName}"`
      : constraints.nearestDwelling_m === null
        ? 'enter the distance from the air turbines to the nearest dwelling'
        : null
  if (missing || !scheme || scheme.soundPower_dBA === null || constraints.nearestDwelling_m === null) return { ...base, check: null, missing }
  return { ...base, check: noiseCheck({ soundPower_dBA: scheme.soundPower_dBA, units: scheme.units, distance_m: constraints.nearestDwelling_m, limit_dBA: limit }), missing: null }
}

/** GET /api/sites/[id]/consents: every permission, the constraints and the checks. */
export async function loadConsentList(db: Kysely<Database>, site: Pick<SiteRow, 'id'>, canEdit: boolean): Promise<ConsentListDto> {
  const [consents, row, scheme] = await Promise.all([siteConsents(db, site.id), constraintsRow(db, site.id), consentScheme(db, site.id)])
  const constraints = constraintsDto(row)
  const { designFlow_m3s, ...schemeRefOnly } = scheme ?? { designFlow_m3s: null }
  return {
    siteId: site.id,
    consents,
    counts: consentCounts(consents),
    constraints,
    scheme: scheme ? (schemeRefOnly as ConsentSchemeRef) : null,
    noise: noiseOf(constraints, scheme),
    eelScreening: eelScreeningCheck(designFlow_m3s),
    gaugingWarning: constraints.isGaugingStation ? GAUGING_STATION_WARNING : null,
    canEdit,
  }
}

/** The consents block of the reviewer's brief and the landowner summary. */
export async function loadConsentSummary(db: Kysely<Database>, siteId: number): Promise<ConsentSummaryDto> {
  const [consents, row, scheme] = await Promise.all([siteConsents(db, siteId), constraintsRow(db, siteId), consentScheme(db, siteId)])
  const eel = eelScreeningCheck(scheme?.designFlow_m3s ?? null)
  return {
    counts: consentCounts(consents),
    total: consents.length,
    refused: consents.filter((c) => c.status === 'refused').map((c) => c.label),
    outstanding: consents.filter((c) => isOutstanding(c.status)).map((c) => c.label),
    line: permissionsLine(consents),
    gaugingWarning: row?.is_gauging_station ? GAUGING_STATION_WARNING : null,
    eelScreening: eel.triggered === null ? null : `Eel screening ${eel.message}`,
  }
}

/**
 * Changes one permission of a site when its stored version is still `patch.version` (0: never
 * saved); 409 naming the current version otherwise. A decision date before the application date
 * (the stored one when only one is given) is refused naming `decidedOn`. Returns the permission and
 * the fields given.
 */
export async function updateConsent(
  db: Kysely<Database>,
  args: { site: Pick<SiteRow, 'id' | 'org_id'>; kind: ConsentKind; patch: ConsentPatch; userId: number; now: string },
): Promise<{ consent: ConsentDto; changed: string[] }> {
  const { site, kind, userId, now } = args
  const { version, ...fields } = args.patch
  const changed = Object.keys(fields).filter((k) => fields[k as keyof typeof fields] !== undefined)
  const row = await inTransaction(db, async (trx) => {
    const current = await trx.selectFrom('site_consents').selectAll().where('site_id', '=', site.id).where('kind', '=', kind).executeTakeFirst()
    const currentVersion = current?.version ?? 0
    if (currentVersion !== version) {
      throw conflict(
        `version: the ${CONSENT_KIND_INFO[kind].label.toLowerCase()} was changed by someone else (now version ${currentVersion}, you sent ${version}); reload it and apply your change again`,
        { currentVersion, updatedAt: current?.updated_at ?? null },
      )
    }
    const appliedOn = fields.appliedOn !== undefined ? fields.appliedOn : (current?.applied_on ?? null)
    const decidedOn = fields.decidedOn !== undefined ? fields.decidedOn : (current?.decided_on ?? null)
    if (appliedOn && decidedOn && decidedOn < appliedOn) throw unprocessable('decidedOn', `must not be before the application date (${appliedOn})`)
    const cols = {
      ...(fields.status !== undefined ? { status: fields.status } : {}),
      ...(fields.reference !== undefined ? { reference: fields.reference } : {}),
      ...(fields.appliedOn !== undefined ? { applied_on: fields.appliedOn } : {}),
      ...(fields.decidedOn !== undefined ? { decided_on: fields.decidedOn } : {}),
      ...(fields.conditions !== undefined ? { conditions: fields.conditions } : {}),
      ...(fields.notes !== undefined ? { notes: fields.notes } : {}),
      updated_by: userId,
      updated_at: now,
    }
    if (!current) {
      return trx.insertInto('site_consents').values({ site_id: site.id, org_id: site.org_id, kind, created_by: userId, created_at: now, reference: '', conditions: '', notes: '', status: 'not-started', ...cols }).returningAll().executeTakeFirstOrThrow()
    }
    return trx
      .updateTable('site_consents')
      .set({ ...cols, version: sql<number>`version + 1` })
      .where('id', '=', current.id)
      .where('version', '=', version)
      .returningAll()
      .executeTakeFirstOrThrow()
  })
  const names = await peopleById(db, [row.updated_by])
  return { consent: consentDto(kind, row, names), changed }
}

/** Changes a site's constraints when the stored version is still `patch.version` (0: never saved); 409 otherwise. */
export async function updateConstraints(
  db: Kysely<Database>,
  args: { site: Pick<SiteRow, 'id' | 'org_id'>; patch: ConstraintsPatch; userId: number; now: string },
): Promise<{ constraints: ConstraintsDto; changed: string[] }> {
  const { site, userId, now } = args
  const { version, ...fields } = args.patch
  const changed = Object.keys(fields).filter((k) => fields[k as keyof typeof fields] !== undefined)
  const row = await inTransaction(db, async (trx) => {
    const current = await constraintsRow(trx, site.id)
    const currentVersion = current?.version ?? 0
    if (currentVersion !== version) {
      throw conflict(`version: the site's constraints were changed by someone else (now version ${currentVersion}, you sent ${version}); reload them and apply your change again`, {
        currentVersion,
        updatedAt: current?.updated_at ?? null,
      })
    }
    const cols = {
      ...(fields.nearestDwelling_m !== undefined ? { nearest_dwelling_m: fields.nearestDwelling_m } : {}),
      ...(fields.noiseLimit_dBA !== undefined ? { noise_limit_dba: fields.noiseLimit_dBA } : {}),
      ...(fields.isGaugingStation !== undefined ? { is_gauging_station: fields.isGaugingStation ? 1 : 0 } : {}),
      updated_by: userId,
      updated_at: now,
    }
    if (!current) return trx.insertInto('site_constraints').values({ site_id: site.id, org_id: site.org_id, ...cols }).returningAll().executeTakeFirstOrThrow()
    return trx.updateTable('site_constraints').set({ ...cols, version: sql<number>`version + 1` }).where('site_id', '=', site.id).where('version', '=', version).returningAll().executeTakeFirstOrThrow()
  })
  return { constraints: constraintsDto(row), changed }
}
