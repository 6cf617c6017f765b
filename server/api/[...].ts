// Any /api path or method no route handles answers 404 JSON, instead of falling through to the
// page renderer (which would redirect a signed-out caller to the sign-in page).
export default defineEventHandler((event) => {
  throw createError({
    statusCode: 404,
    statusMessage: 'Not Found',
    message: `No API route answers ${event.method} ${event.path.split('?')[0]}`,
  })
})
