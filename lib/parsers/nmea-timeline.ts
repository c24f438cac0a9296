import type { ParseWarning } from "./types";

const DAY_S = 86_400;
const DAY_MS = DAY_S * 1000;

/**
 * RMC carries a two-digit year. Dates before 2000 cannot be right for a log made with a receiver
 * in use today: they come from the GPS week-number roll-overs (the legacy navigation message sends
 * the week modulo 1024, IS-GPS-200 §20.3.3.3.1.1, so the count wrapped on 1999-08-22 and
 * 2019-04-07, and a receiver that misses it reports dates 1024 weeks = 19.6 years early, e.g.
 * 220899 for 2019-04-07) or from a receiver's default date before its first fix.
 */
export const EARLIEST_YEAR = 2000;

/**
 * A date farther than this from the run's date is a jump, not the log going on: one run lasts
 * hours, and even a log appended to over several sessions spans days. The bogus dates of a cold
 * start are years away (a firmware's default date, a corrupted field).
 */
export const MAX_DATE_JUMP_DAYS = 30;

const iso = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/**
 * The continuous timeline of an NMEA log, one call per epoch in file order.
 *
 * Time of day without a date trusted for it: the epoch is put on the day that makes its step
 * from the previous epoch at most 12 h, so 23:59:59 → 00:00:01 is +2 s across midnight and a
 * receiver clock that steps back a few minutes over midnight goes back, not forward a day. Hour
 * roll-overs need nothing (seconds since midnight are continuous).
 *
 * Dates (RMC): the first date from a year ≥ {@link EARLIEST_YEAR} becomes the run's date. One from
 * an RMC with status A (the receiver has a fix, so it knows the date) is firm; one from status V
 * is provisional and gives way to the first fix's date when they disagree by more than
 * {@link MAX_DATE_JUMP_DAYS}. Later dates from status A move the timeline by whole days (a log that
 * pauses overnight). A date before 2000, or more than {@link MAX_DATE_JUMP_DAYS} from the run's
 * date, is bogus: ignored, counted in one "bogus-date" warning, never used for `startedAt`.
 */
export class NmeaTimeline {
  private prevT = NaN;
  /** UTC midnight of day 0 of the timeline, epoch ms; null while the log is undated. */
  private day0Ms: number | null = null;
  private firm = false;
  /** Status-V dates that agreed with a provisional run date, for the warning if it is overruled. */
  private provisional = { count: 0, line: 0, dateMs: 0 };
  private bogus = { count: 0, line: 0, early: null as null | { dateMs: number; line: number }, jump: null as null | { dateMs: number; line: number } };

  /**
   * Places one epoch on the timeline.
   * @param tod seconds since UTC midnight
   * @param dateMs UTC midnight of its RMC date, epoch ms, or null
   * @param fixDate true when that date came from an RMC with status A
   * @param line source line, for the warning
   * @returns seconds since UTC midnight of day 0 (not yet relative to the first sample)
   */
  place(tod: number, dateMs: number | null, fixDate: boolean, line: number): number {
    let day = Number.isNaN(this.prevT) ? 0 : Math.round((this.prevT - tod) / DAY_S);
    if (dateMs !== null) day = this.dated(dateMs, fixDate, day, line);
    this.prevT = day * DAY_S + tod;
    return this.prevT;
  }

  private dated(dateMs: number, fixDate: boolean, day: number, line: number): number {
    if (new Date(dateMs).getUTCFullYear() < EARLIEST_YEAR) {
      this.flag("early", dateMs, line);
      return day;
    }
    if (this.day0Ms === null) {
      this.anchor(dateMs, day, fixDate, line);
      return day;
    }
    const dateDay = Math.round((dateMs - this.day0Ms) / DAY_MS);
    if (Math.abs(dateDay - day) > MAX_DATE_JUMP_DAYS) {
      if (fixDate && !this.firm) {
        // The provisional date (from a receiver warning) was the bogus one.
        for (let i = 0; i < this.provisional.count; i++) this.flag("jump", this.provisional.dateMs, this.provisional.line);
        this.anchor(dateMs, day, true, line);
      } else this.flag("jump", dateMs, line);
      return day;
    }
    if (!this.firm) {
      if (fixDate) this.firm = true;
      else this.provisional.count++;
    }
    return fixDate ? dateDay : day;
  }

  private anchor(dateMs: number, day: number, firm: boolean, line: number): void {
    this.day0Ms = dateMs - day * DAY_MS;
    this.firm = firm;
    this.provisional = { count: firm ? 0 : 1, line, dateMs };
  }

  private flag(kind: "early" | "jump", dateMs: number, line: number): void {
    const b = this.bogus;
    if (b.count === 0 || line < b.line) b.line = line;
    b.count++;
    if (!b[kind] || line < b[kind].line) b[kind] = { dateMs, line };
  }

  /** Absolute time of timeline second `t`, or null when no date could be trusted. */
  startedAt(t: number): Date | null {
    return this.day0Ms === null ? null : new Date(Math.round(this.day0Ms + t * 1000));
  }

  /** The one "bogus-date" warning, or null when every date was usable. */
  warning(): ParseWarning | null {
    const b = this.bogus;
    if (b.count === 0) return null;
    const why: string[] = [];
    if (b.early) why.push(`${iso(b.early.dateMs)} (line ${b.early.line}) is before ${EARLIEST_YEAR}, as after a missed GPS week roll-over (dates 1024 weeks early)`);
    if (b.jump) {
      const runDate = this.day0Ms === null ? "" : ` from the run's date ${iso(this.day0Ms)}`;
      why.push(`${iso(b.jump.dateMs)} (line ${b.jump.line}) is more than ${MAX_DATE_JUMP_DAYS} days${runDate}`);
    }
    const undated = this.day0Ms === null ? "; the run is undated" : "";
    return { code: "bogus-date", message: `Dates that cannot be right were not used to date the run: ${why.join("; ")}${undated}`, line: b.line, count: b.count };
  }
}
