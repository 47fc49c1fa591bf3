// The only reader of process.env. Everything else imports the checked Config.
import { existsSync } from "node:fs";
import { isIP } from "node:net";
import { availableParallelism, hostname } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { z } from "zod";

/** The folder holding package.json: the same whether this file runs from server/ (tsx) or dist-server/server/ (compiled). */
function findProjectRoot(from: string): string {
  for (let dir = from; ; dir = path.dirname(dir)) {
    if (existsSync(path.join(dir, "package.json"))) return dir;
    if (path.dirname(dir) === dir) return path.resolve(from, "../..");
  }
}
const projectRoot = findProjectRoot(path.dirname(fileURLToPath(import.meta.url)));

const port = z.coerce.number().int().min(1).max(65535);

/**
 * TRUST_PROXY in Express's "trust proxy" forms that name what to trust: a hop count, or proxy
 * addresses/CIDR ranges (and Express's names loopback, linklocal, uniquelocal), comma-separated.
 * Never `true` (trust every hop): then anyone picks their own address with X-Forwarded-For.
 */
function parseTrustProxy(text: string | undefined): { value: false | number | string[] } | { error: string } {
  const t = (text ?? "").trim();
  if (t === "" || t === "false" || t === "0") return { value: false };
  if (t === "true") {
    return {
      error:
        "TRUST_PROXY=true would trust every hop, so any client could choose its own address with X-Forwarded-For. Set the hop count instead (1 behind one proxy) or the proxies' addresses or CIDR ranges, comma-separated.",
    };
  }
  if (/^\d+$/.test(t)) return { value: Number(t) };
  const items = t.split(",").map((i) => i.trim());
  const valid = (item: string) => {
    if (["loopback", "linklocal", "uniquelocal"].includes(item)) return true;
    const [address = "", prefix, extra] = item.split("/");
    const family = isIP(address);
    if (!family || extra !== undefined) return false;
    return prefix === undefined || (/^\d{1,3}$/.test(prefix) && Number(prefix) <= (family === 4 ? 32 : 128));
  };
  const bad = items.filter((i) => !valid(i));
  if (bad.length) {
    return {
      error: `TRUST_PROXY must be a hop count or proxy addresses/CIDR ranges, comma-separated; not understood: ${bad.join(", ")}`,
    };
  }
  return { value: items };
}

const schema = z
  .object({
    NODE_ENV: z.enum(["development", "test", "production"]).default("development"),
    INSTANCE_NAME: z
      .string()
      .regex(/^[A-Za-z0-9._:-]{1,100}$/, "INSTANCE_NAME: 1–100 letters, digits, dots, colons, underscores or hyphens")
      .optional(),
    HOST: z.string().default("127.0.0.1"),
    PORT: port.default(3000),
    APP_URL: z.url().optional(),
    DB_HOST: z.string().default("127.0.0.1"),
    DB_PORT: port.default(13306),
    DB_NAME: z
      .string()
      .regex(/^[A-Za-z0-9_]+$/)
      .default("dewline"),
    DB_USER: z
      .string()
      .regex(/^[A-Za-z0-9_]+$/)
      .default("dewline"),
    DB_PASSWORD: z.string().min(1).optional(),
    SESSION_SECRET: z.string().min(32).optional(),
    SMTP_HOST: z.string().default("127.0.0.1"),
    SMTP_PORT: port.default(1025),
    MAIL_FROM: z.string().default("Dewline <no-reply@dewline.example>"),
    MAIL_WEB_PORT: port.default(1080),
    SMTP_CONNECTION_TIMEOUT_MS: z.coerce.number().int().min(1).default(5_000),
    SMTP_GREETING_TIMEOUT_MS: z.coerce.number().int().min(1).default(5_000),
    SMTP_SOCKET_TIMEOUT_MS: z.coerce.number().int().min(1).default(10_000),
    MAIL_RELAY_INTERVAL_MS: z.coerce.number().int().min(100).default(15_000),
    MAIL_MAX_ATTEMPTS: z.coerce.number().int().min(1).default(20),
    // Text messages: the hosted service's base URL (default: the local stand-in npm start runs), an API
    // key `name-<service id>-<secret>` (the default is a well-formed development key the stand-in accepts)
    // and the one template, whose body is ((body)), so the wording lives in server/modules/sms.
    SMS_BASE_URL: z.url("SMS_BASE_URL must be a URL such as http://127.0.0.1:18970").default("http://127.0.0.1:18970"),
    SMS_API_KEY: z
      .string()
      .regex(/-[0-9a-f-]{36}-[0-9a-f-]{36}$/, "SMS_API_KEY must end with the service id and the secret (two UUIDs)")
      .default("dewline_local-6f1c2a4e-8d3b-4c5a-9e7f-1a2b3c4d5e6f-0b9a8c7d-6e5f-4a3b-8c2d-1e0f9a8b7c6d"),
    SMS_TEMPLATE_ID: z.uuid("SMS_TEMPLATE_ID must be a template's UUID").default("5d6a7b8c-9e0f-4a1b-8c2d-3e4f5a6b7c8d"),
    SMS_RELAY_INTERVAL_MS: z.coerce.number().int().min(100).default(15_000),
    SMS_MAX_ATTEMPTS: z.coerce.number().int().min(1).default(12),
    SMS_TIMEOUT_MS: z.coerce.number().int().min(100).max(60_000).default(10_000),
    WEBHOOK_RELAY_INTERVAL_MS: z.coerce.number().int().min(100).default(5_000),
    WEBHOOK_TIMEOUT_MS: z.coerce.number().int().min(100).max(60_000).default(10_000),
    WEBHOOK_MAX_ATTEMPTS: z.coerce.number().int().min(1).max(50).default(12),
    INVITATIONS_PER_BATCH: z.coerce.number().int().min(1).max(10_000).default(200),
    INVITATION_BATCH_INTERVAL_MS: z.coerce.number().int().min(1_000).default(60_000),
    DEMO_PASSWORD: z.string().min(8, "DEMO_PASSWORD needs at least 8 characters").default("dewline-demo"),
    UPLOADS_DIR: z.string().default(path.join(projectRoot, "uploads")),
    BACKUP_DIR: z.string().default(path.join(projectRoot, "backups")),
    CLIENT_DIST_DIR: z.string().default(path.join(projectRoot, "dist")),
    LOG_LEVEL: z.enum(["fatal", "error", "warn", "info", "debug", "trace", "silent"]).optional(),
    SESSION_CACHE_MS: z.coerce.number().int().min(0).max(60_000).default(1000),
    LOGIN_MAX_FAILURES: z.coerce.number().int().min(1).default(5),
    LOGIN_WINDOW_MINUTES: z.coerce.number().int().min(1).default(15),
    TRUST_PROXY: z.string().optional(),
    SHUTDOWN_DELAY_MS: z.coerce.number().int().min(0).default(0),
    SHUTDOWN_TIMEOUT_MS: z.coerce.number().int().min(0).default(10_000),
    WORKER_THREADS: z.coerce.number().int().min(1).max(64).optional(),
    WORKER_QUEUE: z.coerce.number().int().min(1).default(64),
    WORKER_MEMORY_MB: z.coerce.number().int().min(32).default(512),
    UPLOAD_MEGAPIXELS_PER_HOUR: z.coerce.number().positive().default(2000),
    UPLOAD_MB_PER_HOUR: z.coerce.number().positive().default(600),
    UPLOAD_MEGAPIXELS_PER_REQUEST: z.coerce.number().positive().default(300),
    CALCULATOR_READINGS_PER_MINUTE: z.coerce.number().int().min(1).default(200_000),
    CALCULATOR_MAX_ANONYMOUS_READINGS: z.coerce.number().int().min(1).default(10_000),
    API_KEY_REQUESTS_PER_MINUTE: z.coerce.number().int().min(1).default(600),
    DB_CONNECT_TIMEOUT_MS: z.coerce.number().int().min(100).default(1000),
    DB_STALL_CHECK_MS: z.coerce.number().int().min(50).default(400),
    DB_QUERY_TIMEOUT_MS: z.coerce.number().int().min(1000).default(30_000),
    DB_ACQUIRE_TIMEOUT_MS: z.coerce.number().int().min(100).default(10_000),
    // Galera only (wsrep_sync_wait's bitmask, 0–15): unset on a single MariaDB, where nothing is set.
    DB_SYNC_WAIT: z.coerce.number().int().min(0).max(15).optional(),
    WEATHER_URL: z.url().default("http://127.0.0.1:18080/v1/forecast"),
    WEATHER_TIMEOUT_MS: z.coerce.number().int().min(100).max(60_000).default(5_000),
    WEATHER_FORECAST_MAX_AGE_MINUTES: z.coerce.number().int().min(1).default(180),
    MQTT_PORT: port.default(11883),
    MQTT_URL: z
      .string()
      .regex(/^mqtts?:\/\//, "MQTT_URL must start with mqtt:// or mqtts://")
      .optional(),
    MQTT_USERNAME: z.string().min(1).default("dewline-app"),
    MQTT_PASSWORD: z.string().min(1).optional(),
    MQTT_CLIENT_ID: z.string().min(1).max(64).optional(),
    MQTT_BROKER_DIR: z.string().min(1).optional(),
    MQTT_BATCH_MS: z.coerce.number().int().min(0).max(10_000).default(250),
    MQTT_BATCH_READINGS: z.coerce.number().int().min(1).max(50_000).default(2000),
    MQTT_IDENTITY_CACHE_MS: z.coerce.number().int().min(0).max(60_000).default(5000),
    STORAGE_DRIVER: z.enum(["disk", "s3"], "STORAGE_DRIVER must be disk or s3").default("disk"),
    S3_ENDPOINT: z.url("S3_ENDPOINT must be a URL such as http://127.0.0.1:18900").optional(),
    S3_REGION: z.string().min(1).default("us-east-1"),
    S3_BUCKET: z
      .string()
      .regex(/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/, "S3_BUCKET must be 3–63 lower-case letters, digits, dots or hyphens")
      .optional(),
    S3_ACCESS_KEY_ID: z.string().min(1).optional(),
    S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
    S3_FORCE_PATH_STYLE: z
      .enum(["true", "false", "1", "0"], "S3_FORCE_PATH_STYLE must be true or false")
      .default("true")
      .transform((v) => v === "true" || v === "1"),
    SENSOR_READINGS_KEEP_MONTHS: z.coerce.number().int().min(2).max(1200).default(24),
  })
  .superRefine((env, ctx) => {
    const trust = parseTrustProxy(env.TRUST_PROXY);
    if ("error" in trust) ctx.addIssue({ code: "custom", path: ["TRUST_PROXY"], message: trust.error });
    if (env.MQTT_BROKER_DIR && !env.MQTT_PASSWORD) {
      ctx.addIssue({
        code: "custom",
        path: ["MQTT_PASSWORD"],
        message: "MQTT_PASSWORD must be set with MQTT_BROKER_DIR (the app's own line in the broker's password file)",
      });
    }
    if (env.STORAGE_DRIVER === "s3") {
      for (const key of ["S3_BUCKET", "S3_ACCESS_KEY_ID", "S3_SECRET_ACCESS_KEY"] as const) {
        if (!env[key]) ctx.addIssue({ code: "custom", path: [key], message: `${key} must be set with STORAGE_DRIVER=s3` });
      }
    }
    if (env.NODE_ENV === "production") {
      for (const key of ["DB_PASSWORD", "SESSION_SECRET", "APP_URL"] as const) {
        if (!env[key]) ctx.addIssue({ code: "custom", path: [key], message: `${key} must be set in production` });
      }
    }
  });

export interface Config {
  env: "development" | "test" | "production";
  /**
   * This app instance's name (INSTANCE_NAME, else host name and process id): the holder of the job
   * leases it takes, in its log lines, and the default MQTT client id. Set it to something stable
   * per instance (the container's or host's name) when several instances run.
   */
  instanceName: string;
  host: string;
  port: number;
  appUrl: string;
  db: {
    host: string;
    port: number;
    name: string;
    user: string;
    password: string;
    timeouts?: DbTimeouts;
    /** `wsrep_sync_wait` set on every pooled connection (Galera; undefined: left as the server has it). */
    syncWait?: number;
  };
  sessionSecret: string;
  /** How long a session and its account, once read, are reused by this process (0: read on every request). */
  sessionCacheMs: number;
  smtp: { host: string; port: number; from: string; webPort: number };
  /** Limits on each SMTP call, so a silent mail server never holds a send (and the relay) for long. */
  smtpTimeouts: { connectionMs: number; greetingMs: number; socketMs: number };
  /** The outbox relay: how often it looks for due e-mails, and how many attempts before it gives up. */
  mailRelay: { intervalMs: number; maxAttempts: number };
  /** Text messages: where the SDK sends them, with which key and template; the relay's timer and attempts. */
  sms: { baseUrl: string; apiKey: string; templateId: string; intervalMs: number; maxAttempts: number; timeoutMs: number };
  /** Webhook deliveries: how often the relay looks for due ones, each HTTP call's timeout, tries before "failed". */
  webhooks: { intervalMs: number; timeoutMs: number; maxAttempts: number };
  /** Queued invitations (tenancy imports): at most `perBatch` released every `intervalMs`. */
  invitationBatches: { perBatch: number; intervalMs: number };
  demoPassword: string;
  /** The photo store's folder with the disk driver, and (whatever the driver) the home of .incoming uploads. */
  uploadsDir: string;
  /** Where photos are kept (server/lib/storage.ts): files under uploadsDir, or an S3-compatible bucket. */
  storage: StorageConfig;
  /** Where `npm run backup` writes its timestamped folders. */
  backupsDir: string;
  clientDistDir: string;
  logLevel: string;
  login: { maxFailures: number; windowMs: number };
  /** Express's "trust proxy": false, a hop count or proxy addresses/CIDR ranges; never true. */
  trustProxy: false | number | string[];
  /**
   * On SIGTERM/SIGINT: keep accepting for `delayMs` while readiness already fails (so a load balancer
   * stops sending traffic), then wait at most `timeoutMs` for requests and background jobs to finish.
   */
  shutdown: { delayMs: number; timeoutMs: number };
  /** The worker pool for CPU-heavy work (server/workers): threads, queue length, heap cap per thread. */
  workers: { threads: number; maxQueue: number; memoryMb: number };
  /** Photo uploads: each user's budget over the last hour, and the most pixels one request may ask to decode. */
  uploads: { pixelsPerHour: number; bytesPerHour: number; pixelsPerRequest: number };
  /** The public series calculator: readings each address may have evaluated a minute; most readings per anonymous request. */
  calculator: { readingsPerMinute: number; maxAnonymousReadings: number };
  /** The integration API (/api/v1): requests each API key may make a minute. */
  apiKeys: { requestsPerMinute: number };
  /**
   * The weather forecast API (hourly outdoor air for homes without an outdoor reading): its endpoint
   * (npm start runs a local fake there), each call's timeout, and how old a stored forecast may get.
   */
  weather: { url: string; timeoutMs: number; forecastMaxAgeMs: number };
  mqtt: MqttConfig;
  /**
   * Sensor readings kept in the database: whole months older than `keepMonths` before the current one go
   * to archive files (`npm run readings:archive`). 24 by default: common practice, no source.
   */
  sensorReadings: { keepMonths: number };
}

export interface S3StoreOptions {
  /** The service's URL (a local stand-in, or a hosted S3-compatible service); omitted: AWS itself. */
  endpoint?: string;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  /** Bucket in the path (http://host/bucket/key) rather than the host name: what most S3-compatible servers want. */
  forcePathStyle: boolean;
}

export type StorageConfig = { driver: "disk"; root: string } | ({ driver: "s3" } & S3StoreOptions);

/** Sensor readings over MQTT (server/modules/sensors/mqtt/). */
export interface MqttConfig {
  /** The port npm start and npm run dev run their mosquitto on (127.0.0.1). */
  port: number;
  url: string;
  username: string;
  /** The app's MQTT password; without it the app does not subscribe (readings over HTTP still work). */
  password: string | null;
  /** The app's client id (MQTT_CLIENT_ID, else "dewline-" and the instance's name): one per instance. */
  clientId: string;
  /**
   * Whether the broker keeps this client's session (and the readings queued for it) over a restart:
   * only when the client id outlives the restart (MQTT_CLIENT_ID or INSTANCE_NAME set). A session
   * named after a process id would be left behind at each restart, still taking its share of the
   * shared subscription's readings, which nobody would ever collect.
   */
  persistentSession: boolean;
  /** The broker's folder (password file, ACL, pid file) this app keeps in step with the registry; null: none. */
  brokerDir: string | null;
  /** Readings are gathered per sensor for at most `batchMs` or `batchReadings` before one ingest. */
  batchMs: number;
  batchReadings: number;
  /** How long a topic's sensor, once looked up, is trusted (a revoked sensor is refused after this at most). */
  identityCacheMs: number;
}

/**
 * How long to wait on the database (server/db/create-data-source.ts). A query still unanswered after
 * `stallCheckMs` makes a probe ask whether the server answers at all: if not, the query fails at once
 * (503); if so, it is only slow and may run to `queryMs`. `connectMs` bounds a new connection and the
 * probe; `acquireMs` bounds the wait for a free pooled connection.
 */
export interface DbTimeouts {
  connectMs: number;
  stallCheckMs: number;
  queryMs: number;
  acquireMs: number;
}

// Development-only defaults, so a fresh clone runs without a .env file. Production must set its own.
const DEV_DB_PASSWORD = "dewline-local-only";
const DEV_SESSION_SECRET = "dewline-development-session-secret-not-for-production";

export function loadConfig(source: NodeJS.ProcessEnv = process.env): Config {
  const parsed = schema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join("\n")}`);
  }
  const e = parsed.data;
  const instanceName = e.INSTANCE_NAME ?? `${hostname()}-${process.pid}`.replace(/[^A-Za-z0-9._:-]/g, "-").slice(0, 100);
  return {
    env: e.NODE_ENV,
    instanceName,
    host: e.HOST,
    port: e.PORT,
    appUrl: (e.APP_URL ?? `http://127.0.0.1:${e.PORT}`).replace(/\/$/, ""),
    db: {
      host: e.DB_HOST,
      port: e.DB_PORT,
      name: e.DB_NAME,
      user: e.DB_USER,
      password: e.DB_PASSWORD ?? DEV_DB_PASSWORD,
      timeouts: {
        connectMs: e.DB_CONNECT_TIMEOUT_MS,
        stallCheckMs: e.DB_STALL_CHECK_MS,
        queryMs: e.DB_QUERY_TIMEOUT_MS,
        acquireMs: e.DB_ACQUIRE_TIMEOUT_MS,
      },
      syncWait: e.DB_SYNC_WAIT,
    },
    sessionSecret: e.SESSION_SECRET ?? DEV_SESSION_SECRET,
    sessionCacheMs: e.SESSION_CACHE_MS,
    smtp: { host: e.SMTP_HOST, port: e.SMTP_PORT, from: e.MAIL_FROM, webPort: e.MAIL_WEB_PORT },
    smtpTimeouts: {
      connectionMs: e.SMTP_CONNECTION_TIMEOUT_MS,
      greetingMs: e.SMTP_GREETING_TIMEOUT_MS,
      socketMs: e.SMTP_SOCKET_TIMEOUT_MS,
    },
    mailRelay: { intervalMs: e.MAIL_RELAY_INTERVAL_MS, maxAttempts: e.MAIL_MAX_ATTEMPTS },
    sms: {
      baseUrl: e.SMS_BASE_URL.replace(/\/$/, ""),
      apiKey: e.SMS_API_KEY,
      templateId: e.SMS_TEMPLATE_ID,
      intervalMs: e.SMS_RELAY_INTERVAL_MS,
      maxAttempts: e.SMS_MAX_ATTEMPTS,
      timeoutMs: e.SMS_TIMEOUT_MS,
    },
    webhooks: {
      intervalMs: e.WEBHOOK_RELAY_INTERVAL_MS,
      timeoutMs: e.WEBHOOK_TIMEOUT_MS,
      maxAttempts: e.WEBHOOK_MAX_ATTEMPTS,
    },
    invitationBatches: { perBatch: e.INVITATIONS_PER_BATCH, intervalMs: e.INVITATION_BATCH_INTERVAL_MS },
    demoPassword: e.DEMO_PASSWORD,
    uploadsDir: e.UPLOADS_DIR,
    storage:
      e.STORAGE_DRIVER === "s3"
        ? {
            driver: "s3",
            endpoint: e.S3_ENDPOINT,
            region: e.S3_REGION,
            // Present: the check above refuses s3 without them.
            bucket: e.S3_BUCKET!,
            accessKeyId: e.S3_ACCESS_KEY_ID!,
            secretAccessKey: e.S3_SECRET_ACCESS_KEY!,
            forcePathStyle: e.S3_FORCE_PATH_STYLE,
          }
        : { driver: "disk", root: e.UPLOADS_DIR },
    backupsDir: e.BACKUP_DIR,
    clientDistDir: e.CLIENT_DIST_DIR,
    logLevel: e.LOG_LEVEL ?? (e.NODE_ENV === "test" ? "silent" : "info"),
    login: { maxFailures: e.LOGIN_MAX_FAILURES, windowMs: e.LOGIN_WINDOW_MINUTES * 60_000 },
    trustProxy: (parseTrustProxy(e.TRUST_PROXY) as { value: false | number | string[] }).value,
    shutdown: { delayMs: e.SHUTDOWN_DELAY_MS, timeoutMs: e.SHUTDOWN_TIMEOUT_MS },
    workers: {
      // One thread per core, leaving one for the request thread; at least one.
      threads: e.WORKER_THREADS ?? Math.max(1, Math.min(4, availableParallelism() - 1)),
      maxQueue: e.WORKER_QUEUE,
      memoryMb: e.WORKER_MEMORY_MB,
    },
    uploads: {
      pixelsPerHour: Math.round(e.UPLOAD_MEGAPIXELS_PER_HOUR * 1_000_000),
      bytesPerHour: Math.round(e.UPLOAD_MB_PER_HOUR * 1024 * 1024),
      pixelsPerRequest: Math.round(e.UPLOAD_MEGAPIXELS_PER_REQUEST * 1_000_000),
    },
    calculator: {
      readingsPerMinute: e.CALCULATOR_READINGS_PER_MINUTE,
      maxAnonymousReadings: e.CALCULATOR_MAX_ANONYMOUS_READINGS,
    },
    apiKeys: { requestsPerMinute: e.API_KEY_REQUESTS_PER_MINUTE },
    weather: {
      url: e.WEATHER_URL,
      timeoutMs: e.WEATHER_TIMEOUT_MS,
      forecastMaxAgeMs: e.WEATHER_FORECAST_MAX_AGE_MINUTES * 60_000,
    },
    mqtt: {
      port: e.MQTT_PORT,
      url: e.MQTT_URL ?? `mqtt://127.0.0.1:${e.MQTT_PORT}`,
      username: e.MQTT_USERNAME,
      password: e.MQTT_PASSWORD ?? null,
      // The name's end (the process id, by default) is kept when it is too long for a client id.
      clientId: e.MQTT_CLIENT_ID ?? `dewline-${instanceName.slice(-56)}`,
      persistentSession: e.MQTT_CLIENT_ID !== undefined || e.INSTANCE_NAME !== undefined,
      brokerDir: e.MQTT_BROKER_DIR ?? null,
      batchMs: e.MQTT_BATCH_MS,
      batchReadings: e.MQTT_BATCH_READINGS,
      identityCacheMs: e.MQTT_IDENTITY_CACHE_MS,
    },
    sensorReadings: { keepMonths: e.SENSOR_READINGS_KEEP_MONTHS },
  };
}
