import { inject } from 'vitest'

export interface Reply<T = any> {
  status: number
  body: T
  headers: Headers
}

/** A tiny HTTP client with its own cookie jar, so each test can be a different person. */
export class Client {
  private cookies = new Map<string, string>()
  constructor(readonly baseURL = inject('baseURL')) {}

  async request<T = any>(method: string, path: string, body?: unknown, init: RequestInit = {}): Promise<Reply<T>> {
    const headers = new Headers(init.headers)
    if (this.cookies.size) headers.set('cookie', [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; '))
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

/** Signs up a fresh person with their own organisation; returns the signed-in client (a new one on the shared server unless given). */
export async function signUp(tag = 'person', client = new Client()) {
  const email = uniqueEmail(tag)
  const res = await client.post('/api/auth/signup', { name: `Test ${tag}`, email, password: GOOD_PASSWORD, organisationName: `Org of ${tag}` })
  if (res.status !== 201) throw new Error(`signup failed: ${res.status} ${JSON.stringify(res.body)}`)
  return { client, email, user: res.body.user as { id: number }, orgId: res.body.memberships[0].orgId as number }
}
