import type { z } from "zod";
import type { sensorCredentialsResponse, sensorResponse } from "../../../src/lib/contracts/sensors.js";
import { mqttTopicOf, stateOf, type SensorView } from "./sensor.service.js";

/** The HTTP ingest's path, named in the once-shown credentials. */
export const SENSOR_INGEST_PATH = "/api/sensor-ingest/readings";

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export const toSensorDto = ({ sensor: s, homeAddress, roomName }: SensorView): z.input<typeof sensorResponse> => ({
  id: s.id,
  propertyId: s.propertyId,
  roomId: s.roomId,
  homeAddress,
  roomName,
  serial: s.serial,
  model: s.model,
  placement: s.placement,
  measuresSurface: s.measuresSurface,
  intervalS: s.intervalS,
  installedOn: s.installedOn,
  removedOn: s.removedOn,
  state: stateOf(s),
  mqttUsername: s.mqttUsername,
  mqttTopic: mqttTopicOf(s.mqttUsername),
  keyIssuedAt: iso(s.keyIssuedAt),
  revokedAt: iso(s.revokedAt),
  lastReadingAt: iso(s.lastReadingAt),
  version: s.version,
});

export const toSensorCredentialsDto = (view: SensorView, secret: string): z.input<typeof sensorCredentialsResponse> => ({
  sensor: toSensorDto(view),
  credentials: {
    secret,
    mqttUsername: view.sensor.mqttUsername,
    mqttTopic: mqttTopicOf(view.sensor.mqttUsername),
    httpPath: SENSOR_INGEST_PATH,
  },
});
