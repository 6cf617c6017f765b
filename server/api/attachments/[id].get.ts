import { SiteParamsSchema } from '#shared/schemas/site'
import { READER_ROLES } from '#shared/utils/roles'

// Downloads an attachment for members of its site's organisation. Type, disposition and name come
// from the stored bytes, sniffed again here (never the uploader's claim): JPEG, PNG and WebP inline,
// PDFs and anything unrecognised as a download. nosniff, and a CSP of the file's own that runs, loads
// and frames nothing (the image styles are for the browser's own image viewer page).
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { attachment } = await requireAttachment(event, id, READER_ROLES)
  const data = await (await uploadsStorage()).getItemRaw<Buffer>(attachment.storage_key)
  if (!data) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'The attachment file is missing from storage' })
  const body = Buffer.isBuffer(data) ? data : Buffer.from(data as Uint8Array)
  const { contentType, disposition } = servedAs(body, attachment.original_name)
  setResponseHeaders(event, {
    'Content-Type': contentType,
    'Content-Length': String(body.length),
    'Content-Disposition': disposition,
    'X-Content-Type-Options': 'nosniff',
    'Cache-Control': 'private, no-store',
    'Cross-Origin-Resource-Policy': 'same-origin',
    'Content-Security-Policy': "default-src 'none'; img-src 'self'; style-src 'unsafe-inline'; frame-ancestors 'none'; sandbox",
  })
  return body
})
