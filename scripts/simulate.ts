/**
 * `npx tsx scripts/simulate.ts [out-dir]`: writes the demo logs (CSV, GPX, NMEA) to a folder.
 * `npx tsx scripts/simulate.ts <out-dir> --practice`: writes the practice-shaped logs instead, each
 * with `<name>.build.json`, `<name>.plan.json` (when it has a plan) and `<name>.timeline.json`, for
 * `npm run analyse -- <log> --build … --route …`.
 */
import fs from "node:fs";
import path from "node:path";
import { demoLogs } from "./simulator/demo-runs";
import { practiceScenarios } from "./simulator/practice-scenarios";

const practice = process.argv.includes("--practice");
const dir = path.resolve(process.argv.slice(2).find((a) => !a.startsWith("--")) ?? ".data/demo-logs");
fs.mkdirSync(dir, { recursive: true });
const write = (name: string, body: string) => {
  fs.writeFileSync(path.join(dir, name), body);
  console.log(`${path.join(dir, name)}  ${(body.length / 1024).toFixed(0)} KB`);
};
if (practice) {
  for (const s of practiceScenarios()) {
    write(s.log.fileName, s.log.text);
    write(`${s.name}.build.json`, JSON.stringify(s.build, null, 2) + "\n");
    if (s.plan) write(`${s.name}.plan.json`, JSON.stringify(s.plan, null, 2) + "\n");
    write(`${s.name}.timeline.json`, JSON.stringify(s.timeline, null, 2) + "\n");
  }
} else for (const log of demoLogs()) write(log.fileName, log.body);
