// Invitations and password reset: typed fetch wrappers over server/api/orgs/[orgId]/invitations*,
// server/api/invitations/** and server/api/auth/password-reset*. Shapes from shared/schemas/invitation.ts.
import type { InvitationAcceptedDto, InvitationAcceptInput, InvitationCreatedDto, InvitationDto, InvitationInput, InvitationListDto, InvitationPublicDto, InvitationState } from '#shared/schemas/invitation'

/** The organisation's invitations, newest first, optionally of one state (admins). */
export function useInvitations(orgId: Ref<number>, state: Ref<InvitationState | ''>) {
  return useFetch<InvitationListDto>(() => `/api/orgs/${orgId.value}/invitations`, {
    key: computed(() => `invitations-${orgId.value}-${state.value}`),
    query: computed(() => ({ state: state.value || undefined, pageSize: 100 })),
  })
}

/** Invites a person by e-mail; the link goes out by e-mail (or to the local outbox), never back here. */
export function createInvitation(orgId: number, body: InvitationInput): Promise<InvitationCreatedDto> {
  return $fetch<InvitationCreatedDto>(`/api/orgs/${orgId}/invitations`, { method: 'POST', body })
}

/** Revokes a pending invitation: its link stops working. */
export function revokeInvitation(id: number): Promise<InvitationDto> {
  return $fetch<InvitationDto>(`/api/invitations/${id}`, { method: 'DELETE' })
}

/** What an invitation link is for; a refusal (unknown, expired, used, revoked) comes back as the error. */
export function useInvitationByToken(token: Ref<string>) {
  return useFetch<InvitationPublicDto>(() => `/api/invitations/${encodeURIComponent(token.value)}`, {
    key: computed(() => `invitation-${token.value}`),
  })
}

/** Accepts an invitation; the person is signed in afterwards. */
export function acceptInvitation(token: string, body: InvitationAcceptInput): Promise<InvitationAcceptedDto> {
  return $fetch<InvitationAcceptedDto>(`/api/invitations/${encodeURIComponent(token)}/accept`, { method: 'POST', body })
}

/** Asks for a reset link; the server answers the same whether or not the account exists. */
export function requestPasswordReset(email: string): Promise<{ message: string }> {
  // A plain string address: the typed-route matcher recurses too deep on this one and its [token] sibling.
  const url: string = '/api/auth/password-reset'
  return $fetch<{ message: string }>(url, { method: 'POST', body: { email } })
}

/** Sets a new password with a reset link's token. */
export function resetPassword(token: string, password: string): Promise<{ ok: boolean; message: string }> {
  return $fetch<{ ok: boolean; message: string }>(`/api/auth/password-reset/${encodeURIComponent(token)}`, { method: 'POST', body: { password } })
}
