import { describe, expect, it } from 'vitest'
import { Client, signUp } from './client'

describe('API paths and methods no route handles', () => {
  it('answer 404 JSON naming the method and path, signed in or not', async () => {
    const { client, orgId } = await signUp('unknown-routes')
    for (const c of [client, new Client()]) {
      for (const [method, path] of [['GET', '/api/no-such-thing'], ['POST', `/api/orgs/${orgId}/audit`], ['PUT', '/api/me'], ['DELETE', '/api/health']] as const) {
        const res = await c.request(method, path, method === 'GET' || method === 'DELETE' ? undefined : {})
        expect(res.status, `${method} ${path}`).toBe(404)
        expect(res.body.message).toBe(`No API route answers ${method} ${path}`)
      }
    }
  })

  it('leave the session route of the sign-in module working', async () => {
    const res = await new Client().get('/api/_auth/session')
    expect(res.status).toBe(200)
  })
})
