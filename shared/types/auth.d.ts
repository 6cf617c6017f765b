// What Gillwatt keeps in the sealed session cookie. Roles are read from the database on
// every request, so a changed role takes effect at once.
declare module '#auth-utils' {
  interface User {
    id: number
    email: string
    name: string
  }
}

export {}
