// Field names the API used before every quantity took its unit after an underscore (`grossHeadM`
// became `grossHead_m`). The body schemas drop keys they do not know, so a caller still sending an
// old name would have its value silently left out (and a default used in its place): instead
// server/utils/validate.ts refuses it with a 400 naming the field and its new name.
// Keep the old names here as they were: this list is the record of the rename.

const RENAMED: ReadonlyMap<string, string> = new Map([
  ['altitudeM', 'altitude_m'],
  ['grossHeadM', 'grossHead_m'],
  ['crestWidthM', 'crestWidth_m'],
  ['waterTempC', 'waterTemp_C'],
  ['siteAreaKm2', 'siteArea_km2'],
  ['gaugeAreaKm2', 'gaugeArea_km2'],
  ['targetOxygenMgL', 'targetOxygen_mgL'],
  ['expiresInDays', 'expiresIn_d'],
  ['costPerKw', 'ratedPowerPrice'],
  ['lifeYears', 'life_yr'],
])

/**
 * Fields whose meaning changed as well as their name: a value cannot just be moved across, so the
 * answer says what the new field means.
 */
const REPLACED: ReadonlyMap<string, string> = new Map([
  ['civilsPerUnit', 'is no longer accepted: civil works are now priced per m³/s of the design flow, in civilsPerDesignFlow'],
])

/** What to tell a caller who still sends `key`; undefined for a current name. */
function retiredMessage(key: string): string | undefined {
  const renamed = RENAMED.get(key)
  if (renamed !== undefined) return `is no longer accepted: the field is now called ${renamed}`
  return REPLACED.get(key)
}

/** Most old names one answer lists (a hostile body may repeat one many times). */
const MAX_ISSUES = 20

/** One old field name found in a body: where it is, and what to send instead. */
export interface RetiredFieldIssue {
  path: string
  message: string
}

/** Every old field name in a parsed JSON body (or a form's fields), with its path, in the body's order, up to MAX_ISSUES. */
export function retiredFieldIssues(input: unknown): RetiredFieldIssue[] {
  const issues: RetiredFieldIssue[] = []
  // Depth-first without recursion (a body may nest deeply; it is already bounded in bytes). Only
  // objects and old names go on the stack, so the plain values of a long record cost little.
  const stack: { value: unknown; path: string; retired?: string }[] = [{ value: input, path: '' }]
  while (stack.length > 0 && issues.length < MAX_ISSUES) {
    const { value, path, retired } = stack.pop()!
    if (retired !== undefined) {
      issues.push({ path, message: retired })
      continue
    }
    if (value === null || typeof value !== 'object') continue
    const isArray = Array.isArray(value)
    const entries = Object.entries(value)
    for (let i = entries.length - 1; i >= 0; i--) {
      const [key, child] = entries[i]!
      const retired = isArray ? undefined : retiredMessage(key)
      if (retired === undefined && (child === null || typeof child !== 'object')) continue
      stack.push({ value: child, path: path === '' ? key : `${path}.${key}`, retired })
    }
  }
  return issues
}
