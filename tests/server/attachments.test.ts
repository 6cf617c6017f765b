import { beforeAll, describe, expect, it } from 'vitest'
import { Client, type UploadFile } from './client'
import { createSite, makeTeam } from './sites-helpers'

let team: Awaited<ReturnType<typeof makeTeam>>
let other: Awaited<ReturnType<typeof makeTeam>>
let siteId: number

beforeAll(async () => {
  team = await makeTeam('attach')
  other = await makeTeam('attach-other')
  siteId = (await createSite(team.engineer, team.orgId)).id
})

// A real 1×1 PNG (signature, IHDR, IDAT, IEND) and a minimal PDF.
const PNG = Uint8Array.from(
  Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64'),
)
const PDF = new TextEncoder().encode('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n')
const JPEG = Uint8Array.from([0xff, 0xd8, 0xff, 0xe0, 0, 0x10, 0x4a, 0x46, 0x49, 0x46, 0, 1, 0xff, 0xd9])
const WEBP = new Uint8Array([...new TextEncoder().encode('RIFF'), 26, 0, 0, 0, ...new TextEncoder().encode('WEBPVP8 '), 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0])

const attach = (client: Client, file: UploadFile, id = siteId) => client.upload(`/api/sites/${id}/attachments`, { file })

describe('POST /api/sites/[id]/attachments', () => {
  it('stores PNG, JPEG, WebP and PDF files under random ids, typed by their content', async () => {
    const png = await attach(team.engineer, { name: 'weir photo.png', type: 'image/png', data: PNG })
    expect(png.status, JSON.stringify(png.body)).toBe(201)
    expect(png.body).toMatchObject({ siteId, originalName: 'weir photo.png', contentType: 'image/png', sizeBytes: PNG.length })
    expect(png.body.uploadedBy.name).toContain('engineer')
    // The declared type does not matter; the bytes do.
    const pdf = await attach(team.admin, { name: '../../etc/drawing.pdf', type: 'application/octet-stream', data: PDF })
    expect(pdf.status).toBe(201)
    expect(pdf.body).toMatchObject({ contentType: 'application/pdf', originalName: 'drawing.pdf' })
    expect((await attach(team.engineer, { name: 'a.jpg', type: 'image/jpeg', data: JPEG })).body.contentType).toBe('image/jpeg')
    expect((await attach(team.engineer, { name: 'b.webp', type: 'image/webp', data: WEBP })).body.contentType).toBe('image/webp')

    const list = await team.viewer.get(`/api/sites/${siteId}/attachments`)
    expect(list.status).toBe(200)
    expect(list.body.attachments.map((a: { originalName: string }) => a.originalName)).toEqual(['b.webp', 'a.jpg', 'drawing.pdf', 'weir photo.png'])
  })

  it('answers 415 to a text file named and declared as PNG, and to HTML', async () => {
    const fake = await attach(team.engineer, { name: 'photo.png', type: 'image/png', data: 'just some text, not an image' })
    expect(fake.status).toBe(415)
    expect(fake.body.message).toMatch(/^file:/)
    const html = await attach(team.engineer, { name: 'page.pdf', type: 'application/pdf', data: '<html><script>alert(1)</script></html>' })
    expect(html.status).toBe(415)
  })

  it('answers 400 for a 0-byte file or no file, 413 over 20 MB', async () => {
    const empty = await attach(team.engineer, { name: 'empty.png', type: 'image/png', data: new Uint8Array(0) })
    expect(empty.status).toBe(400)
    expect(empty.body.message).toMatch(/^file:.*empty/)
    expect((await team.engineer.upload(`/api/sites/${siteId}/attachments`, {}, { note: 'x' })).status).toBe(400)
    const big = new Uint8Array(20 * 1024 * 1024 + 10)
    big.set(PNG)
    const res = await attach(team.engineer, { name: 'huge.png', type: 'image/png', data: big })
    expect(res.status).toBe(413)
    expect(res.body.message).toMatch(/20 MB/)
  })

  it('answers 403 to reviewer and viewer, 404 to outsiders and another organisation, 401 signed out', async () => {
    for (const who of ['reviewer', 'viewer'] as const) {
      expect((await attach(team[who], { name: 'p.png', type: 'image/png', data: PNG })).status, who).toBe(403)
    }
    expect((await attach(team.outsider, { name: 'p.png', type: 'image/png', data: PNG })).status).toBe(404)
    expect((await attach(other.admin, { name: 'p.png', type: 'image/png', data: PNG })).status).toBe(404)
    expect((await attach(new Client(), { name: 'p.png', type: 'image/png', data: PNG })).status).toBe(401)
    expect((await team.outsider.get(`/api/sites/${siteId}/attachments`)).status).toBe(404)
  })
})

describe('GET and DELETE /api/attachments/[id]', () => {
  it('downloads images inline and PDFs as attachments, with the stored type and nosniff', async () => {
    const png = (await attach(team.engineer, { name: 'crest «north».png', type: 'image/png', data: PNG })).body
    const pdf = (await attach(team.engineer, { name: 'survey.pdf', type: 'application/pdf', data: PDF })).body

    const img = await team.viewer.download(`/api/attachments/${png.id}`)
    expect(img.status).toBe(200)
    expect(img.headers.get('content-type')).toBe('image/png')
    expect(img.headers.get('x-content-type-options')).toBe('nosniff')
    expect(img.headers.get('content-disposition')).toMatch(/^inline; filename="crest _north_.png"; filename\*=UTF-8''crest%20%C2%ABnorth%C2%BB.png$/)
    expect(Buffer.from(img.bytes).equals(Buffer.from(PNG))).toBe(true)

    const doc = await team.reviewer.download(`/api/attachments/${pdf.id}`)
    expect(doc.status).toBe(200)
    expect(doc.headers.get('content-type')).toBe('application/pdf')
    expect(doc.headers.get('content-disposition')).toMatch(/^attachment; filename="survey.pdf"/)
    expect(doc.headers.get('x-content-type-options')).toBe('nosniff')
    expect(Buffer.from(doc.bytes).equals(Buffer.from(PDF))).toBe(true)
  })

  it('answers 404 to outsiders and another organisation, 401 signed out', async () => {
    const png = (await attach(team.engineer, { name: 'x.png', type: 'image/png', data: PNG })).body
    expect((await team.outsider.download(`/api/attachments/${png.id}`)).status).toBe(404)
    expect((await other.admin.download(`/api/attachments/${png.id}`)).status).toBe(404)
    expect((await new Client().download(`/api/attachments/${png.id}`)).status).toBe(401)
    expect((await other.admin.delete(`/api/attachments/${png.id}`)).status).toBe(404)
    expect((await team.admin.download('/api/attachments/99999999')).status).toBe(404)
  })

  it('lets engineers and admins delete; reviewers and viewers get 403; a deleted one answers 404', async () => {
    const png = (await attach(team.engineer, { name: 'gone.png', type: 'image/png', data: PNG })).body
    for (const who of ['reviewer', 'viewer'] as const) expect((await team[who].delete(`/api/attachments/${png.id}`)).status, who).toBe(403)
    expect((await team.engineer.delete(`/api/attachments/${png.id}`)).status).toBe(200)
    expect((await team.viewer.download(`/api/attachments/${png.id}`)).status).toBe(404)
    expect((await team.engineer.delete(`/api/attachments/${png.id}`)).status).toBe(404)
    const list = await team.viewer.get(`/api/sites/${siteId}/attachments`)
    expect(list.body.attachments.some((a: { id: number }) => a.id === png.id)).toBe(false)
    const log = await team.admin.get(`/api/orgs/${team.orgId}/audit?pageSize=200`)
    const actions = log.body.entries.filter((e: { targetType: string; targetId: number }) => e.targetType === 'attachment' && e.targetId === png.id).map((e: { action: string }) => e.action)
    expect(actions).toEqual(['attachment.deleted', 'attachment.uploaded'])
  })

  it('hides the attachments of a soft-deleted site', async () => {
    const site = await createSite(team.engineer, team.orgId)
    const png = (await attach(team.engineer, { name: 'x.png', type: 'image/png', data: PNG }, site.id)).body
    expect((await team.engineer.delete(`/api/sites/${site.id}`)).status).toBe(200)
    expect((await team.admin.download(`/api/attachments/${png.id}`)).status).toBe(404)
    expect((await team.admin.get(`/api/sites/${site.id}/attachments`)).status).toBe(404)
  })
})
