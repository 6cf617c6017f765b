import { z } from 'zod'

/** A positive integer id taken from a route parameter or query string. */
export const IdSchema = z.coerce.number({ error: 'must be a number' }).int('must be a whole number').positive('must be positive')

/** E-mail addresses are compared trimmed and lower-cased. */
export const EmailSchema = z
  .string({ error: 'is required' })
  .trim()
  .toLowerCase()
  .max(254, 'is too long')
  .pipe(z.email({ error: 'is not a valid e-mail address' }))

/** A person's or organisation's display name. */
export const NameSchema = z.string({ error: 'is required' }).trim().min(1, 'is required').max(120, 'is too long (120 characters at most)')

/** Paging for list routes: page 1-based, size capped. */
export const PageQuerySchema = z.object({
  page: z.coerce.number().int().min(1, 'must be 1 or more').default(1),
  pageSize: z.coerce.number().int().min(1, 'must be 1 or more').max(200, 'must be 200 or less').default(50),
})

export const OrgParamsSchema = z.object({ orgId: IdSchema })
