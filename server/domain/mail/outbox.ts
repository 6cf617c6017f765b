// Every e-mail Gillwatt produces goes through a Mailer. Each message is written to the `outbox`
// table first. Without an SMTP URL that is where it stays (the admin page shows it); with one it is
// also delivered, and the row records when it was sent or why it failed. A failed delivery never
// fails the change that caused it. The server makes its Mailer from runtime config
// (server/utils/mail.ts); the seed makes its own. Admins read their organisation's outbox here too.
import type { Kysely } from 'kysely'
import nodemailer, { type Transporter } from 'nodemailer'
import type { Database } from '../../../db/schema'
import type { MailKind, OutboxEntryDto } from '../../../shared/schemas/admin'

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

/** What domain operations that send e-mail are given. */
export interface Mailer {
  /** Writes the message to the outbox; `delivery` settles when it has been sent (at once without SMTP). */
  queue(message: MailMessage): Promise<{ outboxId: number; delivery: Promise<MailOutcome> }>
  /** An absolute link into the app, for the e-mail's button. */
  link(path: string): string
}

/** Sends the messages one after another, waiting for each delivery; returns their outcomes. */
export async function sendAll(mailer: Mailer, messages: readonly MailMessage[]): Promise<MailOutcome[]> {
  const outcomes: MailOutcome[] = []
  for (const m of messages) {
    const { delivery } = await mailer.queue(m)
    outcomes.push(await delivery)
  }
  return outcomes
}

/**
 * Writes the message to the outbox and leaves its delivery (when SMTP is set) to finish after the
 * caller has answered, so the answer takes as long whether or not mail goes out; a failure to record
 * the delivery is logged, naming `what` the mail was. Returns the outbox id.
 */
export async function queueInBackground(mailer: Mailer, message: MailMessage, what: string): Promise<number> {
  const { outboxId, delivery } = await mailer.queue(message)
  void delivery.catch((error: unknown) => console.error(`${what} mail: recording the delivery failed`, error))
  return outboxId
}

/** One page of an organisation's outbox, newest first, optionally of one kind, with the total. */
export async function listOutbox(db: Kysely<Database>, orgId: number, query: { kind?: MailKind; page: number; pageSize: number }): Promise<{ total: number; messages: OutboxEntryDto[] }> {
  const { kind, page, pageSize } = query
  let q = db.selectFrom('outbox').where('org_id', '=', orgId)
  if (kind) q = q.where('kind', '=', kind)
  const [rows, total] = await Promise.all([
    q.selectAll().orderBy('id', 'desc').limit(pageSize).offset((page - 1) * pageSize).execute(),
    q.select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
  ])
  return {
    total: Number(total.n),
    messages: rows.map((r) => ({ id: r.id, to: r.to_address, subject: r.subject, text: r.text, html: r.html, kind: r.kind as MailKind, createdAt: r.created_at, sentAt: r.sent_at, error: r.error })),
  }
}

let transport: { url: string; transporter: Transporter } | undefined

function transporterFor(url: string): Transporter {
  if (transport?.url !== url) transport = { url, transporter: nodemailer.createTransport(url) }
  return transport.transporter
}

/**
 * The outbox mailer: `smtpUrl` empty keeps every message in the outbox; `appUrl` starts every link;
 * `clock`, when given, dates each outbox row (the seed's backdated demo), else the database does.
 */
export function outboxMailer(db: Kysely<Database>, config: { smtpUrl: string; from: string; appUrl: string; clock?: () => string }): Mailer {
  const base = config.appUrl.replace(/\/+$/, '')
  async function deliver(outboxId: number, url: string, message: MailMessage): Promise<MailOutcome> {
    let error: string | null = null
    try {
      await transporterFor(url).sendMail({ from: config.from, to: message.to, subject: message.subject, text: message.text, html: message.html })
    } catch (e) {
      // Keep the reason, never the URL (it may hold a password).
      error = (e instanceof Error ? e.message : String(e)).replaceAll(url, '[SMTP_URL]').slice(0, 500)
    }
    await db
      .updateTable('outbox')
      .set(error ? { error } : { sent_at: new Date().toISOString(), error: null })
      .where('id', '=', outboxId)
      .execute()
    return { outboxId, sent: !error, error }
  }
  return {
    async queue(message) {
      const row = await db
        .insertInto('outbox')
        .values({ org_id: message.orgId, to_address: message.to, subject: message.subject, text: message.text, html: message.html, kind: message.kind, ...(config.clock ? { created_at: config.clock() } : {}) })
        .returning('id')
        .executeTakeFirstOrThrow()
      if (!config.smtpUrl) return { outboxId: row.id, delivery: Promise.resolve({ outboxId: row.id, sent: false, error: null }) }
      return { outboxId: row.id, delivery: deliver(row.id, config.smtpUrl, message) }
    },
    link: (path) => `${base}${path.startsWith('/') ? path : `/${path}`}`,
  }
}
