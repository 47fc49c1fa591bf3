// The request side of every route: ENDPOINTS (src/lib/contracts/endpoints.ts) lists method, path, who
// may call it and the success reply; this adds the zod schemas the routes validate their input with.
// tests/server/api-docs.test.ts walks the mounted routers and fails on a route missing from either list.
import type { z } from "zod";
import { ENDPOINTS, type Endpoint } from "../../../src/lib/contracts/endpoints.js";
import { caseReportSchema, staffCaseSchema } from "../../../src/lib/schemas/case-report.js";
import { homePatchSchema, homeSchema, roomPatchSchema, roomSchema } from "../../../src/lib/schemas/homes.js";
import { evaluatePointSchema, evaluateSeriesSchema } from "../../../src/lib/schemas/psychrometrics.js";
import { assessmentSchema } from "../assessments/assessments.schemas.js";
import {
  acceptInvitationSchema,
  invitationSchema,
  loginSchema,
  passwordResetRequestSchema,
  passwordResetSchema,
} from "../auth/auth.schemas.js";
import { casePatchSchema, worseSchema } from "../cases/cases.schemas.js";
import { inspectionSchema, summarySchema } from "../inspections/inspections.schemas.js";
import { markReadSchema, staffMessageSchema, tenantMessageSchema } from "../../../src/lib/schemas/messages.js";
import { complaintPolicySchema, deadlinePolicySchema, sensorAlertPolicySchema } from "../policy/policy.schemas.js";
import { alertListQuery, dismissAlertSchema } from "../sensor-watch/sensor-watch.schemas.js";
import {
  acknowledgeComplaintSchema,
  closeComplaintSchema,
  complaintRemedySchema,
  escalateComplaintSchema,
  extendComplaintSchema,
  raiseComplaintSchema,
  respondComplaintSchema,
  staffEscalateComplaintSchema,
} from "../complaints/complaints.schemas.js";
import { propertyExportQuerySchema, propertyListQuerySchema, stockImportFieldsSchema } from "../properties/properties.schemas.js";
import {
  importFieldsSchema,
  manualReadingsSchema,
  readingsExportQuerySchema,
  readingsQuerySchema,
} from "../readings/readings.schemas.js";
import { bulkPreviewSchema, bulkUpdateSchema, queueExportQuerySchema, queueQuerySchema } from "../cases/case-queue.schemas.js";
import { userExportQuerySchema, userListQuerySchema, userUpdateSchema } from "../users/users.schemas.js";
import { apiKeyCreateSchema } from "../../../src/lib/schemas/api-keys.js";
import { adminActionListQuerySchema, homeUpsertSchema } from "../integrations/integrations.schemas.js";
import { tenancyImportFieldsSchema } from "../tenancy-import/tenancy-import.schemas.js";
import { insightExportQuerySchema, insightQuerySchema } from "../insight/insight.schemas.js";
import {
  bookingResponseSchema,
  contractorSchema,
  verificationOutcomeSchema,
  workOrderCreateSchema,
  workOrderExportQuerySchema,
  workOrderListQuerySchema,
  workOrderPatchSchema,
} from "../works/works.schemas.js";
import { webhookEndpointPatchSchema, webhookEndpointSchema } from "../../../src/lib/schemas/webhooks.js";
import { webhookDeliveryListQuerySchema } from "../webhooks/webhooks.schemas.js";

export interface RequestSchemas {
  body?: z.ZodType | readonly z.ZodType[];
  query?: z.ZodType;
}

/** "METHOD /api/path" → what the route parses from the request. */
export const REQUESTS: Readonly<Record<string, RequestSchemas>> = {
  "POST /api/psychrometrics/evaluate": { body: evaluatePointSchema },
  "POST /api/psychrometrics/series": { body: evaluateSeriesSchema },
  "POST /api/auth/login": { body: loginSchema },
  "POST /api/auth/invitations": { body: invitationSchema },
  "POST /api/auth/invitations/accept": { body: acceptInvitationSchema },
  "POST /api/auth/password-reset": { body: passwordResetRequestSchema },
  "POST /api/auth/password-reset/confirm": { body: passwordResetSchema },
  "GET /api/cases": { query: queueQuerySchema },
  "POST /api/cases/bulk": { body: bulkUpdateSchema },
  "POST /api/cases/bulk/preview": { body: bulkPreviewSchema },
  "POST /api/cases": { body: [caseReportSchema, staffCaseSchema] },
  "PATCH /api/cases/:id": { body: casePatchSchema },
  "POST /api/cases/:id/worse": { body: worseSchema },
  "GET /api/cases/:id/readings": { query: readingsQuerySchema },
  "POST /api/cases/:id/readings": { body: manualReadingsSchema },
  "POST /api/cases/:id/readings/import": { body: importFieldsSchema },
  "POST /api/cases/:id/assessments": { body: assessmentSchema },
  "POST /api/cases/:id/inspections": { body: inspectionSchema },
  "POST /api/cases/:id/summary": { body: summarySchema },
  "POST /api/cases/:id/messages": { body: [staffMessageSchema, tenantMessageSchema] },
  "POST /api/cases/:id/messages/read": { body: markReadSchema },
  "POST /api/cases/:id/work-orders": { body: workOrderCreateSchema },
  "POST /api/cases/:id/verification": { body: verificationOutcomeSchema },
  "GET /api/work-orders": { query: workOrderListQuerySchema },
  "PATCH /api/work-orders/:id": { body: workOrderPatchSchema },
  "POST /api/work-orders/:id/booking-response": { body: bookingResponseSchema },
  "POST /api/contractors": { body: contractorSchema },
  "PUT /api/policy": { body: deadlinePolicySchema },
  "PUT /api/policy/complaints": { body: complaintPolicySchema },
  "PUT /api/policy/sensor-alerts": { body: sensorAlertPolicySchema },
  "GET /api/sensor-alerts": { query: alertListQuery },
  "POST /api/sensor-alerts/:id/dismiss": { body: dismissAlertSchema },
  "POST /api/cases/:id/complaints": { body: raiseComplaintSchema },
  "POST /api/complaints/:id/acknowledge": { body: acknowledgeComplaintSchema },
  "POST /api/complaints/:id/extend": { body: extendComplaintSchema },
  "POST /api/complaints/:id/respond": { body: respondComplaintSchema },
  "POST /api/complaints/:id/escalate": { body: [escalateComplaintSchema, staffEscalateComplaintSchema] },
  "POST /api/complaints/:id/close": { body: closeComplaintSchema },
  "PUT /api/complaints/:id/remedy": { body: complaintRemedySchema },
  "GET /api/properties": { query: propertyListQuerySchema },
  "POST /api/properties": { body: homeSchema },
  "PATCH /api/properties/:id": { body: homePatchSchema },
  "POST /api/properties/:id/rooms": { body: roomSchema },
  "PATCH /api/properties/:id/rooms/:roomId": { body: roomPatchSchema },
  "POST /api/stock-imports": { body: stockImportFieldsSchema },
  "GET /api/users": { query: userListQuerySchema },
  "PATCH /api/users/:id": { body: userUpdateSchema },
  "POST /api/integrations/api-keys": { body: apiKeyCreateSchema },
  "GET /api/integrations/admin-actions": { query: adminActionListQuerySchema },
  "GET /api/v1/homes": { query: propertyListQuerySchema },
  "PUT /api/v1/homes/by-uprn/:uprn": { body: homeUpsertSchema },
  "GET /api/v1/cases": { query: queueQuerySchema },
  "POST /api/v1/cases": { body: staffCaseSchema },
  "POST /api/v1/cases/:id/readings": { body: manualReadingsSchema },
  "GET /api/v1/work-orders": { query: workOrderListQuerySchema },
  "POST /api/webhooks": { body: webhookEndpointSchema },
  "PATCH /api/webhooks/:id": { body: webhookEndpointPatchSchema },
  "GET /api/webhooks/:id/deliveries": { query: webhookDeliveryListQuerySchema },
  "POST /api/tenancy-imports": { body: tenancyImportFieldsSchema },
  "GET /api/cases/export": { query: queueExportQuerySchema },
  "GET /api/insight/dashboard": { query: insightQuerySchema },
  "GET /api/insight/what-works": { query: insightQuerySchema },
  "GET /api/insight/export": { query: insightExportQuerySchema },
  "GET /api/cases/:id/readings/export": { query: readingsExportQuerySchema },
  "GET /api/work-orders/export": { query: workOrderExportQuerySchema },
  "GET /api/properties/export": { query: propertyExportQuerySchema },
  "GET /api/users/export": { query: userExportQuerySchema },
};

export const keyOf = (e: Pick<Endpoint, "method" | "path">) => `${e.method} ${e.path}`;
export const ROUTES: readonly (Endpoint & RequestSchemas)[] = ENDPOINTS.map((e) => ({ ...e, ...REQUESTS[keyOf(e)] }));
