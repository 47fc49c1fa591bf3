// Everything createApp() needs, built once from the Config. Tests build one against their own MariaDB.
import session from "express-session";
import MySQLStoreFactory from "express-mysql-session";
import type { DataSource } from "typeorm";
import type { Config } from "./config/env.js";
import { systemClock, type Clock } from "./lib/clock.js";
import { createDataSource, sessionStoreConnection } from "./db/create-data-source.js";
import { CachedSessionStore } from "./modules/auth/cached-session-store.js";
import { createLogger, type Logger } from "./lib/logger.js";
import { JobLeases } from "./lib/job-lease.js";
import { createMailer, type Mailer } from "./lib/mailer.js";
import { createObjectStore, type ObjectStore } from "./lib/storage.js";
import { AssessmentService } from "./modules/assessments/assessment.service.js";
import { InspectionService } from "./modules/inspections/inspection.service.js";
import { PolicyService } from "./modules/policy/policy.service.js";
import { AfterReply } from "./modules/auth/after-reply.js";
import { AuthService } from "./modules/auth/auth.service.js";
import { CaseService } from "./modules/cases/case.service.js";
import { DigestService } from "./modules/digest/digest.service.js";
import { EvaluationService } from "./modules/evaluation/evaluation.service.js";
import { HomeRecordService } from "./modules/homes/home-record.service.js";
import { PhotoService } from "./modules/photos/photo.service.js";
import { removeStaleIncoming } from "./modules/cases/upload-dir.js";
import { ReadingImportService } from "./modules/readings/reading-import.service.js";
import { ReadingService } from "./modules/readings/reading.service.js";
import { MailService } from "./modules/mail/mail.service.js";
import { createSmsProvider, type SmsProvider } from "./modules/sms/sms-provider.js";
import { SmsService } from "./modules/sms/sms.service.js";
import { OrganisationService } from "./modules/organisations/organisation.service.js";
import { PropertyService } from "./modules/properties/property.service.js";
import { HomeSearchService } from "./modules/properties/home-search.service.js";
import { StockImportService } from "./modules/properties/stock-import.service.js";
import { TenancyService } from "./modules/tenancies/tenancy.service.js";
import { QueueService } from "./modules/cases/case-queue.service.js";
import { TriageService } from "./modules/triage/triage.service.js";
import { InsightService } from "./modules/insight/insight.service.js";
import { BoardReportService } from "./modules/board-report/board-report.service.js";
import { UserService } from "./modules/users/user.service.js";
import { VerificationService } from "./modules/works/verification.service.js";
import { WorkOrderService } from "./modules/works/work-order.service.js";
import { ConversationService } from "./modules/conversation/conversation.service.js";
import { ComplaintService } from "./modules/complaints/complaint.service.js";
import { WorkerPool } from "./workers/pool.js";
import { AdminActionService } from "./modules/integrations/admin-action.service.js";
import { ApiKeyService } from "./modules/integrations/api-key.service.js";
import { WebhookService } from "./modules/webhooks/webhook.service.js";
import { IdempotencyService } from "./modules/idempotency/idempotency.service.js";
import { InvitationBatchService } from "./modules/auth/invitation-batch.service.js";
import { TenancyImportService } from "./modules/tenancy-import/tenancy-import.service.js";
import { EvidencePackService } from "./modules/evidence-pack/evidence-pack.service.js";
import { SensorHealthService } from "./modules/sensors/sensor-health.service.js";
import { WeatherService } from "./modules/weather/weather.service.js";
import { OutlookService } from "./modules/outlook/outlook.service.js";
import { MosquittoBrokerFiles } from "./modules/sensors/mqtt/broker-files.js";
import { SensorService } from "./modules/sensors/sensor.service.js";
import { SensorIngestService } from "./modules/sensors/sensor-ingest.service.js";
import { ReadingPartitionService } from "./modules/sensors/reading-partitions.service.js";
import { SensorWatchService } from "./modules/sensor-watch/sensor-watch.service.js";
import { HomeAdviceService } from "./modules/home-advice/home-advice.service.js";

export interface Services {
  policy: PolicyService;
  homeAdvice: HomeAdviceService;
  inspections: InspectionService;
  assessments: AssessmentService;
  auth: AuthService;
  cases: CaseService;
  digest: DigestService;
  evaluation: EvaluationService;
  homes: HomeRecordService;
  imports: ReadingImportService;
  photos: PhotoService;
  readings: ReadingService;
  mail: MailService;
  sms: SmsService;
  properties: PropertyService;
  /** Homes found by a piece of their address (the queue's search), and its backlog's catch-up job. */
  homeSearch: HomeSearchService;
  stock: StockImportService;
  queue: QueueService;
  triage: TriageService;
  insight: InsightService;
  boardReports: BoardReportService;
  works: WorkOrderService;
  verification: VerificationService;
  tenancies: TenancyService;
  users: UserService;
  conversation: ConversationService;
  complaints: ComplaintService;
  apiKeys: ApiKeyService;
  adminActions: AdminActionService;
  webhooks: WebhookService;
  idempotency: IdempotencyService;
  invitationBatches: InvitationBatchService;
  tenancyImports: TenancyImportService;
  evidencePacks: EvidencePackService;
  sensorHealth: SensorHealthService;
  weather: WeatherService;
  outlook: OutlookService;
  sensors: SensorService;
  sensorIngest: SensorIngestService;
  /** Keeps mosquitto's password file and ACL in step with the sensor registry (the sensors' BrokerCredentials). */
  mqttBroker: MosquittoBrokerFiles;
  sensorWatch: SensorWatchService;
  /** Leases in the database that let one app instance at a time run each background job. */
  jobLeases: JobLeases;
  /** The monthly partitions of sensor_readings: next months' added ahead, old months archived. */
  readingPartitions: ReadingPartitionService;
}

export interface AppContext {
  config: Config;
  /** "Now" for every service, route and background job (tests hand in their own). */
  clock: Clock;
  logger: Logger;
  dataSource: DataSource;
  mailer: Mailer;
  /** Worker threads for CPU-heavy work, so it never holds up other requests. */
  workers: WorkerPool;
  /** Where photos are kept: files under UPLOADS_DIR, or an S3-compatible bucket (STORAGE_DRIVER). */
  store: ObjectStore;
  sessionStore: session.Store;
  services: Services;
  close(): Promise<void>;
}

export function createServices(
  config: Config,
  dataSource: DataSource,
  mailer: Mailer,
  logger: Logger,
  clock: Clock = systemClock,
  // The pool for CPU-heavy work; services that need it take it from here (bench scripts get their own).
  workers: WorkerPool = new WorkerPool(config.workers),
  // The app's session store, when sessions are served (its cached copies go when a user's sessions end).
  sessionStore?: CachedSessionStore,
  // The photo store; scripts that build services on their own get the one the config names.
  store: ObjectStore = createObjectStore(config.storage),
  // The text-message service (tests hand in their own only to count calls; the SDK otherwise).
  smsProvider: SmsProvider = createSmsProvider(config.sms),
): Services {
  const { connectionMs, greetingMs, socketMs } = config.smtpTimeouts;
  const mail = new MailService(dataSource, mailer, logger, clock, {
    maxAttempts: config.mailRelay.maxAttempts,
    // A claim outlasts any one send with its SMTP timeouts, with room to spare.
    leaseMs: Math.max(5 * 60_000, 3 * (connectionMs + greetingMs + socketMs)),
  });
  const properties = new PropertyService(dataSource, logger);
  const weather = new WeatherService(dataSource, properties, config.weather, clock, logger);
  const stock = new StockImportService(dataSource, clock, logger);
  const homeSearch = new HomeSearchService(dataSource, logger);
  const tenancies = new TenancyService(dataSource, properties, clock);
  const users = new UserService(dataSource, clock, config.sessionCacheMs, sessionStore);
  const organisations = new OrganisationService(dataSource);
  const auth = new AuthService(
    dataSource,
    config,
    mail,
    properties,
    tenancies,
    users,
    organisations,
    clock,
    new AfterReply(logger),
  );
  const cases = new CaseService(dataSource, config, mail, properties, tenancies, users, organisations, clock);
  mail.useCaseTimeline(cases);
  mail.useRecipientLanguages(users);
  const sms = new SmsService(dataSource, smsProvider, logger, clock, {
    maxAttempts: config.sms.maxAttempts,
    // A claim outlasts any one send with its timeout, with room to spare.
    leaseMs: Math.max(2 * 60_000, 3 * config.sms.timeoutMs),
  });
  cases.useTexts(sms);
  sms.useRecipientLanguages(users);
  // Case events reach webhooks in their own transaction (the cases module knows only the listener interface).
  // Admins' changes to keys and endpoints are recorded by the integrations module, in each change's transaction.
  const adminActions = new AdminActionService(dataSource, users, clock);
  const webhooks = new WebhookService(dataSource, config, logger, clock, adminActions, {
    maxAttempts: config.webhooks.maxAttempts,
    timeoutMs: config.webhooks.timeoutMs,
    leaseMs: Math.max(60_000, 3 * config.webhooks.timeoutMs),
  });
  cases.useEventListener(webhooks);
  const photos = new PhotoService(dataSource, config, cases, workers, logger, clock, store);
  const readings = new ReadingService(dataSource, cases, clock, {
    evaluator: (input) => workers.run("evaluateRoomFromDb", input),
    logger,
    // The case's stored triage figures came from the older evaluation: they are due again.
    onReplaced: (m, caseId) => cases.markStale(m, { caseIds: [caseId] }),
    // Readings without an outdoor temperature take the weather service's hour.
    outdoorHours: (place, from, to) => weather.hoursAt(place.latitude, place.longitude, from, to),
  });
  const imports = new ReadingImportService(dataSource, cases, clock, readings);
  const evaluation = new EvaluationService(cases, readings, weather);
  const assessments = new AssessmentService(dataSource, cases);
  const policy = new PolicyService(dataSource, cases);
  cases.useEmergencyPhones(policy);
  const inspections = new InspectionService(dataSource, config, cases, mail, users, clock, policy);
  const conversation = new ConversationService(dataSource, config, cases, photos, mail, users, clock);
  const complaints = new ComplaintService(dataSource, config, cases, policy, mail, users, organisations, clock);
  const triage = new TriageService(cases, evaluation, policy, inspections, assessments, clock);
  // Rooms' live sensor figures and alerts; alerts on a case count in its triage figures.
  const sensorIngest = new SensorIngestService(dataSource, clock, logger);
  const sensorWatch = new SensorWatchService(dataSource, cases, properties, policy, sensorIngest, clock, logger);
  // Where a sensor has no surface probe, its wall or window is estimated from the weather's outdoor hour.
  sensorWatch.useWeather(weather);
  sensorWatch.useTriage(triage);
  triage.useSensorEvidence(sensorWatch);
  const queue = new QueueService(dataSource, triage, clock, homeSearch);
  const insight = new InsightService(dataSource, triage, clock, complaints);
  const boardReports = new BoardReportService(dataSource, insight, organisations, mail, inspections, clock, logger);
  const digest = new DigestService(dataSource, config, mail, logger, cases, users);
  const works = new WorkOrderService(dataSource, config, cases, policy, inspections, users, tenancies, clock);
  const verification = new VerificationService(dataSource, config, cases, readings, works, policy, logger, users, clock);
  const homes = new HomeRecordService(properties, tenancies, cases, readings, users);
  const homeAdvice = new HomeAdviceService(cases, policy);
  const outlook = new OutlookService(properties, tenancies, readings, weather, clock, logger);
  const apiKeys = new ApiKeyService(dataSource, users, clock, adminActions, logger);
  const invitationBatches = new InvitationBatchService(dataSource, auth, users, clock, config.invitationBatches);
  const tenancyImports = new TenancyImportService(dataSource, properties, tenancies, users, invitationBatches, clock);
  const evidencePacks = new EvidencePackService(
    dataSource,
    {
      cases,
      photos,
      readings,
      evaluation,
      assessments,
      inspections,
      policy,
      conversation,
      works,
      verification,
      users,
      organisations,
      complaints,
    },
    clock,
    logger,
  );
  // Sensors: the registry tells the broker (useBroker) and the ingest tells the room watch (addListener).
  const sensors = new SensorService(dataSource, properties, clock, logger);
  const { brokerDir, username, password } = config.mqtt;
  const jobLeases = new JobLeases(dataSource, { holder: config.instanceName }, logger);
  // Instances sharing a broker folder rewrite its files one at a time (under a lease).
  const mqttBroker = new MosquittoBrokerFiles(
    dataSource,
    brokerDir && password ? { dir: brokerDir, username, password } : null,
    logger,
    clock,
    jobLeases,
  );
  sensors.useBroker(mqttBroker);
  // The tenant's outlook takes each room's last day of sensor readings, where it has sensors.
  outlook.useSensorConditions(sensors);
  sensorIngest.addListener(sensorWatch);
  return {
    homeAdvice,
    jobLeases,
    mqttBroker,
    assessments,
    inspections,
    policy,
    auth,
    cases,
    evaluation,
    homes,
    imports,
    mail,
    sms,
    photos,
    properties,
    homeSearch,
    stock,
    queue,
    insight,
    boardReports,
    readings,
    tenancies,
    triage,
    users,
    digest,
    works,
    verification,
    conversation,
    complaints,
    apiKeys,
    adminActions,
    webhooks,
    invitationBatches,
    tenancyImports,
    evidencePacks,
    sensorHealth: new SensorHealthService(dataSource, clock),
    weather,
    outlook,
    sensors,
    sensorIngest,
    sensorWatch,
    idempotency: new IdempotencyService(dataSource, clock, logger),
    readingPartitions: new ReadingPartitionService(dataSource, clock, logger),
  };
}

/** Connects to MariaDB (and, when asked, runs pending migrations) and wires the services. */
export async function createAppContext(config: Config, options: { migrate?: boolean; clock?: Clock } = {}): Promise<AppContext> {
  const clock = options.clock ?? systemClock;
  // Every log line names the instance that wrote it.
  const logger = createLogger(config.logLevel).child({ instance: config.instanceName });
  const dataSource = createDataSource(config.db);
  await dataSource.initialize();
  if (options.migrate) await dataSource.runMigrations({ transaction: "each" });
  const mailer = createMailer(config);
  const workers = new WorkerPool(config.workers);
  // Uploads a crash left half-received (in this app's own incoming folder) go at start-up.
  await removeStaleIncoming(config.uploadsDir);
  const MySQLStore = MySQLStoreFactory(session);
  const store = new MySQLStore(
    {
      host: config.db.host,
      port: config.db.port,
      user: config.db.user,
      password: config.db.password,
      database: config.db.name,
      // The table comes from our migrations.
      createDatabaseTable: false,
      clearExpired: true,
      // No UPDATE per request: a signed-in session is saved when it changes, at most once a minute otherwise.
      disableTouch: true,
      checkExpirationInterval: 15 * 60_000,
      expiration: 12 * 3_600_000,
      // Through the app's own pool: the same timeouts, and a 503 while the database is down.
    },
    sessionStoreConnection(dataSource),
  );
  // Each session is read once per burst of requests (SESSION_CACHE_MS), not once per request.
  const sessionStore = new CachedSessionStore(store, config.sessionCacheMs);
  const objects = createObjectStore(config.storage);
  const services = createServices(config, dataSource, mailer, logger, clock, workers, sessionStore, objects);
  return {
    config,
    clock,
    logger,
    dataSource,
    mailer,
    workers,
    store: objects,
    sessionStore,
    services,
    async close() {
      // Links being e-mailed after a reply finish before the database closes.
      await services.auth.settled();
      // Let a send already running finish (its SMTP timeouts bound it) before the database closes.
      await services.mail.relay.stop();
      await services.sms.relay.stop();
      await services.webhooks.relay.stop();
      mailer.close();
      await workers.close();
      await store.close().catch(() => undefined);
      await objects.close();
      if (dataSource.isInitialized) await dataSource.destroy();
    },
  };
}
