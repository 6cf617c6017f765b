// An organisation's settings: for now the currency its money figures are shown in. Shared by
// server/api/orgs/[orgId]/settings.*.ts, GET /api/me (each membership carries it) and the admin page.
import { z } from 'zod'

/** The currency an organisation's amounts are in: an ISO 4217 code and the symbol shown beside amounts (no conversion). */
export interface Currency {
  code: string
  symbol: string
}

/** What an organisation without a choice shows (pounds sterling: the cost defaults are £ figures). */
export const DEFAULT_CURRENCY: Currency = { code: 'GBP', symbol: '£' }

/**
 * ISO 4217 codes this runtime knows (Node and every current browser list them through Intl); a
 * runtime without the list accepts any three capital letters.
 */
const KNOWN_CODES: ReadonlySet<string> | null = (() => {
  const intl = Intl as typeof Intl & { supportedValuesOf?: (key: 'currency') => string[] }
  return typeof intl.supportedValuesOf === 'function' ? new Set(intl.supportedValuesOf('currency')) : null
})()

/** An ISO 4217 currency code, three capital letters (GBP, EUR, USD). */
export const CurrencyCodeSchema = z.string()
  .regex(/^[A-Z]{3}$/, 'must be an ISO 4217 code of three capital letters, such as GBP, EUR or USD')
  .refine((code) => KNOWN_CODES === null || KNOWN_CODES.has(code), 'is not an ISO 4217 currency code')

/** The symbol shown beside amounts: 1–5 characters, no digits (they would read as part of the amount). */
export const CurrencySymbolSchema = z.string().trim()
  .min(1, 'must not be empty')
  .max(5, 'must be 5 characters or fewer')
  .refine((s) => !/[\d\s]/.test(s), 'must hold no digits or spaces')

/** Body of PATCH /api/orgs/[orgId]/settings (admins only). */
export const OrganisationSettingsSchema = z.object({
  currency: z.object({ code: CurrencyCodeSchema, symbol: CurrencySymbolSchema }),
})
export type OrganisationSettings = z.infer<typeof OrganisationSettingsSchema>

/** Answer of GET and PATCH /api/orgs/[orgId]/settings. */
export interface OrganisationSettingsDto {
  orgId: number
  name: string
  currency: Currency
}
