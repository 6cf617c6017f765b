import { createHash, randomBytes, timingSafeEqual } from 'node:crypto'

// Link tokens (invitations, password resets, summary links): 128 random bits, base64url (22
// characters). Only the SHA-256 hash is stored; a presented token is hashed, looked up by that hash
// and compared again in constant time.

/** A fresh 128-bit random token, URL-safe. */
export function newLinkToken(): string {
  return randomBytes(16).toString('base64url')
}

/** SHA-256 of a token, hex: what the database keeps. */
export function hashLinkToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex')
}

/** True when `token` hashes to `storedHash`, compared in constant time. */
export function linkTokenMatches(token: string, storedHash: string): boolean {
  const a = Buffer.from(hashLinkToken(token), 'hex')
  const b = Buffer.from(storedHash, 'hex')
  return a.length === b.length && timingSafeEqual(a, b)
}
