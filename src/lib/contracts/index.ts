// The API contract: every response shape, as zod schemas shared by the server (its mappers are typed
// against them) and the client (its types are inferred from them; its test mocks are checked by them).
export * from "./common.js";
export * from "./health.js";
export * from "./auth.js";
export * from "./users.js";
export * from "./properties.js";
export * from "./psychrometrics.js";
export * from "./photos.js";
export * from "./cases.js";
export * from "./readings.js";
export * from "./evaluation.js";
export * from "./inspections.js";
export * from "./assessments.js";
export * from "./policy.js";
export * from "./triage.js";
export * from "./works.js";
export * from "./conversation.js";
export * from "./complaints.js";
export * from "./mail.js";
export * from "./integrations.js";
export * from "./webhooks.js";
export * from "./insight.js";
export * from "./board-report.js";
export * from "./endpoints.js";
export * from "./evidence-pack.js";
export * from "./tenancy-import.js";
export * from "./sensors.js";
