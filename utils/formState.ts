// Plain helpers of useFormState: copying and comparing drafts (plain data: objects, arrays, strings,
// numbers with NaN for a number typed wrong, booleans, null), and how a form words its messages.

/** A deep copy of plain data; reads through Vue's proxies, so a reactive draft copies too. */
export function copyPlain<T>(value: T): T {
  if (Array.isArray(value)) return value.map(copyPlain) as T
  if (value !== null && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, copyPlain(v)])) as T
  }
  return value
}

/** True when two plain values hold the same data; NaN equals NaN (the same wrong text), and is not null (a blank). */
export function samePlain(a: unknown, b: unknown): boolean {
  if (a === b) return true
  if (typeof a === 'number' && typeof b === 'number') return Number.isNaN(a) && Number.isNaN(b)
  if (a === null || b === null || typeof a !== 'object' || typeof b !== 'object') return false
  if (Array.isArray(a) !== Array.isArray(b)) return false
  const aKeys = Object.keys(a)
  const bKeys = Object.keys(b)
  if (aKeys.length !== bKeys.length) return false
  return aKeys.every((k) => Object.hasOwn(b, k) && samePlain((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]))
}

/** One issue from a zod check (its path inside the body and its message). */
export interface CheckIssue {
  path: readonly PropertyKey[]
  message: string
}

/** How a form words its messages; each editor keeps its own wording. */
export interface FormMessages {
  /** Messages by field path for the schema's issues with the checked body (default: the first message per dotted path). */
  issues?: (issues: readonly CheckIssue[], body: unknown) => Record<string, string>
  /** The server's messages by field path as the fields show them (default: as they came). */
  server?: (fields: Record<string, string>) => Record<string, string>
  /** The message for the whole form when the schema refused the draft, given the field messages. */
  refused?: (errors: Record<string, string>) => string
  /** The message for the whole form when the server refused a save: its field messages and its message. */
  failed?: (fields: Record<string, string>, message: string) => string
}

/** The words a form uses when it says nothing else. */
export const FIELDS_NEED_ATTENTION = 'Some fields need attention; see the messages beside them.'

/** Messages by dotted path, the first one for each path. */
export function firstIssueByPath(issues: readonly CheckIssue[]): Record<string, string> {
  const out: Record<string, string> = {}
  for (const issue of issues) out[issue.path.map(String).join('.')] ??= issue.message
  return out
}

/** The wording a form gets unless it gives its own. */
export const DEFAULT_FORM_MESSAGES: Required<FormMessages> = {
  issues: firstIssueByPath,
  server: (fields) => fields,
  refused: () => FIELDS_NEED_ATTENTION,
  failed: (fields, message) => (Object.keys(fields).length ? FIELDS_NEED_ATTENTION : message),
}

/** What the leave guard asks before unsaved edits are thrown away (composables/useLeaveGuard.ts). */
export const LEAVE_QUESTION = 'You have changes that are not saved. Leave this page and lose them?'
