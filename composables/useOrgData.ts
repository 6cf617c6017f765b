import type { Role } from '~~/shared/utils/roles'

export interface Member {
  userId: number
  name: string
  email: string
  role: Role
  since: string
}

export interface AuditEntry {
  id: number
  action: string
  targetType: string | null
  targetId: number | null
  detail: Record<string, unknown> | null
  at: string
  userName: string | null
}

/** Members of an organisation, refetched when the organisation changes. */
export function useMembers(orgId: Ref<number | null | undefined>) {
  return useFetch<{ members: Member[] }>(() => `/api/orgs/${orgId.value}/members`, {
    key: computed(() => `members-${orgId.value}`),
    immediate: !!orgId.value,
    watch: [orgId],
  })
}
