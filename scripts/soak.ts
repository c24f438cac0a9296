/**
 * `npm run soak`: the load and fault tests (tests/faults) in their full form — 20 concurrent
 * ingests of 100,000-row logs with 5 rounds of 200 concurrent debrief reads, and a 1,000,000-row
 * log killed mid-read — against the production build, on a stack of their own (loopback only).
 * `npm test` runs the same files in a short form.
 */
import { buildApp } from "./lib/app-server";
import { appEnv, profile } from "./lib/profiles";
import { log } from "./lib/util";
import { clearFigures, printFigures, vitest } from "./lib/vitest-run";

async function main(): Promise<number> {
  const t0 = Date.now();
  await buildApp(".next-test", appEnv(profile("test")));
  clearFigures();
  const r = await vitest(["faults"], { SORTIE_SOAK: "full", NEXT_TELEMETRY_DISABLED: "1" }, process.argv.slice(2));
  printFigures();
  log("soak", `finished in ${((Date.now() - t0) / 1000).toFixed(0)} s`);
  console.log(`${r.numPassedTests} passed, ${r.numFailedTests} failed, ${r.numPendingTests + r.numTodoTests} skipped`);
  return r.success && r.numFailedTests === 0 && r.numPassedTests > 0 ? 0 : 1;
}

main()
  .then((code) => process.exit(code))
  .catch((e) => {
    console.error(`[soak] aborted: ${(e as Error).stack ?? e}`);
    process.exit(1);
  });
