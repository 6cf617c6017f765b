import { defineStore } from 'pinia'
import type { Me } from '#shared/schemas/auth'
import { canAdminister, canEdit } from '#shared/utils/roles'

/**
 * Who is signed in, their organisations, and which one they are working in: the one chosen in this
 * browser (a cookie), else the one the person last chose anywhere (kept on the server), else the first.
 */
export const useOrganisationStore = defineStore('organisation', () => {
  const me = ref<Me | null>(null)
  const chosenOrgId = useCookie<number | null>('gw-org', { default: () => null, sameSite: 'lax' })

  const memberships = computed(() => me.value?.memberships ?? [])
  const current = computed(
    () =>
      memberships.value.find((m) => m.orgId === chosenOrgId.value) ??
      memberships.value.find((m) => m.orgId === me.value?.lastOrgId) ??
      memberships.value[0] ??
      null,
  )
  const role = computed(() => current.value?.role ?? null)
  const isAdmin = computed(() => canAdminister(role.value))
  const canWrite = computed(() => canEdit(role.value))

  /** Reads /api/me (with the request's cookie during server rendering). */
  async function load() {
    me.value = await useRequestFetch()<Me>('/api/me')
  }
  /** Works in `orgId` from now on, here and (remembered on the server) on the person's other browsers. */
  function choose(orgId: number) {
    chosenOrgId.value = orgId
    if (me.value && me.value.lastOrgId !== orgId) {
      me.value = { ...me.value, lastOrgId: orgId }
      $fetch('/api/me', { method: 'PATCH', body: { lastOrgId: orgId } }).catch(() => {
        // Only a default for next time: this browser keeps its choice either way.
      })
    }
  }
  function reset() {
    me.value = null
  }

  return { me, memberships, current, role, isAdmin, canWrite, load, choose, reset }
})
