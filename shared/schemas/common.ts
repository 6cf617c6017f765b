import { z } from 'zod'

/**
 * A number from a route parameter or query string, written in plain digits: "12" becomes 12, while
 * "0x1", "1e0", " 1" or "+1" stay text and fail the number check (`Number()` would take them all as 1).
 * Numbers in JSON bodies pass through as they are.
 */
export const fromDigits = <T extends z.ZodType>(schema: T) => z.preprocess((v) => (typeof v === 'string' && /^\d{1,16}$/.test(v) ? Number(v) : v), schema)

/** A positive integer id taken from a route parameter, query string or body. */
export const IdSchema = fromDigits(z.number({ error: 'must be a whole number written in digits' }).int('must be a whole number').positive('must be positive'))

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
  page: fromDigits(z.number().int().min(1, 'must be 1 or more')).default(1),
  pageSize: fromDigits(z.number().int().min(1, 'must be 1 or more').max(200, 'must be 200 or less')).default(50),
})

export const OrgParamsSchema = z.object({ orgId: IdSchema })
