import { SiteParamsSchema } from '../../../shared/schemas/site'
import { READER_ROLES } from '../../../shared/utils/roles'

// Downloads an attachment for members of its site's organisation: the stored (sniffed) type, nosniff,
// images inline, PDFs as a download.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { attachment } = await requireAttachment(event, id, READER_ROLES)
  const data = await (await uploadsStorage()).getItemRaw<Buffer>(attachment.storage_key)
  if (!data) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'The attachment file is missing from storage' })
  const body = Buffer.isBuffer(data) ? data : Buffer.from(data as Uint8Array)
  setResponseHeaders(event, {
    'Content-Type': attachment.content_type,
    'Content-Length': String(body.length),
    'Content-Disposition': contentDisposition(attachment.content_type === 'application/pdf' ? 'attachment' : 'inline', attachment.original_name),
    'X-Content-Type-Options': 'nosniff',
    'Cache-Control': 'private, no-store',
    'Content-Security-Policy': "default-src 'none'; img-src 'self'; style-src 'unsafe-inline'; sandbox",
  })
  return body
})
