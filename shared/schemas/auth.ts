import { z } from 'zod'
import { ROLES } from '../utils/roles'
import { EmailSchema, NameSchema } from './common'
import type { Currency } from './organisation'

export const PASSWORD_MIN = 10

/** A new password, wherever one is chosen (sign-up, reset, invitation, change). */
export const NewPasswordSchema = z
  .string({ error: 'is required' })
  .min(PASSWORD_MIN, `must be at least ${PASSWORD_MIN} characters`)
  .max(200, 'is too long (200 characters at most)')

/** Body of POST /api/auth/signup: a new person and the organisation they will administer. */
export const SignupSchema = z.object({
  name: NameSchema,
  email: EmailSchema,
  password: NewPasswordSchema,
  organisationName: NameSchema,
})
export type SignupInput = z.infer<typeof SignupSchema>

/** Body of POST /api/auth/login. */
export const LoginSchema = z.object({
  email: EmailSchema,
  password: z.string({ error: 'is required' }).min(1, 'is required').max(200, 'is too long'),
})
export type LoginInput = z.infer<typeof LoginSchema>

export const RoleSchema = z.enum(ROLES, { error: `must be one of ${ROLES.join(', ')}` })

/** Body of PATCH /api/orgs/[orgId]/members/[userId]. */
export const MemberRoleSchema = z.object({ role: RoleSchema })

/** Body of POST /api/orgs: a further organisation for the signed-in person. */
export const NewOrganisationSchema = z.object({ name: NameSchema })

/** Shape of GET /api/me. */
export interface Me {
  user: { id: number; email: string; name: string }
  /** When the address was confirmed; null until then (the account cannot join organisations). */
  emailVerifiedAt: string | null
  /** The organisation the person last chose, opened by default; null when none yet. */
  lastOrgId: number | null
  /** Each organisation with the person's role in it and the currency its money figures are in. */
  memberships: { orgId: number; orgName: string; role: (typeof ROLES)[number]; currency: Currency }[]
}

