import { listOutbox } from '~~/server/domain/mail/outbox'
import { OutboxQuerySchema, type OutboxListDto } from '#shared/schemas/admin'
import { OrgParamsSchema } from '#shared/schemas/common'

// The organisation's e-mails, newest first, paged; admins only. Without SMTP_URL this is where
// they all are; with it, each shows when it was sent or why it failed. Password-reset e-mails
// belong to no organisation and never show here (their links would let an admin take over an account).
export default defineEventHandler(async (event): Promise<OutboxListDto> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, ['admin'])
  const query = await getValidatedQuery(event, validator(OutboxQuerySchema, 'query'))
  const { total, messages } = await listOutbox(useDb(), orgId, query)
  return { page: query.page, pageSize: query.pageSize, total, smtpConfigured: smtpUrl() !== '', messages }
})
