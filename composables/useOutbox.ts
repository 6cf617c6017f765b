// The organisation's local outbox of e-mails (GET /api/orgs/[orgId]/outbox), admins only.
import type { MailKind, OutboxListDto } from '#shared/schemas/admin'

/** One page of the organisation's outbox, newest first, optionally of one kind (admins). */
export function useOutbox(orgId: Ref<number>, kind: Ref<MailKind | ''>, page: Ref<number>) {
  return useFetch<OutboxListDto>(() => `/api/orgs/${orgId.value}/outbox`, {
    key: computed(() => `outbox-${orgId.value}-${kind.value}-${page.value}`),
    query: computed(() => ({ kind: kind.value || undefined, page: page.value, pageSize: 25 })),
  })
}
