// Every route of the API with its success reply: the list the OpenAPI document is built from
// (server/api-registry.ts adds the server's request schemas) and the client's test mocks are checked by.
// A server test walks the Express app and fails when a mounted route is missing here, or the reverse.
import { type z } from "zod";
import type { Role } from "../roles.js";
import { assessmentListResponse, assessmentResponse } from "./assessments.js";
import {
  csrfResponse,
  invitationCreatedResponse,
  invitationSentResponse,
  invitationDescriptionResponse,
  loginResponse,
  meResponse,
  myLanguageResponse,
  passwordResetRequestedResponse,
  signInUnlockRequestedResponse,
} from "./auth.js";
import { caseEventsResponse, caseResponse, myCasesResponse, relatedCasesResponse, worseResponse } from "./cases.js";
import { conversationResponse, messageSentResponse, readMarkResponse, unreadMessagesResponse } from "./conversation.js";
import { complaintListResponse, complaintPolicyResponse, complaintResponse } from "./complaints.js";
import { evaluationResponse } from "./evaluation.js";
import { estateLocationListResponse, estateLocationResponse } from "./weather.js";
import { EVIDENCE_PACK_MEDIA_TYPE } from "./evidence-pack.js";
import { outboxItem, outboxPageResponse } from "./mail.js";
import { textChoiceResponse, textOutboxPageResponse } from "./sms.js";
import {
  webhookDeliveryPageResponse,
  webhookDeliveryResponse,
  webhookEndpointListResponse,
  webhookEndpointResponse,
  webhookSecretResponse,
} from "./webhooks.js";
import { healthResponse, livenessResponse, readinessResponse } from "./health.js";
import {
  adminActionListResponse,
  apiKeyAuditResponse,
  apiKeyCreatedResponse,
  apiKeyListResponse,
  apiKeyResponse,
  type ApiScope,
} from "./integrations.js";
import { deadlinesResponse, inspectionListResponse, inspectionRecordedResponse, summarySentResponse } from "./inspections.js";
import { photoListResponse, photoUploadResponse } from "./photos.js";
import { sensorAttentionPageResponse, sensorHealthResponse, sensorHealthSummaryResponse } from "./sensor-health.js";
import { heatingSupportPolicyResponse, policyResponse, sensorAlertPolicyResponse } from "./policy.js";
import { homeAdviceResponse } from "./home-advice.js";
import { alertsDismissedResponse, homesAtRiskResponse, proactiveCaseResponse } from "./sensor-watch.js";
import {
  estatesResponse,
  homeCasesResponse,
  homeReadingsResponse,
  homeTenantsResponse,
  myHomeResponse,
  propertyPageResponse,
  propertyResponse,
  roomResponse,
} from "./properties.js";
import { outlookResponse } from "./outlook.js";
import { pointResult, seriesResult } from "./psychrometrics.js";
import { importPreviewResponse, importResultResponse, readingsAddedResponse, readingsResponse } from "./readings.js";
import { dashboardResponse, whatWorksResponse } from "./insight.js";
import { boardReportSentResponse, boardReportSettingsResponse } from "./board-report.js";
import { bulkPreviewResponse, bulkUpdateResponse, queuePageResponse, triageResponse } from "./triage.js";
import { stockImportListResponse, stockImportPreviewResponse, stockImportResponse } from "./stock-imports.js";
import { staffListResponse, userHistoryResponse, userPageResponse, userResponse } from "./users.js";
import { tenancyImportListResponse, tenancyImportPreviewResponse, tenancyImportResultResponse } from "./tenancy-import.js";
import {
  sensorCredentialsResponse,
  sensorIngestResponse,
  sensorListResponse,
  sensorPageResponse,
  sensorReadingsResponse,
  sensorResponse,
} from "./sensors.js";
import {
  caseWorkOrdersResponse,
  contractorListResponse,
  contractorResponse,
  verificationResponse,
  workOrderPageResponse,
  workOrderResponse,
} from "./works.js";

export type HttpMethod = "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
/**
 * Who may call a route: anyone, anyone signed in, the roles listed, or (the integration API under
 * /api/v1) an API key holding the scope, with no session.
 */
export type Access = "public" | "signed-in" | readonly Role[] | { apiKey: ApiScope };

export interface Endpoint {
  method: HttpMethod;
  /** The full path in Express's notation, e.g. /api/cases/:id. */
  path: string;
  access: Access;
  summary: string;
  /** The success status and its body: a schema for JSON, a media type for anything else, null for none. */
  status: 200 | 201 | 202 | 204;
  response: z.ZodType | { mediaType: string } | null;
  /** Sent as multipart/form-data (files) rather than JSON. */
  multipart?: boolean;
}

const STAFF = ["officer", "maintenance", "admin"] as const;
/** A table export: CSV by default, .xlsx with format=xlsx (OpenAPI names one media type per reply here). */
const EXPORT_FILE = { mediaType: "text/csv" };
const OFFICERS = ["officer", "admin"] as const;
const LEADS = ["maintenance", "admin"] as const;
const TENANT_OR_OFFICERS = ["tenant", "officer", "admin"] as const;

const e = (
  method: HttpMethod,
  path: string,
  access: Access,
  summary: string,
  response: Endpoint["response"],
  status: Endpoint["status"] = 200,
  extra: Partial<Endpoint> = {},
): Endpoint => ({
  method,
  path,
  access,
  summary,
  status,
  response,
  ...extra,
});

export const ENDPOINTS: readonly Endpoint[] = [
  e("GET", "/api/health", "public", "Is the service and its database up", healthResponse),
  e("GET", "/api/health/live", "public", "Is the process up and serving (liveness)", livenessResponse),
  e(
    "GET",
    "/api/health/ready",
    "public",
    "May traffic be sent here: database answers, migrations current, not shutting down (readiness; 503 with the reason otherwise)",
    readinessResponse,
  ),
  e("POST", "/api/psychrometrics/evaluate", "public", "Evaluate one reading (risk engine)", pointResult),
  e("POST", "/api/psychrometrics/series", "public", "Evaluate a time series of readings (risk engine)", seriesResult),
  e("GET", "/api/psychrometrics/openapi.json", "public", "The OpenAPI document of the public risk-engine API", {
    mediaType: "application/json",
  }),
  e("GET", "/api/openapi.json", STAFF, "This document", { mediaType: "application/json" }),
  e("GET", "/api/docs", STAFF, "The interactive API reference", { mediaType: "text/html" }),
  e("GET", "/api/docs/start.js", STAFF, "The reference page's start script (its other files are static)", {
    mediaType: "text/javascript",
  }),

  e("GET", "/api/auth/csrf", "public", "A CSRF token for the session", csrfResponse),
  e("POST", "/api/auth/login", "public", "Sign in", loginResponse),
  e("POST", "/api/auth/logout", "public", "Sign out", null, 204),
  e("GET", "/api/auth/me", "signed-in", "The signed-in user", meResponse),
  e("POST", "/api/auth/invitations", ["admin", "officer"], "Invite a person", invitationSentResponse, 201),
  e("GET", "/api/auth/invitations/:token", "public", "Who an invitation is for", invitationDescriptionResponse),
  e(
    "POST",
    "/api/auth/invitations/:userId/resend",
    ["admin"],
    "Send a pending invitation again with a new link (the old link stops working)",
    invitationCreatedResponse,
    201,
  ),
  e("POST", "/api/auth/invitations/:userId/cancel", ["admin"], "Cancel a pending invitation", null, 204),
  e("POST", "/api/auth/invitations/accept", "public", "Accept an invitation and choose a password", null, 204),
  e("POST", "/api/auth/password-reset", "public", "Ask for a password reset link", passwordResetRequestedResponse, 202),
  e("POST", "/api/auth/password-reset/confirm", "public", "Choose a new password with a reset link", null, 204),
  e(
    "POST",
    "/api/auth/sign-in-unlock/request",
    "public",
    "Ask for a link that skips the sign-in wait",
    signInUnlockRequestedResponse,
    202,
  ),
  e("POST", "/api/auth/sign-in-unlock", "public", "Skip the sign-in wait in this browser with an e-mailed link", null, 204),

  e("GET", "/api/me/home", ["tenant"], "The tenant's home", myHomeResponse),
  e("GET", "/api/me/outlook", ["tenant"], "The three-day condensation outlook of the tenant's home", outlookResponse),
  e("GET", "/api/me/cases", ["tenant"], "The tenant's cases", myCasesResponse),
  e(
    "GET",
    "/api/me/unread-messages",
    "signed-in",
    "Cases with messages from the other side not read yet",
    unreadMessagesResponse,
  ),

  e("GET", "/api/cases", STAFF, "The officers' queue", queuePageResponse),
  e("GET", "/api/cases/export", STAFF, "The queue as on screen, every page, as CSV or .xlsx (format=xlsx)", EXPORT_FILE),
  e("POST", "/api/cases/bulk", OFFICERS, "Assign or move many cases", bulkUpdateResponse),
  e("POST", "/api/cases/bulk/preview", OFFICERS, "Which status moves are valid for the chosen cases", bulkPreviewResponse),
  e("GET", "/api/cases/:id/triage", STAFF, "A case's priority and how it was worked out", triageResponse),
  e("GET", "/api/cases/:id/related", STAFF, "Other cases of the same home", relatedCasesResponse),
  e(
    "POST",
    "/api/cases",
    ["tenant", "officer", "admin"],
    "Report damp or mould (a tenant), or record a report (staff)",
    caseResponse,
    201,
  ),
  e("GET", "/api/cases/:id", "signed-in", "A case", caseResponse),
  e("PATCH", "/api/cases/:id", OFFICERS, "Change a case's status, assignee or hazard class", caseResponse),
  e("GET", "/api/cases/:id/events", "signed-in", "A case's timeline", caseEventsResponse),
  e(
    "GET",
    "/api/cases/:id/advice",
    "signed-in",
    "The few things most likely to help in the case's home, ranked",
    homeAdviceResponse,
  ),
  e(
    "POST",
    "/api/cases/:id/worse",
    ["tenant"],
    "Tell the landlord it got worse (body { note }, required): re-scores the case, e-mails the assignee or the officers, reopens a closed, cancelled or monitored case",
    worseResponse,
  ),
  e("GET", "/api/cases/:id/photos", "signed-in", "A case's photos", photoListResponse),
  e("POST", "/api/cases/:id/photos", "signed-in", "Add photos to a case", photoUploadResponse, 201, { multipart: true }),
  e("GET", "/api/cases/:id/readings", "signed-in", "A case's readings, newest first", readingsResponse),
  e("POST", "/api/cases/:id/readings", "signed-in", "Add readings by hand", readingsAddedResponse, 201),
  e(
    "POST",
    "/api/cases/:id/readings/import/preview",
    "signed-in",
    "Propose how to read a logger's CSV file",
    importPreviewResponse,
    200,
    { multipart: true },
  ),
  e("POST", "/api/cases/:id/readings/import", "signed-in", "Import a logger's CSV file", importResultResponse, 201, {
    multipart: true,
  }),
  e(
    "GET",
    "/api/cases/:id/readings/imports/:importId/rejected.csv",
    "signed-in",
    "The rows an import rejected, with the reasons",
    { mediaType: "text/csv" },
  ),
  e("GET", "/api/cases/:id/readings/export", STAFF, "A case's readings as CSV or .xlsx (format=xlsx)", EXPORT_FILE),
  e("GET", "/api/cases/:id/evaluation", "signed-in", "The risk engine over a case's readings", evaluationResponse),
  e("POST", "/api/cases/:id/assessments", OFFICERS, "Record an HHSRS assessment", assessmentResponse, 201),
  e("GET", "/api/cases/:id/assessments", STAFF, "Every version of a case's HHSRS assessment", assessmentListResponse),
  e("POST", "/api/cases/:id/inspections", OFFICERS, "Record an inspection", inspectionRecordedResponse, 201),
  e("GET", "/api/cases/:id/inspections", STAFF, "A case's inspections", inspectionListResponse),
  e("POST", "/api/cases/:id/summary", OFFICERS, "Send the tenant the written summary", summarySentResponse, 201),
  e(
    "POST",
    "/api/cases/:id/messages",
    "signed-in",
    "Write on the case: the tenant to the landlord (with photos of the case), staff to the tenant or an internal note",
    messageSentResponse,
    201,
  ),
  e(
    "GET",
    "/api/cases/:id/messages",
    "signed-in",
    "The case's conversation, with unread count and (staff) read receipts",
    conversationResponse,
  ),
  e("POST", "/api/cases/:id/messages/read", "signed-in", "Mark the case's conversation read up to a message", readMarkResponse),
  e("GET", "/api/cases/:id/deadlines", STAFF, "A case's statutory clocks", deadlinesResponse),
  e("PUT", "/api/cases/:id/deadlines/:stage/missed-reason", OFFICERS, "Say why a missed deadline stage was missed", null, 204),
  e("GET", "/api/cases/:id/evidence-pack", STAFF, "The case's evidence pack (PDF), recorded on its timeline with its hash", {
    mediaType: EVIDENCE_PACK_MEDIA_TYPE,
  }),
  e(
    "GET",
    "/api/cases/:id/complaints",
    TENANT_OR_OFFICERS,
    "A case's formal complaints with their clocks",
    complaintListResponse,
  ),
  e("POST", "/api/cases/:id/complaints", TENANT_OR_OFFICERS, "Raise a formal complaint about the case", complaintResponse, 201),
  e(
    "POST",
    "/api/complaints/:id/acknowledge",
    OFFICERS,
    "Acknowledge the complaint's stage (sends the letter)",
    complaintResponse,
  ),
  e(
    "POST",
    "/api/complaints/:id/extend",
    OFFICERS,
    "Extend the stage's response once, with a reason the tenant is told",
    complaintResponse,
  ),
  e(
    "POST",
    "/api/complaints/:id/respond",
    OFFICERS,
    "Send the stage's response (at stage 2, the final response)",
    complaintResponse,
  ),
  e("POST", "/api/complaints/:id/escalate", TENANT_OR_OFFICERS, "Take the complaint to stage 2", complaintResponse),
  e("POST", "/api/complaints/:id/close", OFFICERS, "Close the complaint after its stage 1 response", complaintResponse),
  e("PUT", "/api/complaints/:id/remedy", OFFICERS, "Record the remedy: apology, putting right, compensation", complaintResponse),
  e("POST", "/api/cases/:id/work-orders", STAFF, "Raise a work order", workOrderResponse, 201),
  e("GET", "/api/cases/:id/work-orders", "signed-in", "A case's work orders", caseWorkOrdersResponse),
  e("GET", "/api/cases/:id/verification", "signed-in", "Readings before and after the works", verificationResponse),
  e("POST", "/api/cases/:id/verification", LEADS, "Decide whether the works fixed the damp", verificationResponse),

  e("GET", "/api/insight/dashboard", STAFF, "The compliance dashboard's figures for a period and estate", dashboardResponse),
  e(
    "GET",
    "/api/insight/what-works",
    STAFF,
    "Fixes judged effective by work and home type (groups of five or more)",
    whatWorksResponse,
  ),
  e("GET", "/api/insight/export", STAFF, "One dashboard table as CSV or .xlsx (table=…, format=xlsx)", EXPORT_FILE),
  e("GET", "/api/board-report", STAFF, "The month's board report as a PDF (month=YYYY-MM)", { mediaType: "application/pdf" }),
  e("GET", "/api/board-report/settings", ["admin"], "Who the monthly board report is e-mailed to", boardReportSettingsResponse),
  e(
    "PUT",
    "/api/board-report/settings",
    ["admin"],
    "Set who the monthly board report is e-mailed to",
    boardReportSettingsResponse,
  ),
  e("POST", "/api/board-report/send", ["admin"], "E-mail a month's board report to the list now", boardReportSentResponse),

  e("GET", "/api/work-orders", STAFF, "Work orders, filtered and sorted", workOrderPageResponse),
  e("GET", "/api/work-orders/export", STAFF, "The work orders as filtered, as CSV or .xlsx (format=xlsx)", EXPORT_FILE),
  e("PATCH", "/api/work-orders/:id", LEADS, "Schedule, complete or cancel a work order", workOrderResponse),
  e("POST", "/api/work-orders/:id/photos", LEADS, "Add photos taken after the works", photoUploadResponse, 201, {
    multipart: true,
  }),
  e("POST", "/api/work-orders/:id/booking-response", ["tenant"], "Confirm a visit or ask for another time", workOrderResponse),
  e("GET", "/api/contractors", STAFF, "The landlord's contractors", contractorListResponse),
  e("POST", "/api/contractors", LEADS, "Add a contractor", contractorResponse, 201),

  e(
    "GET",
    "/api/estate-locations",
    STAFF,
    "The landlord's estates and where each is (for outdoor weather)",
    estateLocationListResponse,
  ),
  e("PUT", "/api/estate-locations", ["admin"], "Set where one of the landlord's estates is", estateLocationResponse),
  e("GET", "/api/policy", STAFF, "The landlord's deadline timeframes", policyResponse),
  e("PUT", "/api/policy", ["admin"], "Set the landlord's deadline timeframes", policyResponse),
  e("DELETE", "/api/policy", ["admin"], "Go back to the default timeframes", policyResponse),
  e(
    "GET",
    "/api/policy/complaints",
    OFFICERS,
    "The landlord's complaint timeframes, escalation route and letters",
    complaintPolicyResponse,
  ),
  e(
    "PUT",
    "/api/policy/complaints",
    ["admin"],
    "Set the complaint timeframes, escalation route and letters",
    complaintPolicyResponse,
  ),
  e(
    "DELETE",
    "/api/policy/complaints",
    ["admin"],
    "Go back to the default complaint timeframes and letters",
    complaintPolicyResponse,
  ),

  e(
    "GET",
    "/api/policy/sensor-alerts",
    OFFICERS,
    "The landlord's sensor alert rules (our defaults where not set)",
    sensorAlertPolicyResponse,
  ),
  e("PUT", "/api/policy/sensor-alerts", ["admin"], "Set the landlord's sensor alert rules", sensorAlertPolicyResponse),
  e("DELETE", "/api/policy/sensor-alerts", ["admin"], "Go back to our default sensor alert rules", sensorAlertPolicyResponse),
  e(
    "GET",
    "/api/policy/heating-support",
    OFFICERS,
    "The landlord's help for tenants who find heating hard to afford",
    heatingSupportPolicyResponse,
  ),
  e("PUT", "/api/policy/heating-support", ["admin"], "Set the landlord's heating support route", heatingSupportPolicyResponse),
  e(
    "DELETE",
    "/api/policy/heating-support",
    ["admin"],
    "Clear the landlord's heating support route",
    heatingSupportPolicyResponse,
  ),
  e("GET", "/api/sensor-alerts", OFFICERS, "Homes whose sensors raised alerts and that have no open case", homesAtRiskResponse),
  e(
    "POST",
    "/api/sensor-alerts/:id/proactive-case",
    OFFICERS,
    "Open a case (channel sensor) from the alert's home and tell the tenant; the same case again on a second click",
    proactiveCaseResponse,
    201,
  ),
  e("POST", "/api/sensor-alerts/:id/dismiss", OFFICERS, "Dismiss the home's open alerts with a reason", alertsDismissedResponse),

  e("GET", "/api/photos/:id", "signed-in", "A photo (display size)", { mediaType: "image/jpeg" }),
  e("GET", "/api/photos/:id/thumbnail", "signed-in", "A photo's thumbnail", { mediaType: "image/jpeg" }),

  e("GET", "/api/properties", STAFF, "The landlord's homes", propertyPageResponse),
  e("GET", "/api/properties/export", STAFF, "The homes as filtered, as CSV or .xlsx (format=xlsx)", EXPORT_FILE),
  e("GET", "/api/properties/estates", STAFF, "The estates' names", estatesResponse),
  e("GET", "/api/properties/:id", STAFF, "A home and its rooms", propertyResponse),
  e("POST", "/api/properties", ["admin"], "Add a home (with its rooms)", propertyResponse, 201),
  e("PATCH", "/api/properties/:id", ["admin"], "Change a home's details", propertyResponse),
  e("POST", "/api/properties/:id/rooms", ["admin"], "Add a room to a home", roomResponse, 201),
  e("PATCH", "/api/properties/:id/rooms/:roomId", ["admin"], "Rename a room or change its kind", roomResponse),
  e("DELETE", "/api/properties/:id/rooms/:roomId", ["admin"], "Remove a room that has no readings", null, 204),
  e("GET", "/api/properties/:id/tenants", STAFF, "The home's tenants, current and past", homeTenantsResponse),
  e("GET", "/api/properties/:id/cases", STAFF, "The home's cases, open and closed", homeCasesResponse),
  e("GET", "/api/properties/:id/readings", STAFF, "Each room's latest readings", homeReadingsResponse),
  e("GET", "/api/properties/:id/outlook", STAFF, "The home's three-day condensation outlook", outlookResponse),
  e(
    "GET",
    "/api/tenancy-imports",
    ["admin"],
    "The latest tenancy imports, with their invitations' progress",
    tenancyImportListResponse,
  ),
  e(
    "POST",
    "/api/tenancy-imports/preview",
    ["admin"],
    "Propose how to read a tenancy file (CSV or .xlsx)",
    tenancyImportPreviewResponse,
    200,
    { multipart: true },
  ),
  e(
    "POST",
    "/api/tenancy-imports",
    ["admin"],
    "Import a tenancy file: tenant accounts and tenancies, upserted by tenancy reference; invitations queued",
    tenancyImportResultResponse,
    201,
    { multipart: true },
  ),
  e("GET", "/api/tenancy-imports/:id/report.csv", ["admin"], "A tenancy import's outcome for every row", {
    mediaType: "text/csv",
  }),
  e("POST", "/api/tenancy-imports/:id/invitations/pause", ["admin"], "Hold an import's queued invitations", null, 204),
  e("POST", "/api/tenancy-imports/:id/invitations/resume", ["admin"], "Release an import's held invitations again", null, 204),
  e("POST", "/api/tenancy-imports/:id/invitations/cancel", ["admin"], "Withdraw an import's invitations not sent yet", null, 204),
  e("GET", "/api/stock-imports", ["admin"], "The landlord's stock imports, newest first", stockImportListResponse),
  e(
    "POST",
    "/api/stock-imports/preview",
    ["admin"],
    "Propose which column of an asset register (CSV or .xlsx) feeds which field of a home",
    stockImportPreviewResponse,
    200,
    { multipart: true },
  ),
  e("POST", "/api/stock-imports", ["admin"], "Import an asset register: homes upserted by UPRN", stockImportResponse, 201, {
    multipart: true,
  }),
  e("GET", "/api/stock-imports/:id", ["admin"], "One stock import's counts", stockImportResponse),
  e("GET", "/api/stock-imports/:id/report.csv", ["admin"], "Every row's outcome of a stock import, with reasons", {
    mediaType: "text/csv",
  }),
  e("GET", "/api/users", ["admin"], "The landlord's accounts", userPageResponse),
  e("GET", "/api/users/export", ["admin"], "The accounts as filtered, as CSV or .xlsx (format=xlsx)", EXPORT_FILE),
  e("PATCH", "/api/users/:id", ["admin"], "Change a person's name or role, or disable or re-enable their account", userResponse),
  e("GET", "/api/users/:id/history", ["admin"], "Who changed a person's account, and when", userHistoryResponse),
  e("GET", "/api/staff", STAFF, "Who a case can be assigned to", staffListResponse),

  e(
    "GET",
    "/api/outbox",
    OFFICERS,
    "The landlord's e-mails and how each one's sending stands, newest first (?status=; officers see those about cases)",
    outboxPageResponse,
  ),
  e("POST", "/api/outbox/:id/resend", OFFICERS, "Send a sent or failed e-mail again", outboxItem, 202),
  e(
    "GET",
    "/api/text-outbox",
    OFFICERS,
    "The landlord's text messages to tenants and how each one's sending stands, newest first (?status=)",
    textOutboxPageResponse,
  ),
  e("PUT", "/api/me/language", ["tenant"], "The tenant chooses the language they read Dewline in (en or cy)", myLanguageResponse),
  e("GET", "/api/me/texts", ["tenant"], "The tenant's mobile number and whether they get texts", textChoiceResponse),
  e("PUT", "/api/me/texts", ["tenant"], "The tenant sets their mobile number and turns texts on or off", textChoiceResponse),
  e("GET", "/api/cases/:id/text-choice", STAFF, "Whether the case's tenant gets texts, and their number", textChoiceResponse),

  e("GET", "/api/integrations/api-keys", ["admin"], "The landlord's API keys (never their secrets)", apiKeyListResponse),
  e(
    "POST",
    "/api/integrations/api-keys",
    ["admin"],
    "Create an API key: its secret is in this reply only",
    apiKeyCreatedResponse,
    201,
  ),
  e("POST", "/api/integrations/api-keys/:keyId/revoke", ["admin"], "Revoke an API key, at once", apiKeyResponse),
  e(
    "GET",
    "/api/integrations/api-keys/audit",
    ["admin"],
    "The latest writes made with the landlord's API keys",
    apiKeyAuditResponse,
  ),
  e(
    "GET",
    "/api/integrations/admin-actions",
    ["admin"],
    "The latest changes admins made to API keys and webhook endpoints: who, what, when (?subject=api-key|webhook)",
    adminActionListResponse,
  ),

  // The integration API: `Authorization: Bearer <API key>`, no session, no CSRF token.
  e("GET", "/api/v1/homes", { apiKey: "homes:read" }, "The landlord's homes", propertyPageResponse),
  e("GET", "/api/v1/homes/:id", { apiKey: "homes:read" }, "A home and its rooms", propertyResponse),
  e(
    "PUT",
    "/api/v1/homes/by-uprn/:uprn",
    { apiKey: "homes:write" },
    "Add or update the home with this UPRN (201 when added, 200 when updated; rooms only when added)",
    propertyResponse,
  ),
  e("GET", "/api/v1/cases", { apiKey: "cases:read" }, "The landlord's cases (the queue's filters and sorts)", queuePageResponse),
  e("GET", "/api/v1/cases/:id", { apiKey: "cases:read" }, "A case", caseResponse),
  e("POST", "/api/v1/cases", { apiKey: "cases:write" }, "Log a report for a home, from another system", caseResponse, 201),
  e("POST", "/api/v1/cases/:id/readings", { apiKey: "cases:write" }, "Add readings to a case", readingsAddedResponse, 201),
  e("GET", "/api/v1/work-orders", { apiKey: "works:read" }, "Work orders, filtered and sorted", workOrderPageResponse),
  e("GET", "/api/webhooks", ["admin"], "The landlord's webhook endpoints (never their secrets)", webhookEndpointListResponse),
  e(
    "POST",
    "/api/webhooks",
    ["admin"],
    "Register an endpoint for case events; its signing secret is answered this once",
    webhookSecretResponse,
    201,
  ),
  e(
    "PATCH",
    "/api/webhooks/:id",
    ["admin"],
    "Change an endpoint's address, events or description, or switch it off or on",
    webhookEndpointResponse,
  ),
  e("DELETE", "/api/webhooks/:id", ["admin"], "Remove an endpoint with its deliveries", null, 204),
  e(
    "POST",
    "/api/webhooks/:id/secret",
    ["admin"],
    "Replace the signing secret (the old one also signs for 24 hours); answered this once",
    webhookSecretResponse,
  ),
  e("POST", "/api/webhooks/:id/test", ["admin"], "Send a test event to this endpoint", webhookDeliveryResponse, 202),
  e(
    "GET",
    "/api/webhooks/:id/deliveries",
    ["admin"],
    "The endpoint's deliveries, newest first, each with every attempt",
    webhookDeliveryPageResponse,
  ),
  e("POST", "/api/webhooks/:id/deliveries/:deliveryId/resend", ["admin"], "Send a delivery again", webhookDeliveryResponse, 202),

  // Sensor health: the maintenance lead and admins; officers may read.
  e("GET", "/api/sensor-health/summary", STAFF, "The landlord's sensors in use, counted by problem", sensorHealthSummaryResponse),
  e(
    "GET",
    "/api/sensor-health/devices",
    STAFF,
    "The sensors needing attention, by home (problem=…, page, pageSize)",
    sensorAttentionPageResponse,
  ),
  e("GET", "/api/sensor-health/:id", STAFF, "One sensor's health, from its readings now", sensorHealthResponse),
  // Sensors: the registry (staff read, leads change) and the devices' own ingest.
  e(
    "GET",
    "/api/sensors",
    STAFF,
    "The landlord's sensors (?propertyId=&state=active|revoked|removed&page=&pageSize=)",
    sensorPageResponse,
  ),
  e(
    "POST",
    "/api/sensors",
    LEADS,
    "Register a sensor in a room; its secret is in this reply only",
    sensorCredentialsResponse,
    201,
  ),
  e("GET", "/api/sensors/:id", STAFF, "A sensor", sensorResponse),
  e("PATCH", "/api/sensors/:id", LEADS, "Change a sensor (with the version seen: 409 when stale)", sensorResponse),
  e(
    "POST",
    "/api/sensors/:id/credentials",
    LEADS,
    "Issue a new secret (the old one stops working at once); in this reply only",
    sensorCredentialsResponse,
  ),
  e("POST", "/api/sensors/:id/revoke", LEADS, "Revoke the sensor's secret over HTTP and MQTT, at once", sensorResponse),
  e("POST", "/api/sensors/:id/remove", LEADS, "Mark the sensor taken out of the home on a day", sensorResponse),
  e(
    "GET",
    "/api/sensors/:id/readings",
    STAFF,
    "The sensor's readings in a window (?from=&to=), averaged when long",
    sensorReadingsResponse,
  ),
  e("GET", "/api/properties/:id/sensors", STAFF, "The sensors fitted in a home", sensorListResponse),
  e(
    "POST",
    "/api/sensor-ingest/readings",
    "public",
    "A sensor's readings as JSON, or as CSV (`text/csv`, a header line then a reading a line: the form for a backlog): `Authorization: Bearer <the sensor's secret>`, no session, no CSRF token",
    sensorIngestResponse,
  ),
];

/** The scope a route of the integration API needs (undefined for session routes). */
export const scopeOf = (e: Pick<Endpoint, "access">): ApiScope | undefined =>
  typeof e.access === "object" && "apiKey" in e.access ? e.access.apiKey : undefined;

const patternOf = (path: string) => new RegExp(`^${path.replace(/[.]/g, "\\.").replace(/:[A-Za-z]+/g, "[^/]+")}$`);
const compiled = ENDPOINTS.map((endpoint) => ({ endpoint, pattern: patternOf(endpoint.path) }));

/** The endpoint a concrete request goes to (`GET`, `/api/cases/42`); literal paths win over `:id`. */
export function endpointFor(method: string, path: string): Endpoint | undefined {
  const matches = compiled.filter((c) => c.endpoint.method === method.toUpperCase() && c.pattern.test(path));
  return matches.sort((a, b) => (a.endpoint.path.includes(":") ? 1 : 0) - (b.endpoint.path.includes(":") ? 1 : 0))[0]?.endpoint;
}

export const isJsonSchema = (r: Endpoint["response"]): r is z.ZodType => r !== null && !("mediaType" in r);
