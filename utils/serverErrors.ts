// Reading a failed $fetch: its HTTP status and the server's per-field issues.
/** HTTP status of a failed $fetch or upload, or 0. */
export function httpStatus(error: unknown): number {
  const e = error as { statusCode?: unknown; status?: unknown; response?: { status?: unknown } } | null
  const code = e?.statusCode ?? e?.status ?? e?.response?.status
  return typeof code === 'number' ? code : 0
}

/** True when the server refused a save because someone else changed the site first. */
export function isConflict(error: unknown): boolean {
  return httpStatus(error) === 409
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
