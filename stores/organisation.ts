import { defineStore } from 'pinia'
import type { Me } from '~~/shared/schemas/auth'
import { canAdminister, canEdit } from '~~/shared/utils/roles'

/** Who is signed in, their organisations, and which one they are working in (kept in a cookie). */
export const useOrganisationStore = defineStore('organisation', () => {
  const me = ref<Me | null>(null)
  const chosenOrgId = useCookie<number | null>('gw-org', { default: () => null, sameSite: 'lax' })

  const memberships = computed(() => me.value?.memberships ?? [])
  const current = computed(() => memberships.value.find((m) => m.orgId === chosenOrgId.value) ?? memberships.value[0] ?? null)
  const role = computed(() => current.value?.role ?? null)
  const isAdmin = computed(() => canAdminister(role.value))
  const canWrite = computed(() => canEdit(role.value))

  /** Reads /api/me (with the request's cookie during server rendering). */
  async function load() {
    me.value = await useRequestFetch()<Me>('/api/me')
  }
  function choose(orgId: number) {
    chosenOrgId.value = orgId
  }
  function reset() {
    me.value = null
  }

  return { me, memberships, current, role, isAdmin, canWrite, load, choose, reset }
})
