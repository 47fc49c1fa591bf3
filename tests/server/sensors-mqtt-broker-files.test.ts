// The broker's password file and ACL, rewritten from the registry and reloaded by SIGHUP, against a
// real mosquitto: a burst of changes is one or two rewrites, and 50 000 sensors rewrite and reload in
// a few seconds (the figure is printed; not asserted, it depends on the machine's load).
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import mqtt from "mqtt";
import { pino } from "pino";
import { afterAll, beforeAll, expect, it } from "vitest";
import { freePort } from "../../scripts/lib/mariadb.js";
import { startMosquitto, stopMosquitto, type Mosquitto } from "../../scripts/lib/mosquitto.js";
import { createAppContext, type AppContext } from "../../server/app-context.js";
import { loadConfig } from "../../server/config/env.js";
import { mosquittoPasswordHash } from "../../server/modules/sensors/credentials.js";
import { brokerPaths, MosquittoBrokerFiles } from "../../server/modules/sensors/mqtt/broker-files.js";
import { makeOrganisation, makeProperty } from "../support/factories.js";
import { testClock } from "../support/test-clock.js";

const SENSORS = 50_000;
const SECRET = "dws_the-one-secret-every-bulk-sensor-here-shares";
let dir: string;
let broker: Mosquitto;
let ctx: AppContext;
let orgId: number;

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), "dewline-test-mqtt-"));
  broker = await startMosquitto({ dir, port: await freePort() });
  ctx = await createAppContext(loadConfig(process.env), { clock: testClock });
  const org = await makeOrganisation(ctx.dataSource);
  const home = await makeProperty(ctx.dataSource, org);
  const [room] = await ctx.dataSource.query("SELECT id FROM rooms WHERE property_id = ? LIMIT 1", [home.id]);
  orgId = org.id;
  // One hash for all (PBKDF2 50 000 times would time the test, not the rewrite).
  await ctx.dataSource.query(
    `INSERT INTO sensors (organisation_id, property_id, room_id, serial, model, placement, installed_on, mqtt_username, mqtt_password_hash, key_issued_at)
     SELECT ?, ?, ?, CONCAT('BULK-', ?, '-', seq), 'Bulk', 'living room wall', '2026-01-01', CONCAT('tmp', ?, '-', seq), ?, NOW(3)
       FROM seq_1_to_${SENSORS}`,
    [org.id, home.id, room.id, org.id, org.id, mosquittoPasswordHash(SECRET)],
  );
  await ctx.dataSource.query("UPDATE sensors SET mqtt_username = CONCAT('s', id) WHERE organisation_id = ?", [org.id]);
}, 120_000);

afterAll(async () => {
  await ctx?.dataSource.query("DELETE FROM sensors WHERE organisation_id = ?", [orgId]);
  await ctx?.close();
  await stopMosquitto(dir);
  rmSync(dir, { recursive: true, force: true });
});

const files = () =>
  new MosquittoBrokerFiles(
    ctx.dataSource,
    { dir, username: broker.app.username, password: broker.app.password },
    pino({ level: "silent" }),
    testClock,
  );

it("rewrites 50 000 sensors' passwords and ACL, reloads the broker, and the last of them can then publish", async () => {
  const [last] = await ctx.dataSource.query(
    "SELECT mqtt_username AS u FROM sensors WHERE organisation_id = ? ORDER BY id DESC LIMIT 1",
    [orgId],
  );
  // Before the rewrite the broker knows only the app.
  await expect(
    mqtt.connectAsync(broker.url, { username: last.u, password: SECRET, protocolVersion: 5, reconnectPeriod: 0 }),
  ).rejects.toThrow(/Not authorized/);
  const broker50k = files();
  await broker50k.credentialsChanged();
  expect(broker50k.lastRewrite).toMatchObject({ reloaded: true });
  expect(broker50k.lastRewrite!.sensors).toBeGreaterThanOrEqual(SENSORS);
  const passwords = readFileSync(brokerPaths(dir).passwords, "utf8");
  expect(passwords.startsWith(`${broker.app.username}:$7$101$`)).toBe(true);
  expect(passwords).toContain(`\n${last.u}:$7$101$`);
  expect(readFileSync(brokerPaths(dir).acl, "utf8")).toContain("\npattern write sensors/%u/readings\n");

  // The broker reloads after the signal; the device is let in once it has.
  const rewritten = performance.now();
  let device: mqtt.MqttClient | null = null;
  for (let i = 0; i < 100 && !device; i++) {
    device = await mqtt
      .connectAsync(broker.url, { username: last.u, password: SECRET, protocolVersion: 5, reconnectPeriod: 0 })
      .catch(() => null);
    if (!device) await new Promise((r) => setTimeout(r, 100));
  }
  expect(device).not.toBeNull();
  await device!.publishAsync(`sensors/${last.u}/readings`, "{}", { qos: 1 });
  // The one pattern rule still keeps it to its own topic (MQTT 5: PUBACK reason 135).
  await expect(device!.publishAsync(`sensors/s1/readings`, "{}", { qos: 1 })).rejects.toMatchObject({ code: 135 });
  await device!.endAsync();
  console.log(
    `broker files: ${broker50k.lastRewrite!.sensors} sensors rewritten in ${broker50k.lastRewrite!.ms} ms; the device was let in ${Math.round(performance.now() - rewritten)} ms after the reload signal`,
  );
}, 120_000);

it("serves a burst of changes with at most two rewrites, and never throws into the caller", async () => {
  const burst = files();
  await Promise.all(Array.from({ length: 10 }, () => burst.credentialsChanged()));
  expect(burst.rewrites).toBeGreaterThanOrEqual(1);
  expect(burst.rewrites).toBeLessThanOrEqual(2);

  // A folder that is gone: the caller's promise still resolves; the failure is logged.
  const nowhere = new MosquittoBrokerFiles(
    ctx.dataSource,
    { dir: path.join(dir, "missing"), username: "app", password: "x" },
    pino({ level: "silent" }),
    testClock,
  );
  await expect(nowhere.credentialsChanged()).resolves.toBeUndefined();
  expect(nowhere.lastRewrite).toBeNull();
}, 120_000);
