import type { AttachmentType } from '../../shared/schemas/site'

const startsWith = (bytes: Uint8Array, sig: readonly number[], at = 0) => sig.every((b, i) => bytes[at + i] === b)
const ascii = (s: string) => [...s].map((c) => c.charCodeAt(0))

/**
 * The attachment type a file really is, from its first bytes (JPEG FF D8 FF; PNG's 8-byte signature;
 * RIFF….WEBP; %PDF-), or null for anything else, whatever its name or declared type says.
 */
export function sniffAttachmentType(bytes: Uint8Array): AttachmentType | null {
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return 'image/jpeg'
  if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png'
  if (startsWith(bytes, ascii('RIFF')) && startsWith(bytes, ascii('WEBP'), 8)) return 'image/webp'
  if (startsWith(bytes, ascii('%PDF-'))) return 'application/pdf'
  return null
}

/** A Content-Disposition value that survives any file name (RFC 6266 with an RFC 5987 `filename*`). */
export function contentDisposition(kind: 'inline' | 'attachment', fileName: string): string {
  const fallback = fileName.replace(/[^\x20-\x7e]|["\\%;]/g, '_')
  const encoded = encodeURIComponent(fileName).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`)
  return `${kind}; filename="${fallback}"; filename*=UTF-8''${encoded}`
}
