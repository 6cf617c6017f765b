import { applyDomainError } from '../utils/errors'

// Refusals thrown by server/domain (DomainError) reach the client as the HTTP errors they stand for
// (404, 409, 422 … with their message and data), from every route, without a try/catch in each
// handler: h3 hands every thrown error to the app's onError before answering, and this maps it
// there first.
export default defineNitroPlugin((nitroApp) => {
  const answer = nitroApp.h3App.options.onError
  nitroApp.h3App.options.onError = (error, event) => {
    applyDomainError(error)
    setResponseStatus(event, error.statusCode, error.statusMessage)
    return answer?.(error, event)
  }
})
