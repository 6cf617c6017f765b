// One page of the organisation's audit trail for the filters given (GET /api/orgs/[orgId]/audit).
import { type AuditEntry, type AuditFilters, auditQuery } from '../utils/audit'

/** One page of the audit trail matching the filters; a bad filter comes back as a 400 naming it. */
export function useAuditSearch(orgId: Ref<number>, filters: Ref<AuditFilters>, page: Ref<number>) {
  return useFetch<{ page: number; pageSize: number; total: number; entries: AuditEntry[] }>(() => `/api/orgs/${orgId.value}/audit`, {
    key: computed(() => `audit-${orgId.value}-${JSON.stringify(filters.value)}-${page.value}`),
    query: computed(() => auditQuery(filters.value, page.value)),
  })
}
