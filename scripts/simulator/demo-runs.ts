import { demoCrew } from "@/db/demo-crew";
import { benchTestCsv, simulateBenchTest } from "./bench-test";
import { simulateRun } from "./simulate-run";
import { toCsv, toGpx, toNmea } from "./write-logs";

export interface DemoLog {
  fileName: string;
  contentType: string;
  body: string;
  build: string;
  /** Absent for a bench test: nothing to follow. */
  routePlan?: string;
  note: string;
}

/** The bench failsafe test of the demo quad: its link sheet puts RSSI on 14 and return to home on 8 (failsafe 1900 µs). */
export const heronBench = { seed: 53, rssiChannel: 14, rthChannel: 8, rthFailsafeUs: 1900, txOffAtS: 20, txOffForS: 10, holdS: 0.4 } as const;

/** The demo crew's logs: one per format over the invented Flats loop, and one bench failsafe test. */
export function demoLogs(): DemoLog[] {
  const loop = demoCrew.routePlans[0];
  const mudlark = simulateRun({ seed: 11, waypoints: loop.waypoints, startSoc: 0.35, resistanceOhm: 0.06 });
  const sandpiper = simulateRun({ seed: 23, waypoints: loop.waypoints, lossAt: 2, fadeAt: [0.3, 0.34] });
  const heron = simulateRun({ seed: 37, waypoints: loop.waypoints, speedMps: 4, lossAt: 2, fadeAt: [2, 2] });
  return [
    { fileName: "mudlark-flats-loop.csv", contentType: "text/csv", body: toCsv(mudlark), build: "Mudlark", routePlan: "Flats loop", note: "Behind the dune the link faded; lost it near the channel marker." },
    { fileName: "sandpiper-flats-loop.gpx", contentType: "application/gpx+xml", body: toGpx(sandpiper, new Date("2026-11-14T10:40:00Z"), "Sandpiper flats loop"), build: "Sandpiper", routePlan: "Flats loop", note: "Track from the rover's GPS." },
    { fileName: "heron-gps.nmea", contentType: "text/plain", body: toNmea(heron, new Date("2026-11-14T11:15:00Z")), build: "Heron", routePlan: "Flats loop", note: "Raw GPS serial log." },
    {
      fileName: "heron-bench-failsafe.csv",
      contentType: "text/csv",
      body: benchTestCsv(simulateBenchTest(heronBench), heronBench),
      build: "Heron",
      note: "Bench test in the club room, propellers off: transmitter switched off for ten seconds, then on again.",
    },
  ];
}
