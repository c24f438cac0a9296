import type { NmeaSentence } from "./nmea-sentence";

type Gga = Extract<NmeaSentence, { kind: "gga" }>;
type Rmc = Extract<NmeaSentence, { kind: "rmc" }>;
type Vtg = Extract<NmeaSentence, { kind: "vtg" }>;

/**
 * Sentences of one epoch may be separated by up to this many other epochs' sentences and still
 * join it (a receiver that writes GGA of second n after RMC of second n + 1, talkers interleaved).
 * Bounds memory: only this many epochs are ever held.
 */
export const OPEN_EPOCHS = 4;

/** Two times of day closer than this are the same epoch, s (receivers write at most ms). */
const SAME_TIME_S = 5e-4;

/** One fix epoch being assembled from every sentence that carries its time (and date). */
export interface Epoch {
  /** Line of the epoch's first sentence. */
  line: number;
  /** Seconds since UTC midnight. */
  tod: number;
  /** UTC midnight of the RMC date, epoch ms; null until an RMC with a date joins. */
  dateMs: number | null;
  /** Line of the RMC that gave `dateMs`. */
  dateLine: number;
  /** The GGA that speaks for the epoch: a combined (GN) one with a fix, else the first with a fix, else the first. */
  gga: Gga | null;
  /** Satellites used per talker, first GGA of each talker. */
  satsByTalker: Map<string, number>;
  /** The RMC that speaks for the epoch: a valid one (GN first), else the first. */
  rmc: Rmc | null;
  /** VTG course and speed, used when no valid RMC gives them. */
  vtg: Vtg | null;
}

/** The epoch's values as one sample (NaN = not carried). */
export interface EpochSample {
  lat: number;
  lon: number;
  altM: number;
  sats: number;
  hdop: number;
  fixType: number;
  speedMps: number;
  headingDeg: number;
}

const hasFix = (g: Gga) => !Number.isNaN(g.lat) && !Number.isNaN(g.lon);

/** True when `next` should speak for the epoch instead of `held`: a fix beats no fix, then GN beats a single constellation. */
function better(held: { talker: string }, heldOk: boolean, next: { talker: string }, nextOk: boolean): boolean {
  if (nextOk !== heldOk) return nextOk;
  return next.talker === "GN" && held.talker !== "GN";
}

/**
 * Groups GGA, RMC and VTG sentences into fix epochs, one sample each, whatever the talker (GP, GL,
 * GA, GB/BD, GN, …) and however the sentences interleave: a GGA or RMC joins the open epoch with
 * the same time of day (and, for an RMC, the same date when the epoch already has one), else opens a
 * new one. At most {@link OPEN_EPOCHS} are open; the oldest is handed to `emit` when one more
 * opens, the rest by `finish()`, always in the order they were opened. VTG (no time of its own)
 * joins the epoch the last GGA/RMC went to, or the first epoch when none has yet.
 *
 * Satellites: a multi-constellation receiver that writes one GGA per constellation (GPGGA and GLGGA
 * with the same time) counts each constellation's satellites in its own GGA, so the epoch's count is
 * their sum; a GN (combined) GGA already counts them all and is used alone (NMEA 0183 4.10 talker
 * use; common practice of SiRFstarV, MediaTek and u-blox output).
 */
export class EpochAssembler {
  private open: Epoch[] = [];
  private last: Epoch | null = null;
  private pendingVtg: Vtg | null = null;

  constructor(private readonly emit: (e: Epoch) => Promise<void>) {}

  async add(s: Gga | Rmc, line: number): Promise<void> {
    const date = s.kind === "rmc" ? s.dateMs : null;
    let e = this.open.find((o) => Math.abs(o.tod - s.tod) < SAME_TIME_S && (date === null || o.dateMs === null || o.dateMs === date));
    if (!e) {
      e = { line, tod: s.tod, dateMs: null, dateLine: line, gga: null, satsByTalker: new Map(), rmc: null, vtg: this.pendingVtg };
      this.pendingVtg = null;
      this.open.push(e);
      if (this.open.length > OPEN_EPOCHS) await this.emit(this.open.shift()!);
    }
    if (s.kind === "gga") {
      if (!e.gga || better(e.gga, hasFix(e.gga), s, hasFix(s))) e.gga = s;
      if (!e.satsByTalker.has(s.talker) && !Number.isNaN(s.sats)) e.satsByTalker.set(s.talker, s.sats);
    } else {
      if (e.dateMs === null && s.dateMs !== null) {
        e.dateMs = s.dateMs;
        e.dateLine = line;
      }
      if (!e.rmc || better(e.rmc, e.rmc.valid, s, s.valid)) e.rmc = s;
    }
    this.last = e;
  }

  addVtg(v: Vtg): void {
    if (this.last) this.last.vtg ??= v;
    else this.pendingVtg ??= v;
  }

  /** Emits every epoch still open, in order. */
  async finish(): Promise<void> {
    for (const e of this.open) await this.emit(e);
    this.open = [];
  }
}

/**
 * The sample of an epoch. Position: the GGA's when it has a fix (it carries the quality, satellites
 * and HDOP of that solution), else a valid RMC's. Fix type: the GGA quality code; without GGA, RMC
 * status A gives 1 and V gives 0. Speed and course: a valid RMC's, else VTG's. Altitude and HDOP
 * from the GGA.
 */
export function epochSample(e: Epoch): EpochSample {
  const { gga, rmc, vtg } = e;
  const ggaFix = gga !== null && hasFix(gga);
  const rmcOk = rmc !== null && rmc.valid;
  let sats = NaN;
  if (e.satsByTalker.has("GN")) sats = e.satsByTalker.get("GN")!;
  else for (const n of e.satsByTalker.values()) sats = Number.isNaN(sats) ? n : sats + n;
  const rmcPos = rmcOk && !Number.isNaN(rmc.lat) && !Number.isNaN(rmc.lon);
  return {
    lat: ggaFix ? gga.lat : rmcPos ? rmc.lat : NaN,
    lon: ggaFix ? gga.lon : rmcPos ? rmc.lon : NaN,
    altM: gga ? gga.altM : NaN,
    sats,
    hdop: gga ? gga.hdop : NaN,
    fixType: gga && !Number.isNaN(gga.quality) ? gga.quality : rmc ? (rmc.valid ? 1 : 0) : NaN,
    speedMps: rmcOk && !Number.isNaN(rmc.speedMps) ? rmc.speedMps : (vtg?.speedMps ?? NaN),
    headingDeg: rmcOk && !Number.isNaN(rmc.headingDeg) ? rmc.headingDeg : (vtg?.headingDeg ?? NaN),
  };
}
