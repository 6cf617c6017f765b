// Typed wrappers over the organisation's settings (server/api/orgs/[orgId]/settings.*.ts): for now the
// currency its money figures are shown in.
import type { OrganisationSettings, OrganisationSettingsDto } from '#shared/schemas/organisation'

/** The organisation's settings (every member may read them). */
export function useOrganisationSettings(orgId: Ref<number>) {
  return useFetch<OrganisationSettingsDto>(() => `/api/orgs/${orgId.value}/settings`, { key: computed(() => `org-settings-${orgId.value}`) })
}

/** Changes the organisation's settings (administrators); answers them as stored. */
export function patchOrganisationSettings(orgId: number, body: OrganisationSettings): Promise<OrganisationSettingsDto> {
  return $fetch<OrganisationSettingsDto>(`/api/orgs/${orgId}/settings`, { method: 'PATCH', body })
}
