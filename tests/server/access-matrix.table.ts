// Who may call what: the expected answer of every API route (METHOD + pattern, as derived from the
// files under server/api by access-matrix.test.ts) for each kind of caller. The matrix test fails on a
// route file with no row here, on a row with no route file, and on every cell the server answers
// differently. Sources: docs/api.md (the "who" columns), server/utils/auth.ts (401 signed out, 404
// outside the organisation, 403 wrong role) and server/utils/sites.ts (single-site reviewer grants).

/** The callers, all relative to organisation A and its site A1. */
export const CALLERS = [
  /** Admin of organisation A. */
  'admin',
  /** Engineer of organisation A. */
  'engineer',
  /** Reviewer of organisation A. */
  'reviewer',
  /** Viewer of organisation A. */
  'viewer',
  /** Not a member of A: a single-site reviewer grant on site A1 only (accepted a site invitation). */
  'siteReviewer',
  /** Admin of organisation B, nothing to do with A. */
  'outsider',
  /** Signed out. */
  'anonymous',
] as const
export type Caller = (typeof CALLERS)[number]

/**
 * One expected answer:
 * - `ok`: any 2xx, and the call (with a valid body) really did what it asks;
 * - `public`: any 2xx for a route that needs no sign-in;
 * - `4xx-not-auth`: 400, 409, 413, 415 or 422: the access gate let the caller through and the input
 *   was refused (for calls whose valid body is impractical; never 401/403/404, never 5xx);
 * - a number: exactly that status.
 */
export type Expected = 'ok' | 'public' | '4xx-not-auth' | 401 | 403 | 404 | 405
export type Row = Record<Caller, Expected>

/** The statuses `4xx-not-auth` accepts. */
export const NOT_AUTH_4XX = [400, 409, 413, 415, 422] as const

// Shared rows, named after docs/api.md's "who" column. A single-site reviewer counts as reviewer on
// A1 (site-scoped routes) and is nobody in organisation A (organisation routes: 404).

/** Readers of a site (every role, the site's single-site reviewer too). */
const SITE_READERS: Row = { admin: 'ok', engineer: 'ok', reviewer: 'ok', viewer: 'ok', siteReviewer: 'ok', outsider: 404, anonymous: 401 }
/** Writers of a site (admin, engineer); a single-site reviewer is a reviewer there: 403. */
const SITE_WRITERS: Row = { admin: 'ok', engineer: 'ok', reviewer: 403, viewer: 403, siteReviewer: 403, outsider: 404, anonymous: 401 }
/** Admin of the site's organisation only. */
const SITE_ADMIN: Row = { admin: 'ok', engineer: 403, reviewer: 403, viewer: 403, siteReviewer: 403, outsider: 404, anonymous: 401 }
/** Readers of an organisation: the single-site reviewer is not a member. */
const ORG_READERS: Row = { admin: 'ok', engineer: 'ok', reviewer: 'ok', viewer: 'ok', siteReviewer: 404, outsider: 404, anonymous: 401 }
/** Writers of an organisation. */
const ORG_WRITERS: Row = { admin: 'ok', engineer: 'ok', reviewer: 403, viewer: 403, siteReviewer: 404, outsider: 404, anonymous: 401 }
/** Admin of the organisation only. */
const ORG_ADMIN: Row = { admin: 'ok', engineer: 403, reviewer: 403, viewer: 403, siteReviewer: 404, outsider: 404, anonymous: 401 }
/** Anyone signed in, whatever their organisations. */
const SIGNED_IN: Row = { admin: 'ok', engineer: 'ok', reviewer: 'ok', viewer: 'ok', siteReviewer: 'ok', outsider: 'ok', anonymous: 401 }
/** Anyone, signed in or not. */
const PUBLIC: Row = { admin: 'public', engineer: 'public', reviewer: 'public', viewer: 'public', siteReviewer: 'public', outsider: 'public', anonymous: 'public' }
/** The same status for everyone. */
const everyone = (status: 404 | 405): Row => ({ admin: status, engineer: status, reviewer: status, viewer: status, siteReviewer: status, outsider: status, anonymous: status })

export const ACCESS_TABLE: Record<string, Row> = {
  // ——— the catch-all: any /api path no route handles, every method ———
  'GET /api/**': everyone(404),
  'POST /api/**': everyone(404),
  'PUT /api/**': everyone(404),
  'PATCH /api/**': everyone(404),
  'DELETE /api/**': everyone(404),

  // ——— accounts and sessions ———
  'GET /api/health': PUBLIC,
  'POST /api/auth/signup': PUBLIC,
  'POST /api/auth/login': PUBLIC,
  'POST /api/auth/logout': PUBLIC,
  'POST /api/auth/password-reset': PUBLIC,
  'POST /api/auth/password-reset/:token': PUBLIC,
  'POST /api/auth/verify-email/:token': PUBLIC,
  'GET /api/me': SIGNED_IN,
  // The organisation opened by default: one of the caller's own (the single-site reviewer has none in A).
  'PATCH /api/me': { admin: 'ok', engineer: 'ok', reviewer: 'ok', viewer: 'ok', siteReviewer: 404, outsider: 'ok', anonymous: 401 },
  'POST /api/orgs': SIGNED_IN,
  'GET /api/account/sessions': SIGNED_IN,
  'DELETE /api/account/sessions/:id': SIGNED_IN,
  'POST /api/account/sessions/end-others': SIGNED_IN,
  // Called with a wrong current password (400), so nobody's password changes.
  'POST /api/account/password': { admin: '4xx-not-auth', engineer: '4xx-not-auth', reviewer: '4xx-not-auth', viewer: '4xx-not-auth', siteReviewer: '4xx-not-auth', outsider: '4xx-not-auth', anonymous: 401 },
  // Every caller's address is confirmed already (409).
  'POST /api/account/verification': { admin: '4xx-not-auth', engineer: '4xx-not-auth', reviewer: '4xx-not-auth', viewer: '4xx-not-auth', siteReviewer: '4xx-not-auth', outsider: '4xx-not-auth', anonymous: 401 },

  // ——— organisation A ———
  'GET /api/orgs/:orgId/members': ORG_READERS,
  'PATCH /api/orgs/:orgId/members/:userId': ORG_ADMIN,
  // Removing someone else: admin only (a member leaving, their own id, is tested in account-takeover.test.ts).
  'DELETE /api/orgs/:orgId/members/:userId': ORG_ADMIN,
  'GET /api/orgs/:orgId/audit': ORG_ADMIN,
  'GET /api/orgs/:orgId/settings': ORG_READERS,
  'PATCH /api/orgs/:orgId/settings': ORG_ADMIN,
  'GET /api/orgs/:orgId/outbox': ORG_ADMIN,
  'GET /api/orgs/:orgId/invitations': ORG_ADMIN,
  'POST /api/orgs/:orgId/invitations': ORG_ADMIN,
  'GET /api/orgs/:orgId/summary-links': ORG_ADMIN,
  'GET /api/orgs/:orgId/portfolio': ORG_READERS,
  'GET /api/orgs/:orgId/options': ORG_READERS,
  'GET /api/orgs/:orgId/sites': ORG_READERS,
  'POST /api/orgs/:orgId/sites': ORG_WRITERS,
  'GET /api/orgs/:orgId/sites/map': ORG_READERS,

  // ——— site A1 ———
  'GET /api/sites/:id': SITE_READERS,
  'PATCH /api/sites/:id': SITE_WRITERS,
  'DELETE /api/sites/:id': SITE_WRITERS,
  'POST /api/sites/:id/restore': SITE_ADMIN,
  'GET /api/sites/:id/hydrology': SITE_READERS,
  'POST /api/sites/:id/flow-record': SITE_WRITERS,
  'GET /api/sites/:id/flow-record': SITE_READERS,
  'GET /api/sites/:id/flow-record.csv': SITE_READERS,
  'DELETE /api/sites/:id/flow-record': SITE_WRITERS,
  'GET /api/sites/:id/attachments': SITE_READERS,
  'POST /api/sites/:id/attachments': SITE_WRITERS,
  'GET /api/attachments/:id': SITE_READERS,
  'DELETE /api/attachments/:id': SITE_WRITERS,
  'GET /api/sites/:id/commissioning': SITE_READERS,
  'POST /api/sites/:id/commissioning': SITE_WRITERS,
  'DELETE /api/commissioning/:id': SITE_WRITERS,
  'GET /api/sites/:id/options': SITE_READERS,
  'POST /api/sites/:id/options': SITE_WRITERS,
  'GET /api/sites/:id/consents': SITE_READERS,
  'PATCH /api/sites/:id/consents/:kind': SITE_WRITERS,
  'PATCH /api/sites/:id/constraints': SITE_WRITERS,

  // ——— options and assessments of A1 ———
  'GET /api/options/:id': SITE_READERS,
  'PATCH /api/options/:id': SITE_WRITERS,
  'DELETE /api/options/:id': SITE_WRITERS,
  'GET /api/options/:id/assessments': SITE_READERS,
  'POST /api/options/:id/assessments': SITE_WRITERS,
  'POST /api/options/:id/sweep': SITE_READERS,
  'POST /api/options/:id/sweep/save': SITE_WRITERS,
  'GET /api/assessments/:id': SITE_READERS,
  'GET /api/assessments/:id/export/:file': SITE_READERS,
  // docs/api.md: "members of each option's organisation"; a single-site grant is no membership.
  'GET /api/compare': ORG_READERS,

  // ——— the stateless engine: anyone signed in ———
  'POST /api/engine/assess': SIGNED_IN,
  'POST /api/engine/sweep': SIGNED_IN,
  'POST /api/engine/sensitivity': SIGNED_IN,

  // ——— review and comments of A1 ———
  'GET /api/sites/:id/review': SITE_READERS,
  'POST /api/sites/:id/review/submit': SITE_WRITERS,
  // Deciding: admin, reviewer, and the site's single-site reviewer.
  'POST /api/sites/:id/review/decision': { admin: 'ok', engineer: 403, reviewer: 'ok', viewer: 403, siteReviewer: 'ok', outsider: 404, anonymous: 401 },
  'GET /api/sites/:id/review/brief': SITE_READERS,
  'GET /api/sites/:id/comments': SITE_READERS,
  // Commenting: admin, engineer, reviewer (the single-site reviewer too), not a viewer.
  'POST /api/sites/:id/comments': { admin: 'ok', engineer: 'ok', reviewer: 'ok', viewer: 403, siteReviewer: 'ok', outsider: 404, anonymous: 401 },

  // ——— summary links ———
  'GET /api/sites/:id/summary-links': SITE_WRITERS,
  'POST /api/sites/:id/summary-links': SITE_WRITERS,
  'DELETE /api/summary-links/:id': SITE_WRITERS,
  // One file for every method: GET reads the summary, anything else is 405 (read-only).
  'GET /api/public/summary/:token': PUBLIC,
  'POST /api/public/summary/:token': everyone(405),
  'PUT /api/public/summary/:token': everyone(405),
  'PATCH /api/public/summary/:token': everyone(405),
  'DELETE /api/public/summary/:token': everyone(405),

  // ——— invitations (`:key` is the token for GET and accept, the id for DELETE) ———
  'GET /api/invitations/:key': PUBLIC,
  // An invitation of a third organisation to the caller's own address (a new one when signed out).
  'POST /api/invitations/:key/accept': PUBLIC,
  'DELETE /api/invitations/:key': ORG_ADMIN,
}
