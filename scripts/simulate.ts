/** `npx tsx scripts/simulate.ts [out-dir]`: writes the demo logs (CSV, GPX, NMEA) to a folder. */
import fs from "node:fs";
import path from "node:path";
import { demoLogs } from "./simulator/demo-runs";

const dir = path.resolve(process.argv[2] ?? ".data/demo-logs");
fs.mkdirSync(dir, { recursive: true });
for (const log of demoLogs()) {
  fs.writeFileSync(path.join(dir, log.fileName), log.body);
  console.log(`${path.join(dir, log.fileName)}  ${(log.body.length / 1024).toFixed(0)} KB`);
}
