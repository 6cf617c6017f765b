// Invitations by e-mail (to the organisation, or as reviewer of one site only) and password reset.
// Shared by server/api/orgs/[orgId]/invitations*, server/api/invitations/**,
// server/api/auth/password-reset* and the invitation, accept and reset forms.
// Keep the exported names stable: the UI imports them.
import { z } from 'zod'
import type { Role } from '../utils/roles'
import { NewPasswordSchema, RoleSchema } from './auth'
import { EmailSchema, IdSchema, NameSchema, fromDigits } from './common'

/** How long an invitation stays open. */
export const INVITATION_TTL_DAYS = 7
/** How long a password-reset link stays open. */
export const PASSWORD_RESET_TTL_MINUTES = 60

/** Page a person opens from an invitation e-mail. */
export const invitationPath = (token: string) => `/invitations/${encodeURIComponent(token)}`
/** Page a person opens from a password-reset e-mail. */
export const passwordResetPath = (token: string) => `/reset-password/${encodeURIComponent(token)}`

/** States an invitation can be in (derived: accepted and revoked win over expired). */
export const INVITATION_STATES = ['pending', 'accepted', 'revoked', 'expired'] as const
export type InvitationState = (typeof INVITATION_STATES)[number]

export const INVITATION_STATE_LABELS: Record<InvitationState, string> = {
  pending: 'Waiting for an answer',
  accepted: 'Accepted',
  revoked: 'Revoked',
  expired: 'Expired',
}

/**
 * A token from a link as typed or pasted. Only its length is checked here: an unknown or malformed
 * token is answered like any unknown one, so the check reveals nothing.
 */
export const TokenSchema = z.string({ error: 'is required' }).trim().min(1, 'is required').max(200, 'is too long')

/**
 * Body of POST /api/orgs/[orgId]/invitations. With `siteId` the invitation is for that one site
 * only, and the role must be `reviewer`.
 */
export const InvitationInputSchema = z
  .object({
    email: EmailSchema,
    role: RoleSchema,
    siteId: IdSchema.optional(),
  })
  .refine((v) => v.siteId === undefined || v.role === 'reviewer', { path: ['role'], message: 'must be reviewer for a single-site invitation (siteId given)' })
export type InvitationInput = z.infer<typeof InvitationInputSchema>

/** Query of GET /api/orgs/[orgId]/invitations. */
export const InvitationListQuerySchema = z.object({
  state: z.enum(INVITATION_STATES, { error: `must be one of ${INVITATION_STATES.join(', ')}` }).optional(),
  page: fromDigits(z.number().int().min(1, 'must be 1 or more')).default(1),
  pageSize: fromDigits(z.number().int().min(1, 'must be 1 or more').max(200, 'must be 200 or less')).default(50),
})

// The three /api/invitations/… routes share one path segment, so they share its name (`key`): the
// router cannot tell two differently named parameters apart at the same place.
/** Route parameters of DELETE /api/invitations/[id] (the file's segment is `[key]`). */
export const InvitationIdParamsSchema = z.preprocess((p) => ({ id: (p as { key?: unknown } | null)?.key }), z.object({ id: IdSchema }))
/** Route parameters of GET /api/invitations/[token] and POST …/accept (the file's segment is `[key]`). */
export const InvitationTokenParamsSchema = z.preprocess((p) => ({ token: (p as { key?: unknown } | null)?.key }), z.object({ token: TokenSchema }))

/**
 * Body of POST /api/invitations/[token]/accept. Signed in as the invited e-mail: nothing needed.
 * Otherwise, for an e-mail with no account yet: `name` and `password` create it; for one with an
 * account: `password` signs in to it.
 */
export const InvitationAcceptSchema = z.object({
  name: NameSchema.optional(),
  password: NewPasswordSchema.optional(),
})
export type InvitationAcceptInput = z.infer<typeof InvitationAcceptSchema>

/** One invitation as admins see it. */
export interface InvitationDto {
  id: number
  email: string
  role: Role
  /** Set for a single-site reviewer invitation. */
  site: { id: number; name: string } | null
  state: InvitationState
  invitedBy: { id: number; name: string } | null
  createdAt: string
  expiresAt: string
  acceptedAt: string | null
  revokedAt: string | null
}

/** Response of POST /api/orgs/[orgId]/invitations (the link is e-mailed, never returned). */
export type InvitationCreatedDto = InvitationDto

/** GET /api/orgs/[orgId]/invitations. */
export interface InvitationListDto {
  page: number
  pageSize: number
  total: number
  invitations: InvitationDto[]
}

/** GET /api/invitations/[token]: what a pending invitation is for, and nothing more. */
export interface InvitationPublicDto {
  organisationName: string
  role: Role
  roleLabel: string
  /** The one site, for a single-site reviewer invitation. */
  siteName: string | null
  /** The address it was sent to (the holder of the link received it there). */
  email: string
  invitedByName: string | null
  expiresAt: string
  /** `sign-in`: an account uses this e-mail (sign in or give its password); `new-account`: give a name and password. */
  needs: 'sign-in' | 'new-account'
}

/** Response of POST /api/invitations/[token]/accept: the person is signed in afterwards. */
export interface InvitationAcceptedDto {
  user: { id: number; email: string; name: string }
  orgId: number
  role: Role
  /** For a single-site invitation: the site now open to them. */
  siteId: number | null
  /** True when the account was created by this acceptance. */
  created: boolean
}

/** Body of POST /api/auth/password-reset. Always answered 202, whether or not the account exists. */
export const PasswordResetRequestSchema = z.object({ email: EmailSchema })
export type PasswordResetRequestInput = z.infer<typeof PasswordResetRequestSchema>

/** Route parameters of POST /api/auth/password-reset/[token]. */
export const PasswordResetParamsSchema = z.object({ token: TokenSchema })
/** Body of POST /api/auth/password-reset/[token]. */
export const PasswordResetSchema = z.object({ password: NewPasswordSchema })
export type PasswordResetInput = z.infer<typeof PasswordResetSchema>
