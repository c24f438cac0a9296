/**
 * Logs that hold two separate runs, written here with invented positions at our invented demo
 * field (db/demo-crew.ts, "Home" of the flats loop): a GPX with two tracks three hours apart and
 * a telemetry CSV with two armed periods 40 minutes apart, the logger off in between. Each run's
 * start, length and sample count follow from how the file is written, so tests can state them.
 */

const HOME = { lat: 53.47012, lon: -3.05211 };
const M_PER_DEG_LAT = 111_320;

/** A slow circle of `radiusM` around a point near Home, one lap per 120 s. */
function circle(t: number, radiusM: number, eastM: number) {
  const a = (2 * Math.PI * t) / 120;
  const north = radiusM * Math.sin(a);
  const east = eastM + radiusM * Math.cos(a);
  return {
    lat: HOME.lat + north / M_PER_DEG_LAT,
    lon: HOME.lon + east / (M_PER_DEG_LAT * Math.cos((HOME.lat * Math.PI) / 180)),
  };
}

const iso = (ms: number) => new Date(ms).toISOString();

export interface MultiRunLog {
  fileName: string;
  body: string;
  contentType: string;
  /** What each run must come out as, in file order. */
  runs: { startedAt: string; durationS: number; samples: number }[];
}

/**
 * Two <trk>s of one-second points: 120 points from 09:00 UTC, 90 points from 12:00 UTC. A `nonce`
 * (in an XML comment) makes the bytes new, so an upload is never taken for a duplicate.
 */
export function twoTrackGpx(fileName = "two-sorties.gpx", nonce = ""): MultiRunLog {
  const day = Date.parse("2026-03-14T09:00:00Z");
  const track = (startMs: number, points: number, eastM: number) =>
    Array.from({ length: points }, (_, i) => {
      const p = circle(i, 25, eastM);
      return `      <trkpt lat="${p.lat.toFixed(7)}" lon="${p.lon.toFixed(7)}"><ele>4.0</ele><time>${iso(startMs + i * 1000)}</time><fix>3d</fix><sat>11</sat><hdop>0.80</hdop></trkpt>`;
    }).join("\n");
  const body = `<?xml version="1.0" encoding="UTF-8"?>
<gpx version="1.1" creator="Sortie tests" xmlns="http://www.topografix.com/GPX/1/1">${nonce ? `<!-- ${nonce} -->` : ""}
  <trk><name>Morning sortie</name><trkseg>
${track(day, 120, 0)}
  </trkseg></trk>
  <trk><name>Noon sortie</name><trkseg>
${track(day + 3 * 3600_000, 90, 40)}
  </trkseg></trk>
</gpx>
`;
  return {
    fileName,
    body,
    contentType: "application/gpx+xml",
    runs: [
      { startedAt: "2026-03-14T09:00:00.000Z", durationS: 119, samples: 120 },
      { startedAt: "2026-03-14T12:00:00.000Z", durationS: 89, samples: 90 },
    ],
  };
}

/**
 * Telemetry at 1 Hz: powered up at 09:00:00, armed 09:00:30–09:10:00, disarmed until the logger
 * goes off at 09:10:20; on again at 09:49:30, armed 09:50:00 (40 min after the last armed sample)
 * to 09:57:00, disarmed until 09:57:10. The second run starts where the logger came back on.
 */
export function twoArmedPeriodsCsv(fileName = "two-battery-packs.csv", opts: { lossInSecondRun?: boolean } = {}): MultiRunLog {
  const t0 = Date.parse("2026-03-14T09:00:00Z");
  const rows = ["timestamp,latitude,longitude,altitude_m,gps_sats,hdop,fix,rssi_dbm,link_quality,battery_v,armed"];
  const stretch = (fromS: number, toS: number, armedFromS: number, armedToS: number, eastM: number) => {
    for (let s = fromS; s <= toS; s++) {
      const armed = s >= armedFromS && s <= armedToS;
      // Standing still before arming and after disarming.
      const p = circle(Math.min(Math.max(s, armedFromS), armedToS), 20, eastM);
      // With the option: the link drops to nothing for 20 s in the second run (an "act" verdict).
      const lost = opts.lossInSecondRun && s >= 3200 && s < 3220;
      rows.push([iso(t0 + s * 1000), p.lat.toFixed(7), p.lon.toFixed(7), "3.0", 12, "0.70", 3, lost ? -120 : -58, lost ? 0 : 100, armed ? "16.10" : "16.60", armed ? 1 : 0].join(","));
    }
  };
  stretch(0, 620, 30, 600, 0);
  stretch(2970, 3430, 3000, 3420, 30);
  return {
    fileName,
    body: rows.join("\n") + "\n",
    contentType: "text/csv",
    runs: [
      { startedAt: "2026-03-14T09:00:00.000Z", durationS: 620, samples: 621 },
      { startedAt: "2026-03-14T09:49:30.000Z", durationS: 460, samples: 461 },
    ],
  };
}
