import { recordAudit, type AuditEntry } from '../domain/audit'

/** Appends one line to the audit trail (server/domain/audit.ts). Callers pass details worth keeping, never secrets. */
export async function audit(entry: Omit<AuditEntry, 'at'>): Promise<void> {
  await recordAudit(useDb(), entry)
}
