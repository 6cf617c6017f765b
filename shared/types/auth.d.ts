// What Gillwatt keeps in the sealed session cookie. Roles are read from the database on
// every request, so a changed role takes effect at once; the session itself is a row in the
// `sessions` table, named by the random key in `secure` (never sent to the browser).
declare module '#auth-utils' {
  interface User {
    id: number
    email: string
    name: string
  }
  interface SecureSessionData {
    /** Random key of this session; the database keeps only its SHA-256. */
    sessionKey: string
  }
}

export {}
