// The anonymous flood of phase f of the fault script, in its own process so that building and sending
// its bodies does not slow the load generator measuring /api/auth/me. Usage (node --import tsx):
//   series-flood.ts <base url> <readings per request> <connections>
// Posts the same series over and over from each connection until SIGTERM, then prints the answers
// it got as JSON ({ "413": 12, "no answer": 3, … }) on stdout and exits.
const [base, readingsArg, connectionsArg] = process.argv.slice(2);
const readings = Number(readingsArg);
const connections = Number(connectionsArg);
if (!base || !Number.isInteger(readings) || !Number.isInteger(connections))
  throw new Error("usage: series-flood.ts <base url> <readings per request> <connections>");

const start = Date.UTC(2025, 0, 1);
const body = JSON.stringify({
  readings: Array.from({ length: readings }, (_, i) => ({
    at: new Date(start + i * 300_000).toISOString(),
    airTemperatureC: 18 + (i % 50) / 10,
    relativeHumidityPct: 55 + (i % 40),
    surfaceTemperatureC: 12 + (i % 30) / 10,
  })),
});

let flooding = true;
const answers: Record<string, number> = {};
process.on("SIGTERM", () => {
  flooding = false;
});
const loops = Array.from({ length: connections }, async () => {
  while (flooding) {
    const status = await fetch(`${base}/api/psychrometrics/series`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body,
      signal: AbortSignal.timeout(60_000),
    }).then(
      async (r) => (await r.arrayBuffer(), String(r.status)),
      () => "no answer",
    );
    answers[status] = (answers[status] ?? 0) + 1;
  }
});
// Ready: the parent starts measuring once it sees this line.
console.log("flooding");
await Promise.all(loops);
console.log(JSON.stringify(answers));
