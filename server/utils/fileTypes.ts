import type { AttachmentType } from '../../shared/schemas/attachment'

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

/** File-name endings that belong to each attachment type; the first is added when a name lacks one. */
const EXTENSIONS: Record<AttachmentType, readonly string[]> = {
  'image/jpeg': ['.jpg', '.jpeg'],
  'image/png': ['.png'],
  'image/webp': ['.webp'],
  'application/pdf': ['.pdf'],
}

/** Raster images a browser shows inline without running anything; PDFs (viewers may script them) download. */
const INLINE_TYPES: ReadonlySet<string> = new Set<AttachmentType>(['image/jpeg', 'image/png', 'image/webp'])

/**
 * How a stored file is served, decided from its bytes alone: the sniffed type (anything unknown is
 * `application/octet-stream`), `inline` only for the raster images, and a download name that ends
 * in the real type's extension, so "survey.html" holding a PNG saves as "survey.html.png" and never
 * opens as a page from disk.
 */
export function servedAs(bytes: Uint8Array, originalName: string): { contentType: string; disposition: string } {
  const type = sniffAttachmentType(bytes)
  if (!type) return { contentType: 'application/octet-stream', disposition: contentDisposition('attachment', `${originalName}.bin`) }
  const endings = EXTENSIONS[type]
  const name = endings.some((e) => originalName.toLowerCase().endsWith(e)) ? originalName : `${originalName}${endings[0]}`
  return { contentType: type, disposition: contentDisposition(INLINE_TYPES.has(type) ? 'inline' : 'attachment', name) }
}
