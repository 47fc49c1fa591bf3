// Readings over MQTT in a serving process: the subscriber (when the app has an MQTT password) and the
// first rewrite of the broker's files. Started by background.ts, never by createApp.
import type { Config } from "../../../config/env.js";
import type { Logger } from "../../../lib/logger.js";
import type { MosquittoBrokerFiles } from "./broker-files.js";
import { SensorSubscriber, type MqttSensorIngest } from "./subscriber.js";

export function startMqttIngest(
  ingest: MqttSensorIngest,
  broker: MosquittoBrokerFiles,
  config: Config["mqtt"],
  logger: Logger,
): () => Promise<void> {
  // The registry may have changed while no app was running.
  void broker.credentialsChanged();
  if (!config.password) {
    logger.info("MQTT_PASSWORD is not set: readings over MQTT are off (HTTP ingest works)");
    return async () => {};
  }
  const subscriber = new SensorSubscriber(ingest, { ...config, password: config.password }, logger);
  broker.onChange(() => subscriber.forgetIdentities());
  subscriber.start();
  return () => subscriber.stop();
}
