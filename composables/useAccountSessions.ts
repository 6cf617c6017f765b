import type { SessionDto } from '#shared/schemas/account'

/** The signed-in person's browsers (sessions), newest first. */
export function useAccountSessions() {
  return useFetch<{ sessions: SessionDto[] }>('/api/account/sessions', { key: 'account-sessions', default: () => ({ sessions: [] }) })
}
