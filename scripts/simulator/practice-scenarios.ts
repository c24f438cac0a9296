/**
 * Practice-shaped logs (DESIGN.md §10), each with the ground truth it was built from. Our own
 * simulator and invented data, as the demo logs; unlike the demo, these are written to test the
 * analysis against how crews actually set up, run and log. Every scenario returns its samples,
 * the log text, a `timeline` (times in s from the first sample, true positions), the build (link
 * sheet with failsafe values and engage ranges, failsafe plan) and, where it has one, the plan.
 */
import { benchFailsafeScenario, type BenchVariant } from "./practice/bench-failsafe";
import { corridorNoiseScenario } from "./practice/corridor-noise";
import { fadeIntoLossScenario } from "./practice/fade-into-loss";
import { gpxNoLinkScenario } from "./practice/gpx-no-link";
import { launchPointScenario, type MissionSignal } from "./practice/launch-point";
import { rssiChannelScenario } from "./practice/rssi-channel";
import type { PracticeScenario } from "./practice/sample";
import { voltageJitterScenario } from "./practice/voltage-jitter";
import { walkToLaunchScenario } from "./practice/walk-to-launch";

export { benchFailsafeScenario, corridorNoiseScenario, fadeIntoLossScenario, gpxNoLinkScenario, launchPointScenario, rssiChannelScenario, voltageJitterScenario, walkToLaunchScenario };
export type { BenchFailsafeTimeline, BenchVariant } from "./practice/bench-failsafe";
export type { CorridorNoiseTimeline, SideStretch } from "./practice/corridor-noise";
export type { FadeIntoLossTimeline } from "./practice/fade-into-loss";
export type { GpxNoLinkTimeline } from "./practice/gpx-no-link";
export type { LaunchPointTimeline, MissionSignal } from "./practice/launch-point";
export type { RssiChannelTimeline } from "./practice/rssi-channel";
export type { PracticeLog, PracticeSample, PracticeScenario } from "./practice/sample";
export type { VoltageJitterTimeline } from "./practice/voltage-jitter";
export type { WalkToLaunchTimeline } from "./practice/walk-to-launch";

/** Every practice scenario and variant with its default seed, e.g. for `npm run simulate -- <dir> --practice`. */
export function practiceScenarios(): PracticeScenario<unknown>[] {
  return [
    ...(["mode", "channel", "movement"] as MissionSignal[]).map((missionSignal) => launchPointScenario({ missionSignal })),
    walkToLaunchScenario(),
    walkToLaunchScenario({ format: "gpx" }),
    rssiChannelScenario(),
    rssiChannelScenario({ withRssiColumn: true }),
    ...(["rc-rssi", "rc-rssi-mode", "rssi-column", "no-fix"] as BenchVariant[]).map((variant) => benchFailsafeScenario({ variant })),
    gpxNoLinkScenario(),
    corridorNoiseScenario(),
    voltageJitterScenario(),
    fadeIntoLossScenario(),
    fadeIntoLossScenario({ separateFade: true }),
  ];
}
