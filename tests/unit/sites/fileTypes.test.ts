import { describe, expect, it } from 'vitest'
import { contentDisposition, sniffAttachmentType } from '../../../server/utils/fileTypes'

const bytes = (...parts: (string | number[])[]) => Uint8Array.from(parts.flatMap((p) => (typeof p === 'string' ? [...p].map((c) => c.charCodeAt(0)) : p)))

describe('sniffAttachmentType', () => {
  it('knows JPEG, PNG, WebP and PDF by their signatures', () => {
    // Signatures: JPEG SOI FF D8 FF (ITU T.81), PNG 89 50 4E 47 0D 0A 1A 0A (PNG spec 5.2), RIFF….WEBP (RFC 9649), %PDF- (ISO 32000-1 7.5.2).
    expect(sniffAttachmentType(bytes([0xff, 0xd8, 0xff, 0xe0]))).toBe('image/jpeg')
    expect(sniffAttachmentType(bytes([0x89], 'PNG', [0x0d, 0x0a, 0x1a, 0x0a, 0]))).toBe('image/png')
    expect(sniffAttachmentType(bytes('RIFF', [1, 2, 3, 4], 'WEBPVP8 '))).toBe('image/webp')
    expect(sniffAttachmentType(bytes('%PDF-1.7\n'))).toBe('application/pdf')
  })

  it('refuses anything else, however it is named', () => {
    expect(sniffAttachmentType(bytes('PNG file, honest'))).toBeNull()
    expect(sniffAttachmentType(bytes([0x89], 'PNG', [0x0d, 0x0a]))).toBeNull()
    expect(sniffAttachmentType(bytes('RIFF', [1, 2, 3, 4], 'WAVEfmt '))).toBeNull()
    expect(sniffAttachmentType(bytes('<svg xmlns="http://www.w3.org/2000/svg"/>'))).toBeNull()
    expect(sniffAttachmentType(new Uint8Array(0))).toBeNull()
  })
})

describe('contentDisposition', () => {
  it('keeps a plain name and encodes any other (RFC 6266, RFC 5987)', () => {
    expect(contentDisposition('attachment', 'survey.pdf')).toBe(`attachment; filename="survey.pdf"; filename*=UTF-8''survey.pdf`)
    expect(contentDisposition('inline', 'a "b";c.png')).toBe(`inline; filename="a _b__c.png"; filename*=UTF-8''a%20%22b%22%3Bc.png`)
    expect(contentDisposition('inline', 'Hollin weir ©.png')).toBe(`inline; filename="Hollin weir _.png"; filename*=UTF-8''Hollin%20weir%20%C2%A9.png`)
  })
})
