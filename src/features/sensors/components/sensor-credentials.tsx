import { useId, useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import type { SensorCredentialsResponse } from "@/lib/contracts";
import { SENSOR_CSV_COLUMNS } from "@/lib/schemas/sensor-readings";

/** A sensor's secret, shown once: Dewline keeps only hashes of it, so it cannot be shown again. */
export function SensorCredentials({ result, onDone }: { result: SensorCredentialsResponse; onDone: () => void }) {
  const [copied, setCopied] = useState(false);
  const secretId = useId();
  const { credentials, sensor } = result;
  return (
    <Alert tone="success" title={`Secret for sensor ${sensor.serial}`} live="status">
      <p>
        Put this secret into the sensor or its gateway now. Dewline keeps only a fingerprint of it, so it cannot be shown again;
        if it is lost, issue a new one.
      </p>
      <label htmlFor={secretId} className="mt-3 block text-sm font-semibold">
        Device secret
      </label>
      <input
        id={secretId}
        readOnly
        value={credentials.secret}
        spellCheck={false}
        onFocus={(event) => event.currentTarget.select()}
        className="mt-1 w-full rounded border border-line bg-surface px-2 py-1 font-mono text-sm"
      />
      <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="font-semibold">MQTT user name</dt>
        <dd className="font-mono">{credentials.mqttUsername}</dd>
        <dt className="font-semibold">MQTT topic</dt>
        <dd className="font-mono">{credentials.mqttTopic}</dd>
        <dt className="font-semibold">Or over HTTP</dt>
        <dd className="font-mono">POST {credentials.httpPath} with Authorization: Bearer &lt;secret&gt;</dd>
        <dt className="font-semibold">A backlog as CSV</dt>
        <dd>
          The same request with <span className="font-mono">Content-Type: text/csv</span>, a header line{" "}
          <span className="font-mono break-all">{SENSOR_CSV_COLUMNS.join(",")}</span>, then one reading a line.
        </dd>
      </dl>
      <div className="mt-3 flex flex-wrap gap-2">
        <Button
          size="sm"
          variant="secondary"
          onClick={() => {
            void navigator.clipboard?.writeText(credentials.secret).then(() => setCopied(true));
          }}
        >
          {copied ? "Copied" : "Copy the secret"}
        </Button>
        <Button size="sm" onClick={onDone}>
          I have stored it
        </Button>
      </div>
    </Alert>
  );
}
