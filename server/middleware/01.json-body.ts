// A JSON body that cannot be read (broken JSON, or one h3 refuses outright: a "__proto__" or
// "constructor" key anywhere, a bare number of more than 16 digits) is refused here with a 400 that
// names the body, in the house style, before any route reads it. h3 keeps the parsed body, so the
// route's readValidatedBody does not parse it again.
const BODY_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])
/** Bodies declared larger are left unread here, for the size limits after this (nuxt-security's 413). */
const READ_AT_MOST = 32 * 1024 * 1024

export default defineEventHandler(async (event) => {
  if (!event.path.startsWith('/api/') || !BODY_METHODS.has(event.method)) return
  const type = (getRequestHeader(event, 'content-type') ?? '').toLowerCase()
  if (type.startsWith('multipart/') || type.startsWith('application/x-www-form-urlencoded')) return
  if (Number(getRequestHeader(event, 'content-length') ?? 0) > READ_AT_MOST) return
  try {
    await readBody(event)
  } catch (error) {
    if (isError(error) && error.statusCode === 400) {
      throw createError({
        statusCode: 400,
        statusMessage: 'Bad Request',
        message: 'body: is not valid JSON, or holds a key such as "__proto__" or "constructor" that is refused',
      })
    }
    throw error
  }
})
