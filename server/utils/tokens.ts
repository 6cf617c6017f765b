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

/** The app's public base URL (NUXT_PUBLIC_APP_URL, default http://localhost:3000), no trailing slash. */
export function appBaseUrl(): string {
  const url = useRuntimeConfig().public.appUrl || 'http://localhost:3000'
  return String(url).replace(/\/+$/, '')
}

/** An absolute link into the app. */
export const appLink = (path: string) => `${appBaseUrl()}${path.startsWith('/') ? path : `/${path}`}`

/** ISO time `ms` milliseconds from now. */
export const isoIn = (ms: number, now = Date.now()) => new Date(now + ms).toISOString()
