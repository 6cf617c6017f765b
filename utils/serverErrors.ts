// Reading a failed $fetch: its HTTP status, the server's per-field issues, and a stale-version refusal.
/** HTTP status of a failed $fetch or upload, or 0. */
export function httpStatus(error: unknown): number {
  const e = error as { statusCode?: unknown; status?: unknown; response?: { status?: unknown } } | null
  const code = e?.statusCode ?? e?.status ?? e?.response?.status
  return typeof code === 'number' ? code : 0
}

/** What a 409 says when someone else saved first: the version now stored and when (null when not given). */
export interface StaleVersion {
  version: number | null
  updatedAt: string | null
  /** The server's message (it names the field first: `version: …`). */
  message: string
}

/** The stored version a 409 names (server/domain/sites.ts, staleVersionError), or null when the error is not a 409. */
export function staleVersionOf(error: unknown): StaleVersion | null {
  if (httpStatus(error) !== 409) return null
  const body = (error as { data?: { message?: unknown; data?: { currentVersion?: unknown; updatedAt?: unknown } } })?.data
  const version = body?.data?.currentVersion
  const updatedAt = body?.data?.updatedAt
  return {
    version: typeof version === 'number' ? version : null,
    updatedAt: typeof updatedAt === 'string' ? updatedAt : null,
    message: typeof body?.message === 'string' ? body.message : '',
  }
}

interface ServerIssue {
  path: string
  message: string
}

/** Pulls per-field issues out of a failed $fetch; falls back to the error's message. */
export function issuesFromError(error: unknown): { fields: Record<string, string>; message: string } {
  const body = (error as { data?: { message?: string; data?: { issues?: ServerIssue[] } } })?.data
  const fields: Record<string, string> = {}
  for (const issue of body?.data?.issues ?? []) fields[issue.path] ??= issue.message
  return { fields, message: body?.message ?? (error instanceof Error ? error.message : 'Something went wrong') }
}
