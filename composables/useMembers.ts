import type { Role } from '#shared/utils/roles'

export interface Member {
  userId: number
  name: string
  email: string
  role: Role
  since: string
}

/** Members of an organisation, refetched when the organisation changes. */
export function useMembers(orgId: Ref<number | null | undefined>) {
  return useFetch<{ members: Member[] }>(() => `/api/orgs/${orgId.value}/members`, {
    key: computed(() => `members-${orgId.value}`),
    immediate: !!orgId.value,
    watch: [orgId],
  })
}
