// The request's clock: handlers read the time here and pass it to server/domain, whose operations
// take `now` as an argument (so the seed and tests can choose it).

/** Current time as SQLite's defaults write it. */
export const nowIso = () => new Date().toISOString()
