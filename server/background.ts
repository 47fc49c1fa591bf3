// The server's background work, started by whichever entry serves the app (server.ts, npm start),
// never by createApp, so tests' apps run no timers.
import type { AppContext } from "./app-context.js";
import { startDigestScheduler } from "./modules/digest/digest.scheduler.js";
import { startTriageSweeper } from "./modules/triage/triage.sweeper.js";
import { startMonitoringReminders } from "./modules/works/monitoring.scheduler.js";
import { startAppointmentTextReminders } from "./modules/works/appointment-texts.scheduler.js";
import { startInvitationBatches } from "./modules/auth/invitation-batch.ticker.js";
import { startBoardReports } from "./modules/board-report/board-report.scheduler.js";
import { startSensorHealthSweeper } from "./modules/sensors/sensor-health.sweeper.js";
import { startMqttIngest } from "./modules/sensors/mqtt/mqtt-ingest.js";
import { startSensorWatchSweep } from "./modules/sensor-watch/sensor-watch.sweeper.js";
import { leasedJob } from "./lib/repeating-job.js";
import { purgeExpiredRateLimitHits } from "./middleware/rate-limit-store.js";
import { startReadingPartitionUpkeep } from "./modules/sensors/reading-partitions.job.js";
import { startHomeSearchCatchUp } from "./modules/properties/home-search.job.js";

/**
 * Starts the outbox relay, the text relay and the appointment text reminders, the webhook relay, the triage sweep, the deadline digest, the end-of-monitoring
 * reminders, the release of queued invitations (tenancy imports), the monthly board reports, readings
 * over MQTT (the subscriber, and the broker's files brought in step with the registry), the purge of
 * ended rate-limit counts, next months' partitions of the sensor readings and the search pieces of
 * imported homes;
 * returns a function that stops them and resolves once any job already running has finished (so
 * shutdown can close the database after it, not under it).
 */
export function startBackgroundJobs(
  ctx: Pick<AppContext, "services" | "logger" | "clock" | "config" | "dataSource">,
): () => Promise<void> {
  // Every timed job runs on one instance at a time, under its lease in `job_leases`; the two relays
  // claim their rows one by one instead (server/lib/leased-queue.ts), so every instance helps send.
  const leases = ctx.services.jobLeases;
  ctx.logger.info({ leaseMs: leases.leaseMs }, "background jobs starting");
  // The outbox relay: sends at once what a crash left queued, then looks for due e-mails (retries) on a timer.
  const stopMailRelay = ctx.services.mail.relay.start({ everyMs: ctx.config.mailRelay.intervalMs });
  // The text relay, like the outbox relay, for text messages to tenants.
  const stopSmsRelay = ctx.services.sms.relay.start({ everyMs: ctx.config.sms.intervalMs });
  // Texts the day before each appointment (once per booking).
  const stopAppointmentTexts = startAppointmentTextReminders(ctx.services.works, ctx.logger, { leases });
  // The webhook relay: sends at once what a crash or a restart left queued, then looks for due deliveries.
  const stopWebhookRelay = ctx.services.webhooks.relay.start({ everyMs: ctx.config.webhooks.intervalMs });
  const stopTriageSweeper = startTriageSweeper(ctx.services.triage, ctx.logger, { leases });
  const digestScheduler = startDigestScheduler(ctx.services, ctx.logger, { clock: () => ctx.clock.now(), leases });
  const stopReminders = startMonitoringReminders(ctx.services.verification, ctx.logger, { leases });
  const stopInvitations = startInvitationBatches(ctx.services.invitationBatches, ctx.logger, {
    everyMs: ctx.config.invitationBatches.intervalMs,
    leases,
  });
  const stopBoardReports = startBoardReports(ctx.services.boardReports, ctx.logger, { leases });
  // Sensor health: each sensor with new readings is checked for low battery, flat-lining and jumps.
  const stopSensorHealth = startSensorHealthSweeper(ctx.services.sensorHealth, ctx.logger, { leases });
  const stopMqtt = startMqttIngest(ctx.services.sensorIngest, ctx.services.mqttBroker, ctx.config.mqtt, ctx.logger);
  // Rooms whose sensor figures are behind their readings (a crash or restart mid-evaluation) are worked out again.
  const stopSensorWatch = startSensorWatchSweep(ctx.services.sensorWatch, ctx.logger, { leases });
  // Rate-limit counts whose window has ended.
  const stopRateLimitPurge = leasedJob("rate-limit-purge", {
    everyMs: 10 * 60_000,
    logger: ctx.logger,
    failure: "purging ended rate-limit counts failed",
    leases,
    run: () => purgeExpiredRateLimitHits(ctx.dataSource),
  }).stop;
  // Next months' partitions of sensor_readings, added before readings reach them (at start, then daily).
  const stopReadingPartitions = startReadingPartitionUpkeep(ctx.services.readingPartitions, ctx.logger, { leases });
  // Search pieces for the homes a stock import wrote (until then the search tests them one by one).
  const stopHomeSearch = startHomeSearchCatchUp(ctx.services.homeSearch, ctx.logger, { leases });
  return async () => {
    await Promise.all([
      stopHomeSearch(),
      stopRateLimitPurge(),
      stopMqtt(),
      stopBoardReports(),
      stopSensorHealth(),
      stopSensorWatch(),
      stopReadingPartitions(),
      stopInvitations(),
      stopReminders(),
      stopTriageSweeper(),
      digestScheduler.stop(),
      stopMailRelay(),
      stopSmsRelay(),
      stopAppointmentTexts(),
      stopWebhookRelay(),
    ]);
  };
}
