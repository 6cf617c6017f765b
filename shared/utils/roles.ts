/** Roles a person can hold in one organisation, strongest first. */
export const ROLES = ['admin', 'engineer', 'reviewer', 'viewer'] as const
export type Role = (typeof ROLES)[number]

/** Plain-language label for each role, as shown in the UI. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  engineer: 'Project engineer',
  reviewer: 'Reviewer',
  viewer: 'Viewer',
}

/** Roles that may change sites, options and assessments. */
export const EDITOR_ROLES: readonly Role[] = ['admin', 'engineer']
/** Every role of an organisation: all of them may read. */
export const READER_ROLES: readonly Role[] = [...ROLES]

/** True when the role may manage members, roles and the audit trail. */
export const canAdminister = (role: Role | null | undefined): boolean => role === 'admin'
/** True when the role may create or change sites, options and assessments. */
export const canEdit = (role: Role | null | undefined): boolean => !!role && EDITOR_ROLES.includes(role)
/** True when the role may record a review decision. */
export const canReview = (role: Role | null | undefined): boolean => role === 'reviewer' || role === 'admin'
