// Every TanStack Query key of the client, one factory per resource, from general to specific
// (`caseKeys.all` → `lists()` → `list(filters)` → `details()` → `detail(id)` → `events(id)` …), so
// invalidating a prefix refreshes everything under it. A key holds every variable its query function
// reads. Features build their `queryOptions` from these and nobody writes a key as a literal; the keys
// live here, not in a feature, because several features read the same resource (a case's photos, the
// lists of work orders) and features do not import each other.

export const authKeys = {
  all: ["auth"] as const,
  me: () => [...authKeys.all, "me"] as const,
  invitations: () => [...authKeys.all, "invitation"] as const,
  invitation: (token: string) => [...authKeys.invitations(), token] as const,
};

/**
 * Cases and everything about one case. Invalidating `detail(id)` refreshes the case and its parts;
 * invalidating `lists()` refreshes the tenant's list and the officers' queue.
 */
export const caseKeys = {
  all: ["cases"] as const,
  lists: () => [...caseKeys.all, "list"] as const,
  mine: () => [...caseKeys.lists(), "mine"] as const,
  /** The officers' queue: filters, sort and page as the URL has them. */
  queues: () => [...caseKeys.lists(), "queue"] as const,
  queue: <P extends object>(params: P) => [...caseKeys.queues(), params] as const,
  details: () => [...caseKeys.all, "detail"] as const,
  detail: (id: number) => [...caseKeys.details(), id] as const,
  events: (id: number) => [...caseKeys.detail(id), "events"] as const,
  /** The case's photos, the work orders' after-photos among them. */
  photos: (id: number) => [...caseKeys.detail(id), "photos"] as const,
  readings: (id: number, roomId?: number) => [...caseKeys.detail(id), "readings", { roomId: roomId ?? null }] as const,
  evaluation: (id: number) => [...caseKeys.detail(id), "evaluation"] as const,
  triage: (id: number) => [...caseKeys.detail(id), "triage"] as const,
  deadlines: (id: number) => [...caseKeys.detail(id), "deadlines"] as const,
  inspections: (id: number) => [...caseKeys.detail(id), "inspections"] as const,
  assessments: (id: number) => [...caseKeys.detail(id), "assessments"] as const,
  related: (id: number) => [...caseKeys.detail(id), "related"] as const,
  workOrders: (id: number) => [...caseKeys.detail(id), "work-orders"] as const,
  verification: (id: number) => [...caseKeys.detail(id), "verification"] as const,
  complaints: (id: number) => [...caseKeys.detail(id), "complaints"] as const,
};

/** Work orders across cases (the /works table and week board); a case's own orders are `caseKeys.workOrders(id)`. */
export const workOrderKeys = {
  all: ["work-orders"] as const,
  lists: () => [...workOrderKeys.all, "list"] as const,
  list: <P extends object>(params: P) => [...workOrderKeys.lists(), params] as const,
  weeks: () => [...workOrderKeys.all, "week"] as const,
  week: <W extends object>(week: W) => [...workOrderKeys.weeks(), week] as const,
};

/** The landlord's deadline timeframes (GET /api/policy): one key for every screen that reads them. */
export const policyKeys = {
  all: ["policy"] as const,
  current: () => [...policyKeys.all, "current"] as const,
  /** The complaint timeframes, escalation route and letters (GET /api/policy/complaints). */
  complaints: () => [...policyKeys.all, "complaints"] as const,
  /** The sensor alert rules (GET /api/policy/sensor-alerts). */
  sensorAlerts: () => [...policyKeys.all, "sensor-alerts"] as const,
  /** The help offered to tenants who find heating hard to afford (GET /api/policy/heating-support). */
  heatingSupport: () => [...policyKeys.all, "heating-support"] as const,
};

/** Homes at risk from their sensors (GET /api/sensor-alerts). */
export const sensorAlertKeys = {
  all: ["sensor-alerts"] as const,
  lists: () => [...sensorAlertKeys.all, "list"] as const,
  list: (sort: string, dir: string) => [...sensorAlertKeys.lists(), { sort, dir }] as const,
};

/** The landlord's active staff (GET /api/staff). */
export const staffKeys = {
  all: ["staff"] as const,
  list: () => [...staffKeys.all, "list"] as const,
};

/** The landlord's contractors (GET /api/contractors). */
export const contractorKeys = {
  all: ["contractors"] as const,
  list: () => [...contractorKeys.all, "list"] as const,
};

/** Homes (properties) and their estates. */
export const propertyKeys = {
  all: ["properties"] as const,
  lists: () => [...propertyKeys.all, "list"] as const,
  list: <F extends object>(filters: F) => [...propertyKeys.lists(), filters] as const,
  estates: () => [...propertyKeys.all, "estates"] as const,
  details: () => [...propertyKeys.all, "detail"] as const,
  detail: (id: number) => [...propertyKeys.details(), id] as const,
  tenants: (id: number) => [...propertyKeys.detail(id), "tenants"] as const,
  cases: (id: number) => [...propertyKeys.detail(id), "cases"] as const,
  readings: (id: number) => [...propertyKeys.detail(id), "readings"] as const,
};

/** The tenant's own home. */
export const myHomeKeys = {
  all: ["my-home"] as const,
  current: () => [...myHomeKeys.all, "current"] as const,
  outlook: () => [...myHomeKeys.all, "outlook"] as const,
};

/** The landlord's outbox (GET /api/outbox): e-mails and how each one's sending stands. */
export const outboxKeys = {
  all: ["outbox"] as const,
  lists: () => [...outboxKeys.all, "list"] as const,
  list: <F extends object>(filters: F) => [...outboxKeys.lists(), filters] as const,
};

/** The landlord's webhook endpoints (GET /api/webhooks) and each one's deliveries. */
export const webhookKeys = {
  all: ["webhooks"] as const,
  lists: () => [...webhookKeys.all, "list"] as const,
  deliveries: (endpointId: number, page: number) => [...webhookKeys.all, "deliveries", endpointId, page] as const,
};

/** The landlord's tenancy imports and their queued invitations (GET /api/tenancy-imports). */
export const tenancyImportKeys = {
  all: ["tenancy-imports"] as const,
  lists: () => [...tenancyImportKeys.all, "list"] as const,
  preview: () => [...tenancyImportKeys.all, "preview"] as const,
  create: () => [...tenancyImportKeys.all, "create"] as const,
};

export const userKeys = {
  all: ["users"] as const,
  lists: () => [...userKeys.all, "list"] as const,
  list: <F extends object>(filters: F) => [...userKeys.lists(), filters] as const,
  history: (id: number) => [...userKeys.all, "history", id] as const,
};

/** Mutation keys of the tenant's report (its reads are the case's, under `caseKeys`). */
export const reportKeys = {
  all: ["report"] as const,
  create: () => [...reportKeys.all, "create"] as const,
  photos: (caseId: number) => [...reportKeys.all, caseId, "photos"] as const,
  readings: (caseId: number) => [...reportKeys.all, caseId, "readings"] as const,
  importPreview: (caseId: number) => [...reportKeys.all, caseId, "import-preview"] as const,
  import: (caseId: number) => [...reportKeys.all, caseId, "import"] as const,
};

/**
 * The conversation on a case (features/conversation): the thread sits under the case's detail key, so
 * refreshing a case refreshes it; the unread list is the signed-in person's own.
 */
export const conversationKeys = {
  all: ["conversation"] as const,
  thread: (caseId: number) => [...caseKeys.detail(caseId), "messages"] as const,
  unread: () => [...conversationKeys.all, "unread"] as const,
  send: (caseId: number) => [...conversationKeys.all, caseId, "send"] as const,
  read: (caseId: number) => [...conversationKeys.all, caseId, "read"] as const,
};

/** The landlord's API keys and the writes made with them (features/integrations). */
export const apiKeyKeys = {
  all: ["api-keys"] as const,
  list: () => [...apiKeyKeys.all, "list"] as const,
  audit: () => [...apiKeyKeys.all, "audit"] as const,
};

/** What admins changed in API keys and webhook endpoints (features/integrations): all, or about one kind of subject. */
export const adminActionKeys = {
  all: ["admin-actions"] as const,
  list: (subject: "api-key" | "webhook" | "all") => [...adminActionKeys.all, "list", subject] as const,
};

/** The stock import (features/stock-import): the landlord's imports, and the two uploads. */
export const stockImportKeys = {
  all: ["stock-imports"] as const,
  lists: () => [...stockImportKeys.all, "list"] as const,
  preview: () => [...stockImportKeys.all, "preview"] as const,
  run: () => [...stockImportKeys.all, "run"] as const,
};

/** The monthly board report's list of addresses (admins). */
export const boardReportKeys = {
  all: ["board-report"] as const,
  settings: () => [...boardReportKeys.all, "settings"] as const,
};

/** The compliance dashboard and "what works": period and estate as the URL has them. */
export const insightKeys = {
  all: ["insight"] as const,
  dashboard: <P extends object>(filters: P) => [...insightKeys.all, "dashboard", filters] as const,
  whatWorks: <P extends object>(filters: P) => [...insightKeys.all, "what-works", filters] as const,
};
