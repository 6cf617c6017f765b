import type { H3Event } from 'h3'
import { assessmentById } from '../domain/assessments'
import { liveAttachmentById } from '../domain/attachments'
import { liveCommissioningRecordById } from '../domain/commissioning'
import { grantedSiteRole, roleIn } from '../domain/members'
import { liveOptionById } from '../domain/options'
import { siteById } from '../domain/sites'
import type { Role } from '../../shared/utils/roles'

// The gates of record-scoped routes: a site, an option, an assessment or an attachment is loaded
// and the caller's role on it checked before anything else happens. Organisation-scoped routes use
// requireRole (auth.ts).

const notFoundError = (message: string) => createError({ statusCode: 404, statusMessage: 'Not Found', message })

/**
 * Gate for every site-scoped route: 401 signed out, 404 when the site does not exist, is
 * soft-deleted (unless `deleted: 'only'`, for the admin's restore) or belongs to an organisation the
 * user is not in, 403 when their role is not in `roles`.
 */
export async function requireSite(event: H3Event, siteId: number, roles: readonly Role[], opts: { deleted?: 'only'; notFound?: string } = {}) {
  await requireUser(event)
  const notFound = opts.notFound ?? 'Site not found'
  const site = await siteById(useDb(), siteId)
  if (!site) throw notFoundError(notFound)
  const isDeleted = site.deleted_at !== null
  if (isDeleted && opts.deleted !== 'only') throw notFoundError(notFound)
  // A single-site grant (an invited reviewer, migration 0004) counts as the reviewer role on this site only.
  const grant = await siteGrantRole(event, site.id, site.org_id, roles)
  const { user, role } = grant ?? (await requireRole(event, site.org_id, roles, notFound))
  if (!isDeleted && opts.deleted === 'only') throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'Site is not deleted' })
  return { user, role, site }
}

/**
 * The role a single-site grant gives on this site when the user is not a member of its organisation
 * (or only a viewer): reviewer, with 403 when `roles` leaves reviewers out; null to fall back to
 * `requireRole`.
 */
async function siteGrantRole(event: H3Event, siteId: number, orgId: number, roles: readonly Role[]): Promise<{ user: Awaited<ReturnType<typeof requireUser>>; role: Role } | null> {
  const user = await requireUser(event)
  const member = await roleIn(useDb(), user.id, orgId)
  if (member && member !== 'viewer') return null
  const role = await grantedSiteRole(useDb(), user.id, siteId)
  if (!role) return null
  if (!roles.includes(role)) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `This needs the ${roles.join(' or ')} role; you are reviewer of this site` })
  }
  return { user, role }
}

/** Loads a live attachment of a live site and checks the role as `requireSite` does; 404 otherwise. */
export async function requireAttachment(event: H3Event, attachmentId: number, roles: readonly Role[]) {
  await requireUser(event)
  const attachment = await liveAttachmentById(useDb(), attachmentId)
  if (!attachment) throw notFoundError('Attachment not found')
  const { user, role, site } = await requireSite(event, attachment.site_id, roles, { notFound: 'Attachment not found' })
  return { user, role, site, attachment }
}

/**
 * Gate for every option-scoped route: 401 signed out, 404 when the option does not exist, is
 * soft-deleted, or its site is deleted or belongs to an organisation the user is not in; 403 when
 * the user's role is not in `roles`.
 */
export async function requireOption(event: H3Event, optionId: number, roles: readonly Role[], notFound = 'Option not found') {
  await requireUser(event)
  const option = await liveOptionById(useDb(), optionId)
  if (!option) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: notFound })
  const { user, role, site } = await requireSite(event, option.site_id, roles, { notFound })
  return { user, role, site, option }
}

/** Gate for an assessment: as `requireOption` for the option it belongs to; 404 when it does not exist. */
export async function requireAssessment(event: H3Event, assessmentId: number, roles: readonly Role[]) {
  await requireUser(event)
  const assessment = await assessmentById(useDb(), assessmentId)
  if (!assessment) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Assessment not found' })
  const { user, role, site, option } = await requireOption(event, assessment.option_id, roles, 'Assessment not found')
  return { user, role, site, option, assessment }
}


/** Loads a live commissioning record of a live site and checks the role as `requireSite` does; 404 otherwise. */
export async function requireCommissioningRecord(event: H3Event, recordId: number, roles: readonly Role[]) {
  await requireUser(event)
  const record = await liveCommissioningRecordById(useDb(), recordId)
  if (!record) throw notFoundError('Commissioning record not found')
  const { user, role, site } = await requireSite(event, record.site_id, roles, { notFound: 'Commissioning record not found' })
  return { user, role, site, record }
}
