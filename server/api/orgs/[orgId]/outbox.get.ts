import { OutboxQuerySchema, type MailKind, type OutboxListDto } from '../../../../shared/schemas/admin'
import { OrgParamsSchema } from '../../../../shared/schemas/common'

// The organisation's e-mails, newest first, paged; admins only. Without SMTP_URL this is where
// they all are; with it, each shows when it was sent or why it failed. Password-reset e-mails
// belong to no organisation and never show here (their links would let an admin take over an account).
export default defineEventHandler(async (event): Promise<OutboxListDto> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, ['admin'])
  const { kind, page, pageSize } = await getValidatedQuery(event, validator(OutboxQuerySchema, 'query'))
  let q = useDb().selectFrom('outbox').where('org_id', '=', orgId)
  if (kind) q = q.where('kind', '=', kind)
  const [rows, total] = await Promise.all([
    q.selectAll().orderBy('id', 'desc').limit(pageSize).offset((page - 1) * pageSize).execute(),
    q.select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
  ])
  return {
    page,
    pageSize,
    total: Number(total.n),
    smtpConfigured: smtpUrl() !== '',
    messages: rows.map((r) => ({ id: r.id, to: r.to_address, subject: r.subject, text: r.text, html: r.html, kind: r.kind as MailKind, createdAt: r.created_at, sentAt: r.sent_at, error: r.error })),
  }
})
