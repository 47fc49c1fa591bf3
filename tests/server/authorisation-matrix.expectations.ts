// The expected answer to each person on each route of the API (authorisation-matrix.test.ts).
// "ok": passed authorisation — 2xx, or 400/409/422 for the deliberately empty body; 401: not signed in;
// 403: signed in without the role; 404: the record is not theirs to know about (another home's
// tenant, another landlord's staff), so they cannot tell it exists.
// The ids are of the first landlord's records: the tenant's case (and its photo, import and work
// order), the tenant's home and a spare room of it, the maintenance lead (users/:id), a pending invitation.

export const ACTORS = [
  "anonymous",
  "tenant",
  "otherTenant",
  "officer",
  "maintenance",
  "admin",
  "otherAdmin",
  "otherOfficer",
] as const;
export type Actor = (typeof ACTORS)[number];
export type Expected = "ok" | 401 | 403 | 404;

type Row = readonly [Expected, Expected, Expected, Expected, Expected, Expected, Expected, Expected];

// prettier-ignore
const ROWS: Record<string, Row> = {
  //                                                             anon   tnt  oTnt  offr   mnt   adm  oAdm  oOff
  "GET /api/health":                                            ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "GET /api/health/live":                                       ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "GET /api/health/ready":                                      ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "POST /api/psychrometrics/evaluate":                          ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "POST /api/psychrometrics/series":                            ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "GET /api/psychrometrics/openapi.json":                       ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "GET /api/openapi.json":                                      [ 401,  403,  403, "ok", "ok", "ok", "ok", "ok"],
  "GET /api/docs":                                              [ 401,  403,  403, "ok", "ok", "ok", "ok", "ok"],
  "GET /api/docs/start.js":                                     [ 401,  403,  403, "ok", "ok", "ok", "ok", "ok"],
  "GET /api/auth/csrf":                                         ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "POST /api/auth/login":                                       ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "POST /api/auth/logout":                                      ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "GET /api/auth/me":                                           [ 401, "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "POST /api/auth/invitations":                                 [ 401,  403,  403, "ok",  403, "ok", "ok", "ok"],
  "GET /api/auth/invitations/:token":                           ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "POST /api/auth/invitations/:userId/resend":                  [ 401,  403,  403,  403,  403, "ok",  404,  403],
  "POST /api/auth/invitations/:userId/cancel":                  [ 401,  403,  403,  403,  403, "ok",  404,  403],
  "POST /api/auth/invitations/accept":                          ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "POST /api/auth/password-reset":                              ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "POST /api/auth/password-reset/confirm":                      ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "POST /api/auth/sign-in-unlock/request":                      ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "POST /api/auth/sign-in-unlock":                              ["ok", "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "GET /api/me/home":                                           [ 401, "ok", "ok",  403,  403,  403,  403,  403],
  "GET /api/me/cases":                                          [ 401, "ok", "ok",  403,  403,  403,  403,  403],
  "GET /api/me/unread-messages":                                [ 401, "ok", "ok", "ok", "ok", "ok", "ok", "ok"],
  "GET /api/cases":                                             [ 401,  403,  403, "ok", "ok", "ok", "ok", "ok"],
  "POST /api/cases/bulk":                                       [ 401,  403,  403, "ok",  403, "ok", "ok", "ok"],
  "POST /api/cases/bulk/preview":                               [ 401,  403,  403, "ok",  403, "ok", "ok", "ok"],
  "GET /api/cases/:id/triage":                                  [ 401,  403,  403, "ok", "ok", "ok",  404,  404],
  "GET /api/cases/:id/related":                                 [ 401,  403,  403, "ok", "ok", "ok",  404,  404],
  "POST /api/cases":                                            [ 401, "ok", "ok", "ok",  403, "ok", "ok", "ok"],
  "GET /api/cases/:id":                                         [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "PATCH /api/cases/:id":                                       [ 401,  403,  403, "ok",  403, "ok",  404,  404],
  "GET /api/cases/:id/events":                                  [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "POST /api/cases/:id/worse":                                  [ 401, "ok",  404,  403,  403,  403,  403,  403],
  "GET /api/cases/:id/photos":                                  [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "POST /api/cases/:id/photos":                                 [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "GET /api/cases/:id/readings":                                [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "POST /api/cases/:id/readings":                               [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "POST /api/cases/:id/readings/import/preview":                [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "POST /api/cases/:id/readings/import":                        [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "GET /api/cases/:id/readings/imports/:importId/rejected.csv": [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "GET /api/cases/:id/evaluation":                              [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "POST /api/cases/:id/assessments":                            [ 401,  403,  403, "ok",  403, "ok",  404,  404],
  "GET /api/cases/:id/assessments":                             [ 401,  403,  403, "ok", "ok", "ok",  404,  404],
  "POST /api/cases/:id/inspections":                            [ 401,  403,  403, "ok",  403, "ok",  404,  404],
  "GET /api/cases/:id/inspections":                             [ 401,  403,  403, "ok", "ok", "ok",  404,  404],
  "POST /api/cases/:id/summary":                                [ 401,  403,  403, "ok",  403, "ok",  404,  404],
  "POST /api/cases/:id/messages":                               [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "GET /api/cases/:id/messages":                                [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "POST /api/cases/:id/messages/read":                          [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "GET /api/cases/:id/deadlines":                               [ 401,  403,  403, "ok", "ok", "ok",  404,  404],
  "POST /api/cases/:id/work-orders":                            [ 401,  403,  403, "ok", "ok", "ok",  404,  404],
  "GET /api/cases/:id/work-orders":                             [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "GET /api/cases/:id/verification":                            [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "POST /api/cases/:id/verification":                           [ 401,  403,  403,  403, "ok", "ok",  404,  403],
  "GET /api/work-orders":                                       [ 401,  403,  403, "ok", "ok", "ok", "ok", "ok"],
  "PATCH /api/work-orders/:id":                                 [ 401,  403,  403,  403, "ok", "ok",  404,  403],
  "POST /api/work-orders/:id/photos":                           [ 401,  403,  403,  403, "ok", "ok",  404,  403],
  "POST /api/work-orders/:id/booking-response":                 [ 401, "ok",  404,  403,  403,  403,  403,  403],
  "GET /api/contractors":                                       [ 401,  403,  403, "ok", "ok", "ok", "ok", "ok"],
  "POST /api/contractors":                                      [ 401,  403,  403,  403, "ok", "ok", "ok",  403],
  "GET /api/policy":                                            [ 401,  403,  403, "ok", "ok", "ok", "ok", "ok"],
  "PUT /api/policy":                                            [ 401,  403,  403,  403,  403, "ok", "ok",  403],
  "DELETE /api/policy":                                         [ 401,  403,  403,  403,  403, "ok", "ok",  403],
  "GET /api/photos/:id":                                        [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "GET /api/photos/:id/thumbnail":                              [ 401, "ok",  404, "ok", "ok", "ok",  404,  404],
  "GET /api/properties":                                        [ 401,  403,  403, "ok", "ok", "ok", "ok", "ok"],
  "GET /api/properties/estates":                                [ 401,  403,  403, "ok", "ok", "ok", "ok", "ok"],
  "GET /api/properties/:id":                                    [ 401,  403,  403, "ok", "ok", "ok",  404,  404],
  "POST /api/properties":                                       [ 401,  403,  403,  403,  403, "ok", "ok",  403],
  "PATCH /api/properties/:id":                                  [ 401,  403,  403,  403,  403, "ok",  404,  403],
  "POST /api/properties/:id/rooms":                             [ 401,  403,  403,  403,  403, "ok",  404,  403],
  "PATCH /api/properties/:id/rooms/:roomId":                    [ 401,  403,  403,  403,  403, "ok",  404,  403],
  "DELETE /api/properties/:id/rooms/:roomId":                   [ 401,  403,  403,  403,  403, "ok",  404,  403],
  "GET /api/properties/:id/tenants":                            [ 401,  403,  403, "ok", "ok", "ok",  404,  404],
  "GET /api/properties/:id/cases":                              [ 401,  403,  403, "ok", "ok", "ok",  404,  404],
  "GET /api/properties/:id/readings":                           [ 401,  403,  403, "ok", "ok", "ok",  404,  404],
  "GET /api/outbox":                                            [ 401,  403,  403, "ok",  403, "ok", "ok", "ok"],
  "POST /api/outbox/:id/resend":                                [ 401,  403,  403, "ok",  403, "ok",  404,  404],
  "GET /api/users":                                             [ 401,  403,  403,  403,  403, "ok", "ok",  403],
  "PATCH /api/users/:id":                                       [ 401,  403,  403,  403,  403, "ok",  404,  403],
  "GET /api/users/:id/history":                                 [ 401,  403,  403,  403,  403, "ok",  404,  403],
  "GET /api/staff":                                             [ 401,  403,  403, "ok", "ok", "ok", "ok", "ok"],
};

/** "METHOD /path" → the expected answer per actor. */
export const MATRIX: Record<string, Record<Actor, Expected>> = Object.fromEntries(
  Object.entries(ROWS).map(([route, row]) => [
    route,
    Object.fromEntries(ACTORS.map((a, i) => [a, row[i]!])) as Record<Actor, Expected>,
  ]),
);
