import { outboxMailer, type Mailer } from '../domain/mail/outbox'

// The server's Mailer (server/domain/mail/outbox.ts) from runtime config: SMTP_URL (else
// runtimeConfig.smtpUrl; empty keeps every e-mail in the outbox), NUXT_MAIL_FROM and
// NUXT_PUBLIC_APP_URL for the links.

/** SMTP_URL from the environment, else runtime config `smtpUrl`; empty means the outbox only. */
export function smtpUrl(): string {
  return process.env.SMTP_URL || String(useRuntimeConfig().smtpUrl || '')
}

/** The From address (NUXT_MAIL_FROM). */
export function mailFrom(): string {
  return String(useRuntimeConfig().mailFrom || 'Gillwatt <no-reply@gillwatt.example>')
}

/** The mailer domain operations are given. */
export function useMailer(): Mailer {
  return outboxMailer(useDb(), { smtpUrl: smtpUrl(), from: mailFrom(), appUrl: appBaseUrl() })
}
