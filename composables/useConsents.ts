// Typed wrappers over a site's consents and constraints routes (server/api/sites/[id]/consents,
// server/api/sites/[id]/constraints.patch.ts). Shapes come from shared/schemas/consent.ts.
import type { ConsentDto, ConsentListDto, ConsentPatch, ConstraintsDto, ConstraintsPatch } from '#shared/schemas/consent'
import type { ConsentKind } from '#shared/utils/consents'

/** A site's consents list, its constraints and checks. */
export function useConsents(siteId: Ref<number>) {
  return useFetch<ConsentListDto>(() => `/api/sites/${siteId.value}/consents`, { key: computed(() => `consents-${siteId.value}`) })
}

/** Changes one permission; `version` must be the one last read (0 for one never saved; a stale one answers 409). */
export function patchConsent(siteId: number, kind: ConsentKind, patch: ConsentPatch): Promise<ConsentDto> {
  return $fetch<ConsentDto>(`/api/sites/${siteId}/consents/${kind}`, { method: 'PATCH', body: patch })
}

/** Changes the site's constraints (nearest dwelling, noise limit, gauging station) at the version last read. */
export function patchConstraints(siteId: number, patch: ConstraintsPatch): Promise<ConstraintsDto> {
  return $fetch<ConstraintsDto>(`/api/sites/${siteId}/constraints`, { method: 'PATCH', body: patch })
}
