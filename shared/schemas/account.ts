import { z } from 'zod'
import { NewPasswordSchema } from './auth'
import { IdSchema } from './common'

// The signed-in person's own account: e-mail verification, password change, sessions, the
// organisation they last chose.

/** How long an e-mail verification link works, hours. */
export const VERIFICATION_TTL_HOURS = 48

export const verifyEmailPath = (token: string) => `/verify-email/${encodeURIComponent(token)}`

/** Body of POST /api/account/password. */
export const PasswordChangeSchema = z.object({
  currentPassword: z.string({ error: 'is required' }).min(1, 'is required').max(200, 'is too long'),
  newPassword: NewPasswordSchema,
})
export type PasswordChangeInput = z.infer<typeof PasswordChangeSchema>

/** Body of PATCH /api/me: the organisation the app opens by default. */
export const MePatchSchema = z.object({ lastOrgId: IdSchema })

export const SessionParamsSchema = z.object({ id: IdSchema })

/** One signed-in browser of the person, as the account page lists it. */
export interface SessionDto {
  id: number
  createdAt: string
  lastSeenAt: string
  userAgent: string
  /** The browser this list was asked from. */
  current: boolean
}

/** Answer of POST /api/auth/signup: the same words whether or not the address was taken. */
export interface SignupAnswer {
  message: string
}
