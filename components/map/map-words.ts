/** Words of the map's home and mission-start marks, shared by the map's titles and legend (pure). */
import { HOME_SOURCE_WORDS, MISSION_START_WORDS, type HomeSource, type MissionStartSource } from "@/lib/analysis/evidence";
import { formatClock } from "@/lib/format/units";

/** Home, and which rule placed it (summary.home.source; absent from older summaries). */
export interface MapHome {
  lat: number;
  lon: number;
  source?: HomeSource | null;
}

/** Where route following began (summary.route.start). */
export interface MapMissionStart {
  lat: number;
  lon: number;
  source: MissionStartSource;
  startS: number;
}

/** "Home: where the vehicle was armed (first good fix after arming)". */
export function homeTitle(home: Pick<MapHome, "source">): string {
  return home.source && HOME_SOURCE_WORDS[home.source] ? `Home: ${HOME_SOURCE_WORDS[home.source]}` : "Home";
}

/** "Mission start at 0:03, when a mission mode was engaged". */
export function missionStartTitle(start: Pick<MapMissionStart, "source" | "startS">): string {
  return `Mission start at ${formatClock(start.startS)}, ${MISSION_START_WORDS[start.source] ?? start.source}`;
}

