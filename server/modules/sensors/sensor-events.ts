// The seams between the sensor registry and ingest (this module) and the parts that react to it:
// the MQTT broker's credential files, and the per-room watch that evaluates readings and raises
// alerts. Each is wired in createServices; this module knows only these interfaces.

/** A sensor as the ingest knows it once its key or MQTT user name has been checked. */
export interface SensorIdentity {
  id: number;
  organisationId: number;
  propertyId: number;
  roomId: number;
  serial: string;
  mqttUsername: string;
  intervalS: number;
  measuresSurface: boolean;
}

/** What one ingest call did: every reading is stored, a duplicate of a stored one, or refused with a reason. */
export interface IngestOutcome {
  stored: number;
  duplicates: number;
  refused: { index: number; takenAt: string | null; reason: string }[];
}

/** Told, after the transaction that stored them commits, which sensors and rooms have new readings. */
export interface SensorReadingsListener {
  readingsStored(batch: StoredReadingsBatch): void;
}

export interface StoredReadingsBatch {
  organisationId: number;
  /** Distinct sensors and their rooms with newly stored readings. */
  sensors: { sensorId: number; roomId: number; propertyId: number; newestTakenAt: Date }[];
  /** The app clock when the readings were stored. */
  receivedAt: Date;
}

/** Keeps the broker's password and ACL files in step with the registry (issued, revoked, removed). */
export interface BrokerCredentials {
  /** Called after a commit that issued, revoked or removed a sensor's credentials. Never throws. */
  credentialsChanged(): Promise<void>;
}
