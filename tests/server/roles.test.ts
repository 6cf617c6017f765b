import { beforeAll, describe, expect, it } from 'vitest'
import { Client, addMember, signUp } from './client'

// One organisation with a member of each role, and an outsider with an organisation of their own.
let orgId: number
let admin: Client
const members: Record<'engineer' | 'reviewer' | 'viewer', { client: Client; id: number }> = {} as never
let outsider: Awaited<ReturnType<typeof signUp>>

beforeAll(async () => {
  const owner = await signUp('owner')
  orgId = owner.orgId
  admin = owner.client
  for (const role of ['engineer', 'reviewer', 'viewer'] as const) {
    const person = await signUp(role)
    await addMember(admin, orgId, person, role)
    members[role] = { client: person.client, id: person.user.id }
  }
  outsider = await signUp('outsider')
})

describe('admin-only routes', () => {
  it('let the admin read the audit trail', async () => {
    const res = await admin.get(`/api/orgs/${orgId}/audit`)
    expect(res.status).toBe(200)
    expect(res.body.entries.map((e: { action: string }) => e.action)).toContain('member.added')
  })

  it('answer 403 to a viewer, a reviewer and an engineer', async () => {
    for (const role of ['viewer', 'reviewer', 'engineer'] as const) {
      const res = await members[role].client.get(`/api/orgs/${orgId}/audit`)
      expect(res.status, role).toBe(403)
      expect(res.body.message).toContain(role)
      const change = await members[role].client.patch(`/api/orgs/${orgId}/members/${members.viewer.id}`, { role: 'admin' })
      expect(change.status, role).toBe(403)
    }
  })

  it('answer 404 to someone from another organisation, and 401 when signed out', async () => {
    expect((await outsider.client.get(`/api/orgs/${orgId}/audit`)).status).toBe(404)
    expect((await outsider.client.get(`/api/orgs/${orgId}/members`)).status).toBe(404)
    expect((await new Client().get(`/api/orgs/${orgId}/audit`)).status).toBe(401)
  })
})

describe('members', () => {
  it('are readable by every role of the organisation', async () => {
    for (const role of ['viewer', 'reviewer', 'engineer'] as const) {
      const res = await members[role].client.get(`/api/orgs/${orgId}/members`)
      expect(res.status, role).toBe(200)
      expect(res.body.members).toHaveLength(4)
    }
  })

  it('can have their role changed by the admin, taking effect at once', async () => {
    const res = await admin.patch(`/api/orgs/${orgId}/members/${members.reviewer.id}`, { role: 'engineer' })
    expect(res.status).toBe(200)
    const me = await members.reviewer.client.get('/api/me')
    expect(me.body.memberships.find((m: { orgId: number }) => m.orgId === orgId).role).toBe('engineer')
    await admin.patch(`/api/orgs/${orgId}/members/${members.reviewer.id}`, { role: 'reviewer' })
  })

  it('keep at least one admin', async () => {
    const me = await admin.get('/api/me')
    const res = await admin.patch(`/api/orgs/${orgId}/members/${me.body.user.id}`, { role: 'viewer' })
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/^role:/)
  })

  it('reject an unknown role with 400 naming the field, and a bad id with 400', async () => {
    const bad = await admin.patch(`/api/orgs/${orgId}/members/${members.viewer.id}`, { role: 'owner' })
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^role:/)
    const badId = await admin.get('/api/orgs/abc/members')
    expect(badId.status).toBe(400)
    expect(badId.body.message).toMatch(/^orgId:/)
  })

  it('cannot be invited twice', async () => {
    const again = await admin.post(`/api/orgs/${orgId}/invitations`, { email: (await members.viewer.client.get('/api/me')).body.user.email, role: 'viewer' })
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/^email:/)
  })

  it('a signed-in person can start another organisation and becomes its admin', async () => {
    const res = await members.viewer.client.post('/api/orgs', { name: 'Second Org' })
    expect(res.status).toBe(201)
    const audit = await members.viewer.client.get(`/api/orgs/${res.body.orgId}/audit`)
    expect(audit.status).toBe(200)
    expect((await members.viewer.client.post('/api/orgs', { name: '' })).body.message).toMatch(/^name:/)
  })
})
