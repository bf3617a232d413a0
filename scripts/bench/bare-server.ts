// The comparison side of `npm run bench:api`: a bare Express server that sends, for each path, the
// very bytes Seamscene answered on it. Started as its own process so both sides pay the same costs.
// Run: node --import tsx scripts/bench/bare-server.ts BODIES.json PORT
import fs from "node:fs";
import express from "express";

const [bodiesFile, port] = process.argv.slice(2);
const bodies = JSON.parse(fs.readFileSync(bodiesFile!, "utf8")) as Record<string, string>;
const app = express();
app.disable("x-powered-by");
app.get(/.*/, (req, res) => {
  const body = bodies[req.url];
  if (body === undefined) return res.status(404).end();
  res.type("application/json").send(Buffer.from(body, "utf8"));
});
app.listen(Number(port), "127.0.0.1", () => process.stdout.write("ready\n"));
