import { randomBytes } from "node:crypto";
import { existsSync } from "node:fs";
import path from "node:path";
import express, { type Express } from "express";
import session from "express-session";
import helmet from "helmet";
import { pinoHttp } from "pino-http";
import { csrfSync } from "csrf-sync";
import type { AppContext } from "./app-context.js";
import { apiNotFound, errorHandler } from "./middleware/error-handler.js";
import { RateLimits } from "./middleware/rate-limit.js";
import { requestId } from "./middleware/request-id.js";
import { DEFAULT_ANSWER_WAIT_MS, idempotency, idempotencyErrors } from "./middleware/idempotency.js";
import { callerOf } from "./modules/integrations/key-auth.js";
import { createApiDocsRouter } from "./modules/api-docs/api-docs.routes.js";
import { createAuthRouter } from "./modules/auth/auth.routes.js";
import { createPassport } from "./modules/auth/passport.js";
import { touchSessionsAtMostEveryMinute } from "./modules/auth/session.js";
import { createAssessmentsRouter } from "./modules/assessments/assessments.routes.js";
import { createInspectionsRouter } from "./modules/inspections/inspections.routes.js";
import { createPolicyRouter } from "./modules/policy/policy.routes.js";
import { createHomeAdviceRouter } from "./modules/home-advice/home-advice.routes.js";
import { createSensorHealthRouter } from "./modules/sensors/sensor-health.routes.js";
import { createSensorWatchRouter } from "./modules/sensor-watch/sensor-watch.routes.js";
import { createEstateLocationsRouter } from "./modules/weather/weather.routes.js";
import { createCasesRouter, createMyCasesRouter } from "./modules/cases/cases.routes.js";
import { createCasePhotosRouter, createPhotosRouter } from "./modules/photos/photos.routes.js";
import { createReadingsRouter } from "./modules/readings/readings.routes.js";
import { incomingDir } from "./modules/cases/upload-dir.js";
import { createEvaluationRouter } from "./modules/evaluation/evaluation.routes.js";
import { createHealthRouter } from "./modules/health/health.routes.js";
import { createHomeRecordRouter } from "./modules/homes/homes.routes.js";
import { createPropertiesRouter } from "./modules/properties/properties.routes.js";
import { createStockImportsRouter } from "./modules/properties/stock-import.routes.js";
import { openApiDocument } from "./modules/psychrometrics/openapi.js";
import { createPsychrometricsRouter } from "./modules/psychrometrics/psychrometrics.routes.js";
import { createMyHomeRouter } from "./modules/tenancies/tenancies.routes.js";
import { createHomeOutlookRouter, createMyOutlookRouter } from "./modules/outlook/outlook.routes.js";
import { createTriageRouter } from "./modules/triage/triage.routes.js";
import { createInsightRouter } from "./modules/insight/insight.routes.js";
import { createBoardReportRouter } from "./modules/board-report/board-report.routes.js";
import { createMyLanguageRouter, createStaffRouter, createUsersRouter } from "./modules/users/users.routes.js";
import { createTenancyImportRouter } from "./modules/tenancy-import/tenancy-import.routes.js";
import { requireAuth } from "./middleware/auth.js";
import { createCaseWorksRouter, createContractorsRouter, createWorkOrdersRouter } from "./modules/works/works.routes.js";
import { createConversationRouter, createMyUnreadRouter } from "./modules/conversation/conversation.routes.js";
import { createCaseComplaintsRouter, createComplaintsRouter } from "./modules/complaints/complaints.routes.js";
import { createOutboxRouter } from "./modules/mail/mail.routes.js";
import { createSmsRouter } from "./modules/sms/sms.routes.js";
import { createIntegrationApiRouter } from "./modules/integrations/integration-api.routes.js";
import { createAdminActionsRouter, createApiKeysRouter } from "./modules/integrations/integrations.routes.js";
import { createWebhooksRouter } from "./modules/webhooks/webhooks.routes.js";
import { createEvidencePackRouter } from "./modules/evidence-pack/evidence-pack.routes.js";
import { createHomeSensorsRouter, createSensorIngestRouter, createSensorsRouter } from "./modules/sensors/sensors.routes.js";

export interface AppOptions {
  /** True once the serving process has begun shutting down: readiness fails and connections are not kept alive. */
  isDraining?: () => boolean;
  /**
   * Prefixes this app's rate-limit keys (the counts live in the database). Every instance of a
   * deployment counts together under "", the default; with NODE_ENV=test each app gets a scope of its
   * own, so tests sharing the database never share counts, unless a test hands the same scope to two
   * apps meant to count together.
   */
  rateLimitScope?: string;
  /** How long a retry waits for the first request with its Idempotency-Key to store its answer. */
  idempotencyWaitMs?: number;
}

/** The whole HTTP app, without listening (tests drive it through supertest). */
export function createApp(
  ctx: AppContext,
  { isDraining = () => false, rateLimitScope, idempotencyWaitMs = DEFAULT_ANSWER_WAIT_MS }: AppOptions = {},
): Express {
  const { config, services, clock } = ctx;
  // Each createApp() makes its own limiters, counting in the shared table under its scope.
  const scope = rateLimitScope ?? (config.env === "test" ? `app-${randomBytes(6).toString("hex")}:` : "");
  const rateLimits = new RateLimits(ctx.dataSource, ctx.logger, scope);
  const app = express();
  app.disable("x-powered-by");
  app.set("trust proxy", config.trustProxy);
  app.set("query parser", "simple");

  app.use(requestId());
  app.use((_req, res, next) => {
    // While draining, each response closes its connection, so keep-alive clients reconnect elsewhere.
    if (isDraining()) res.setHeader("Connection", "close");
    next();
  });
  app.use(
    helmet({
      crossOriginEmbedderPolicy: false,
      // helmet's defaults, with `blob:` added to img-src only: the photo picker previews the chosen
      // files through object URLs before they are sent. Nothing else is loosened.
      contentSecurityPolicy: { directives: { "img-src": ["'self'", "data:", "blob:"] } },
    }),
  );
  app.use(pinoHttp({ logger: ctx.logger, autoLogging: { ignore: (req) => req.url?.startsWith("/api/health") ?? false } }));

  // Idempotency-Key on POSTs: a session's keys are its user's, an API key's are its own.
  const idempotentForUsers = idempotency({
    service: services.idempotency,
    logger: ctx.logger,
    waitMs: idempotencyWaitMs,
    scopeOf: (req) => (req.user ? { kind: "user", id: req.user.id, organisationId: req.user.organisationId } : null),
  });
  const idempotentForKeys = idempotency({
    service: services.idempotency,
    logger: ctx.logger,
    waitMs: idempotencyWaitMs,
    scopeOf: (req) => {
      const { key, actor } = callerOf(req);
      return { kind: "api_key", id: key.id, organisationId: actor.organisationId };
    },
  });

  const api = express.Router();
  // Health and the public calculator API come before sessions: they must answer even when the
  // session store (MariaDB) does not, and they change nothing, so they need no CSRF token.
  api.use("/health", createHealthRouter({ dataSource: ctx.dataSource, isDraining }));
  api.use(
    "/psychrometrics",
    createPsychrometricsRouter({
      workers: ctx.workers,
      clock,
      limits: config.calculator,
      session: { store: ctx.sessionStore, secret: config.sessionSecret, cookieName: "dewline.sid" },
      rateLimits,
    }),
  );
  // The public risk-engine API's own document stays public; the whole API's is for staff (below).
  api.get("/psychrometrics/openapi.json", (_req, res) => {
    res.json(openApiDocument(config.appUrl));
  });

  // The integration API: API keys only, before the session middleware, so a session cookie is never
  // read there and no CSRF token is asked for; session routes, in turn, never read an API key.
  api.use(
    "/v1",
    createIntegrationApiRouter({
      keys: services.apiKeys,
      properties: services.properties,
      cases: services.cases,
      queue: services.queue,
      readings: services.readings,
      works: services.works,
      evaluation: services.evaluation,
      clock,
      logger: ctx.logger,
      requestsPerMinute: config.apiKeys.requestsPerMinute,
      rateLimits,
      idempotency: idempotentForKeys,
    }),
  );

  // Sensors post readings with their own key: like /v1, before sessions and CSRF (and with its own body limit).
  api.use("/sensor-ingest", createSensorIngestRouter({ ingest: services.sensorIngest }));

  api.use(express.json({ limit: "2mb" }));

  api.use(
    session({
      name: "dewline.sid",
      secret: config.sessionSecret,
      store: ctx.sessionStore,
      resave: false,
      saveUninitialized: false,
      // Saved only when it changes; a signed-in session is extended at most once a minute (below).
      rolling: false,
      cookie: {
        httpOnly: true,
        sameSite: "lax",
        // Secure whenever the request came over HTTPS (behind a proxy, set TRUST_PROXY to its hop count).
        secure: "auto",
        maxAge: 12 * 3_600_000,
      },
    }),
  );
  const passport = createPassport(services.auth);
  api.use(passport.session());
  api.use(touchSessionsAtMostEveryMinute(clock));

  const { csrfSynchronisedProtection, generateToken } = csrfSync({
    getTokenFromRequest: (req) => req.get("x-csrf-token"),
    errorConfig: { statusCode: 403, code: "csrf_invalid", message: "Invalid or missing CSRF token." },
  });
  api.use(csrfSynchronisedProtection);
  // After sign-in and CSRF (the key is the user's), before every router; sensors' ingest is not
  // behind it: a reading's key is (sensor, time), so a batch sent twice is stored once anyway.
  api.use(idempotentForUsers);

  api.use("/auth", createAuthRouter({ config, auth: services.auth, clock, csrfToken: generateToken, rateLimits }));
  api.use("/me", createMyHomeRouter({ tenancies: services.tenancies }));
  api.use("/me", createMyOutlookRouter({ outlook: services.outlook }));
  api.use("/me", createMyUnreadRouter({ conversation: services.conversation }));
  api.use("/me", createMyLanguageRouter({ users: services.users }));
  api.use("/me/cases", createMyCasesRouter({ cases: services.cases, photos: services.photos }));
  api.use(
    "/cases",
    requireAuth,
    createTriageRouter({ cases: services.cases, queue: services.queue, triage: services.triage, clock }),
  );
  api.use("/cases", createCasesRouter({ cases: services.cases, figures: services.triage }));
  api.use("/cases", createCasePhotosRouter({ cases: services.cases, photos: services.photos }));
  api.use(
    "/cases",
    createReadingsRouter({
      cases: services.cases,
      readings: services.readings,
      imports: services.imports,
      evaluation: services.evaluation,
      incomingDir: incomingDir(config.uploadsDir),
      clock,
    }),
  );
  api.use("/cases", createEvaluationRouter({ evaluation: services.evaluation }));
  api.use("/cases", createHomeAdviceRouter({ advice: services.homeAdvice }));
  api.use("/cases", createAssessmentsRouter({ assessments: services.assessments }));
  api.use(
    "/cases",
    createInspectionsRouter({
      cases: services.cases,
      inspections: services.inspections,
      policy: services.policy,
      users: services.users,
      clock,
    }),
  );
  api.use("/cases", createConversationRouter({ conversation: services.conversation }));
  api.use("/cases", requireAuth, createEvidencePackRouter({ packs: services.evidencePacks }));
  api.use("/cases", createCaseComplaintsRouter({ complaints: services.complaints }));
  api.use("/complaints", createComplaintsRouter({ complaints: services.complaints }));
  api.use(
    "/cases",
    requireAuth,
    createCaseWorksRouter({ works: services.works, verification: services.verification, photos: services.photos }),
  );
  api.use(
    "/work-orders",
    requireAuth,
    createWorkOrdersRouter({ works: services.works, verification: services.verification, photos: services.photos, clock }),
  );
  api.use("/insight", requireAuth, createInsightRouter({ insight: services.insight, clock }));
  api.use("/board-report", requireAuth, createBoardReportRouter({ reports: services.boardReports }));
  api.use("/contractors", requireAuth, createContractorsRouter({ works: services.works }));
  api.use("/policy", createPolicyRouter({ policy: services.policy }));
  api.use("/sensor-alerts", requireAuth, createSensorWatchRouter({ sensorWatch: services.sensorWatch }));
  api.use("/estate-locations", createEstateLocationsRouter({ weather: services.weather }));
  api.use("/photos", createPhotosRouter({ photos: services.photos }));
  api.use("/properties", createPropertiesRouter({ properties: services.properties, roomReadings: services.readings, clock }));
  api.use("/properties", createHomeRecordRouter({ homes: services.homes }));
  api.use("/properties", createHomeOutlookRouter({ outlook: services.outlook }));
  api.use("/properties", createHomeSensorsRouter({ sensors: services.sensors }));
  api.use("/sensors", createSensorsRouter({ sensors: services.sensors, clock }));
  api.use("/stock-imports", createStockImportsRouter({ stock: services.stock, incomingDir: incomingDir(config.uploadsDir) }));
  api.use("/users", createUsersRouter({ users: services.users, clock }));
  api.use("/staff", requireAuth, createStaffRouter({ users: services.users }));
  api.use("/outbox", createOutboxRouter({ mail: services.mail }));
  api.use(
    createSmsRouter({
      sms: services.sms,
      caseTenant: async (actor, caseId) => (await services.cases.getForActor(actor, caseId)).tenantUserId,
    }),
  );
  api.use("/integrations/api-keys", createApiKeysRouter({ keys: services.apiKeys }));
  api.use("/integrations/admin-actions", createAdminActionsRouter({ adminActions: services.adminActions }));
  api.use("/webhooks", createWebhooksRouter({ webhooks: services.webhooks }));
  api.use(
    "/tenancy-imports",
    createTenancyImportRouter({
      imports: services.tenancyImports,
      batches: services.invitationBatches,
      incomingDir: incomingDir(config.uploadsDir),
    }),
  );
  api.use("/sensor-health", createSensorHealthRouter({ sensorHealth: services.sensorHealth }));
  api.use(createApiDocsRouter({ appUrl: config.appUrl }));
  api.use(apiNotFound);

  app.use("/api", api);

  const indexHtml = path.join(config.clientDistDir, "index.html");
  if (existsSync(indexHtml)) {
    app.use(express.static(config.clientDistDir, { index: false, maxAge: "1h" }));
    // Every other GET is a client route; the client shows its own 404 page for unknown paths.
    app.get("/{*splat}", (_req, res) => res.sendFile(indexHtml));
  } else {
    app.get("/{*splat}", (_req, res) => {
      res
        .status(503)
        .type("text")
        .send("The Dewline client has not been built yet: run `npm run build` (npm start does this for you).");
    });
  }

  app.use(idempotencyErrors);
  app.use(errorHandler(config.env === "development"));
  return app;
}
