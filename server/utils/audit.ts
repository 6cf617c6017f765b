interface AuditEntry {
  orgId: number | null
  userId: number | null
  action: string
  targetType?: string
  targetId?: number
  detail?: Record<string, unknown>
}

/** Appends one line to the audit trail. Callers pass details worth keeping, never secrets. */
export async function audit(entry: AuditEntry): Promise<void> {
  await useDb()
    .insertInto('audit_log')
    .values({
      org_id: entry.orgId,
      user_id: entry.userId,
      action: entry.action,
      target_type: entry.targetType ?? null,
      target_id: entry.targetId ?? null,
      detail: entry.detail ? JSON.stringify(entry.detail) : null,
    })
    .execute()
}
