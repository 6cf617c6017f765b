import { inject } from 'vitest'
import { latestToken } from './mailbox'

export interface Reply<T = any> {
  status: number
  body: T
  headers: Headers
}

/** A tiny HTTP client with its own cookie jar, so each test can be a different person. */
export class Client {
  private cookies = new Map<string, string>()
  constructor(readonly baseURL = inject('baseURL')) {}

  /** The Cookie header this client sends (empty when signed out), for requests made without it. */
  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  }

  /** Another client holding a copy of this one's cookies, as someone who copied them would. */
  copy(): Client {
    const other = new Client(this.baseURL)
    for (const [k, v] of this.cookies) other.cookies.set(k, v)
    return other
  }

  async request<T = any>(method: string, path: string, body?: unknown, init: RequestInit = {}): Promise<Reply<T>> {
    const headers = new Headers(init.headers)
    if (this.cookies.size) headers.set('cookie', this.cookieHeader())
    headers.set('accept', 'application/json')
    let payload = init.body
    if (body !== undefined) {
      headers.set('content-type', 'application/json')
      payload = typeof body === 'string' ? body : JSON.stringify(body)
    }
    const res = await fetch(this.baseURL + path, { ...init, method, headers, body: payload, redirect: 'manual' })
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';')
      const [name, ...rest] = pair!.split('=')
      const value = rest.join('=')
      if (!value || /max-age=0|expires=thu, 01 jan 1970/i.test(c)) this.cookies.delete(name!)
      else this.cookies.set(name!, value)
    }
    const text = await res.text()
    let parsed: unknown = text
    try {
      parsed = text ? JSON.parse(text) : null
    } catch {
      // not JSON: keep the text
    }
    return { status: res.status, body: parsed as T, headers: res.headers }
  }

  get<T = any>(path: string) {
    return this.request<T>('GET', path)
  }
  post<T = any>(path: string, body?: unknown) {
    return this.request<T>('POST', path, body ?? {})
  }
  patch<T = any>(path: string, body?: unknown) {
    return this.request<T>('PATCH', path, body ?? {})
  }
  delete<T = any>(path: string) {
    return this.request<T>('DELETE', path)
  }
  /** POSTs multipart/form-data: text `fields` plus `files` by part name; `headers` are added as given. */
  upload<T = any>(path: string, files: Record<string, UploadFile>, fields: Record<string, string> = {}, headers?: HeadersInit) {
    const form = new FormData()
    for (const [name, value] of Object.entries(fields)) form.append(name, value)
    for (const [name, f] of Object.entries(files)) form.append(name, new Blob([typeof f.data === 'string' ? f.data : new Uint8Array(f.data)], { type: f.type ?? '' }), f.name)
    return this.request<T>('POST', path, undefined, { body: form, headers })
  }
  /** GETs raw bytes with the response headers (downloads). */
  async download(path: string) {
    const headers = new Headers()
    if (this.cookies.size) headers.set('cookie', [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; '))
    const res = await fetch(this.baseURL + path, { headers, redirect: 'manual' })
    return { status: res.status, headers: res.headers, bytes: new Uint8Array(await res.arrayBuffer()) }
  }
}

/** One file part of a multipart upload. */
export interface UploadFile {
  name: string
  /** Declared content type; empty lets the client send application/octet-stream. */
  type?: string
  data: string | Uint8Array
}

let counter = 0
/** A unique e-mail for this run, so tests never collide. */
export const uniqueEmail = (tag: string) => `${tag}-${Date.now().toString(36)}-${counter++}@test.example`

export const GOOD_PASSWORD = 'correct horse battery'

/**
 * Signs up a fresh person with their own organisation, confirms their address with the link from
 * the outbox (unless `verify` is false: the outbox read is the shared test server's, so a person on
 * another server stays unconfirmed), and signs them in; returns the signed-in client (`client`, or a
 * new one on `baseURL`, by default the shared server).
 */
export async function signUp(tag = 'person', { verify = true, baseURL, client = new Client(baseURL) }: { verify?: boolean; baseURL?: string; client?: Client } = {}) {
  const email = uniqueEmail(tag)
  const res = await client.post('/api/auth/signup', { name: `Test ${tag}`, email, password: GOOD_PASSWORD, organisationName: `Org of ${tag}` })
  if (res.status !== 202) throw new Error(`signup failed: ${res.status} ${JSON.stringify(res.body)}`)
  if (verify) {
    const verified = await client.post(`/api/auth/verify-email/${latestToken(email, 'verify-email', '/verify-email')}`)
    if (verified.status !== 200) throw new Error(`verification failed: ${verified.status} ${JSON.stringify(verified.body)}`)
  }
  const login = await client.post('/api/auth/login', { email, password: GOOD_PASSWORD })
  if (login.status !== 200) throw new Error(`sign-in after signup failed: ${login.status} ${JSON.stringify(login.body)}`)
  return { client, email, user: login.body.user as { id: number }, orgId: login.body.memberships[0].orgId as number }
}

/**
 * Brings a person into an organisation the only way there is: an admin invites their address, and
 * they accept the e-mailed link while signed in. Returns the acceptance.
 */
export async function addMember(admin: Client, orgId: number, person: { client: Client; email: string }, role: string) {
  const invited = await admin.post(`/api/orgs/${orgId}/invitations`, { email: person.email, role })
  if (invited.status !== 201) throw new Error(`invitation failed: ${invited.status} ${JSON.stringify(invited.body)}`)
  const accepted = await person.client.post(`/api/invitations/${latestToken(person.email, 'invitation', '/invitations')}/accept`)
  if (accepted.status !== 200) throw new Error(`accepting failed: ${accepted.status} ${JSON.stringify(accepted.body)}`)
  return accepted.body
}
