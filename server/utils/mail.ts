import nodemailer, { type Transporter } from 'nodemailer'
import type { MailKind } from '../../shared/schemas/admin'

// Every e-mail Gillwatt produces goes through here. Each is written to the `outbox` table first.
// Without SMTP_URL that is where it stays (the admin page shows it); with SMTP_URL it is also
// delivered, and the row records when it was sent or why it failed. A failed delivery never fails
// the change that caused it.

/** One e-mail: plain text and simple HTML, what it is about, and the organisation it belongs to. */
export interface MailMessage {
  to: string
  subject: string
  text: string
  html: string
  kind: MailKind
  /** Null for mail about an account rather than an organisation (password reset). */
  orgId: number | null
}

/** What happened to one message. */
export interface MailOutcome {
  outboxId: number
  sent: boolean
  error: string | null
}

let transport: { url: string; transporter: Transporter } | undefined

/** SMTP_URL from the environment, else runtime config `smtpUrl`; empty means the outbox only. */
export function smtpUrl(): string {
  return process.env.SMTP_URL || String(useRuntimeConfig().smtpUrl || '')
}

/** The From address (NUXT_MAIL_FROM). */
export function mailFrom(): string {
  return String(useRuntimeConfig().mailFrom || 'Gillwatt <no-reply@gillwatt.example>')
}

function transporterFor(url: string): Transporter {
  if (transport?.url !== url) transport = { url, transporter: nodemailer.createTransport(url) }
  return transport.transporter
}

/** Writes the message to the outbox and returns its id and a promise of its delivery (resolved at once without SMTP). */
export async function queueMail(message: MailMessage): Promise<{ outboxId: number; delivery: Promise<MailOutcome> }> {
  const row = await useDb()
    .insertInto('outbox')
    .values({ org_id: message.orgId, to_address: message.to, subject: message.subject, text: message.text, html: message.html, kind: message.kind })
    .returning('id')
    .executeTakeFirstOrThrow()
  const url = smtpUrl()
  if (!url) return { outboxId: row.id, delivery: Promise.resolve({ outboxId: row.id, sent: false, error: null }) }
  return { outboxId: row.id, delivery: deliver(row.id, url, message) }
}

async function deliver(outboxId: number, url: string, message: MailMessage): Promise<MailOutcome> {
  let error: string | null = null
  try {
    await transporterFor(url).sendMail({ from: mailFrom(), to: message.to, subject: message.subject, text: message.text, html: message.html })
  } catch (e) {
    // Keep the reason, never the URL (it may hold a password).
    error = (e instanceof Error ? e.message : String(e)).replaceAll(url, '[SMTP_URL]').slice(0, 500)
  }
  const at = new Date().toISOString()
  await useDb()
    .updateTable('outbox')
    .set(error ? { error } : { sent_at: at, error: null })
    .where('id', '=', outboxId)
    .execute()
  return { outboxId, sent: !error, error }
}

/** Sends one e-mail (see the note at the top) and waits for its delivery when SMTP is configured. */
export async function sendMail(message: MailMessage): Promise<MailOutcome> {
  const { delivery } = await queueMail(message)
  return delivery
}

/** Sends several e-mails one after another; returns their outcomes. */
export async function sendMails(messages: readonly MailMessage[]): Promise<MailOutcome[]> {
  const outcomes: MailOutcome[] = []
  for (const m of messages) outcomes.push(await sendMail(m))
  return outcomes
}
