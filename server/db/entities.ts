import { CaseEvent } from "../modules/cases/case-event.entity.js";
import { CaseMilestone } from "../modules/cases/case-milestone.entity.js";
import { BoardReportSend, BoardReportSettings } from "../modules/board-report/board-report.entity.js";
import { MissedDeadlineReason } from "../modules/inspections/missed-deadline-reason.entity.js";
import { Case } from "../modules/cases/case.entity.js";
import { WorkOrderBooking } from "../modules/works/booking.entity.js";
import { Contractor } from "../modules/works/contractor.entity.js";
import { OperativeSlot } from "../modules/works/operative-slot.entity.js";
import { WorkOrder } from "../modules/works/work-order.entity.js";
import { Photo } from "../modules/photos/photo.entity.js";
import { PhotoUploadUsage } from "../modules/photos/photo-upload-usage.entity.js";
import { ApiKey } from "../modules/integrations/api-key.entity.js";
import { ApiKeyAuditEntry } from "../modules/integrations/api-key-audit.entity.js";
import { AdminActionEntry } from "../modules/integrations/admin-action.entity.js";
import { ReadingImport } from "../modules/readings/reading-import.entity.js";
import { Reading } from "../modules/readings/reading.entity.js";
import { RoomEvaluation } from "../modules/readings/room-evaluation.entity.js";
import { HhsrsAssessmentRecord } from "../modules/assessments/assessment.entity.js";
import { Inspection } from "../modules/inspections/inspection.entity.js";
import { WrittenSummary } from "../modules/inspections/written-summary.entity.js";
import { DeadlinePolicyRecord } from "../modules/policy/deadline-policy.entity.js";
import { ComplaintLetterTemplateRecord, ComplaintPolicyRecord } from "../modules/policy/complaint-policy.entity.js";
import { Complaint } from "../modules/complaints/complaint.entity.js";
import { DeadlineDigest } from "../modules/digest/deadline-digest.entity.js";
import { UserToken } from "../modules/auth/user-token.entity.js";
import { SignInThrottle } from "../modules/auth/sign-in-throttle.entity.js";
import { UserAuditEntry } from "../modules/users/user-audit.entity.js";
import { OutboxEmail } from "../modules/mail/outbox-email.entity.js";
import { OutboxSms } from "../modules/sms/outbox-sms.entity.js";
import { SmsPreference } from "../modules/sms/sms-preference.entity.js";
import { Organisation } from "../modules/organisations/organisation.entity.js";
import { Property } from "../modules/properties/property.entity.js";
import { Room } from "../modules/properties/room.entity.js";
import { StockImport } from "../modules/properties/stock-import.entity.js";
import { Tenancy } from "../modules/tenancies/tenancy.entity.js";
import { User } from "../modules/users/user.entity.js";
import { InvitationBatch, PendingInvitation } from "../modules/auth/invitation-batch.entity.js";
import { TenancyImport } from "../modules/tenancy-import/tenancy-import.entity.js";
import { CaseReadMark } from "../modules/conversation/case-read-mark.entity.js";
import { WebhookAttempt } from "../modules/webhooks/webhook-attempt.entity.js";
import { WebhookDelivery } from "../modules/webhooks/webhook-delivery.entity.js";
import { WebhookEndpoint } from "../modules/webhooks/webhook-endpoint.entity.js";
import { WebhookEvent } from "../modules/webhooks/webhook-event.entity.js";
import { Sensor } from "../modules/sensors/sensor.entity.js";
import { SensorReading } from "../modules/sensors/sensor-reading.entity.js";
import { SensorHealthRecord } from "../modules/sensors/sensor-health.entity.js";
import { SensorAlert } from "../modules/sensor-watch/sensor-alert.entity.js";
import { SensorRoomFigures } from "../modules/sensor-watch/sensor-room-figures.entity.js";
import { SensorAlertPolicyRecord } from "../modules/policy/sensor-alert-policy.entity.js";
import { HeatingSupportPolicyRecord } from "../modules/policy/heating-support-policy.entity.js";
import { EstateLocation } from "../modules/weather/estate-location.entity.js";
import { WeatherHour } from "../modules/weather/weather-hour.entity.js";
import { IdempotencyKey } from "../modules/idempotency/idempotency-key.entity.js";

export const entities = [
  Organisation,
  User,
  UserToken,
  SignInThrottle,
  UserAuditEntry,
  Property,
  Room,
  StockImport,
  Tenancy,
  OutboxEmail,
  OutboxSms,
  SmsPreference,
  Case,
  CaseEvent,
  CaseMilestone,
  BoardReportSettings,
  BoardReportSend,
  MissedDeadlineReason,
  Photo,
  Reading,
  ReadingImport,
  RoomEvaluation,
  HhsrsAssessmentRecord,
  Inspection,
  WrittenSummary,
  DeadlinePolicyRecord,
  ComplaintPolicyRecord,
  ComplaintLetterTemplateRecord,
  Complaint,
  DeadlineDigest,
  WorkOrder,
  WorkOrderBooking,
  OperativeSlot,
  Contractor,
  CaseReadMark,
  PhotoUploadUsage,
  ApiKey,
  ApiKeyAuditEntry,
  AdminActionEntry,
  Sensor,
  SensorReading,
  SensorHealthRecord,
  SensorRoomFigures,
  SensorAlert,
  SensorAlertPolicyRecord,
  HeatingSupportPolicyRecord,
  WebhookEndpoint,
  WebhookEvent,
  WebhookDelivery,
  WebhookAttempt,
  InvitationBatch,
  PendingInvitation,
  TenancyImport,
  EstateLocation,
  WeatherHour,
  IdempotencyKey,
];
