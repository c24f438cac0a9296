/**
 * Figures in the reader's units (the user's metric / imperial setting). Values arrive in SI.
 * Conversion factors are exact by definition: 1 ft = 0.3048 m and 1 mi = 1609.344 m
 * (International Yard and Pound Agreement, 1959; NIST SP 811, Appendix B), 1 mph = 0.44704 m/s.
 */
export type Units = "metric" | "imperial";

export const M_PER_FT = 0.3048;
export const M_PER_MI = 1609.344;
export const MPS_PER_MPH = 0.44704;

const none = "—";
const ok = (v: number | null | undefined): v is number => v != null && Number.isFinite(v);
const fixed = (v: number, digits: number) => v.toLocaleString("en", { minimumFractionDigits: digits, maximumFractionDigits: digits });

/** Distances: m / km, or ft / mi (ft below a tenth of a mile). */
export function formatDistance(m: number | null | undefined, units: Units): string {
  if (!ok(m)) return none;
  if (units === "imperial") {
    const ft = m / M_PER_FT;
    return Math.abs(m) < M_PER_MI / 10 ? `${fixed(ft, 0)} ft` : `${fixed(m / M_PER_MI, 2)} mi`;
  }
  return Math.abs(m) < 1000 ? `${fixed(m, Math.abs(m) < 10 ? 1 : 0)} m` : `${fixed(m / 1000, 2)} km`;
}

/** Short lengths that stay in one unit (cross-track error, altitude): m or ft. */
export function formatLength(m: number | null | undefined, units: Units, digits = 1): string {
  if (!ok(m)) return none;
  return units === "imperial" ? `${fixed(m / M_PER_FT, digits)} ft` : `${fixed(m, digits)} m`;
}

export function formatSpeed(mps: number | null | undefined, units: Units): string {
  if (!ok(mps)) return none;
  return units === "imperial" ? `${fixed(mps / MPS_PER_MPH, 1)} mph` : `${fixed(mps, 1)} m/s`;
}

/** Chart conversions: SI value → display value, with the unit label. */
export function lengthConversion(units: Units): { unit: string; convert?: (v: number) => number } {
  return units === "imperial" ? { unit: "ft", convert: (v) => v / M_PER_FT } : { unit: "m" };
}

export function speedConversion(units: Units): { unit: string; convert?: (v: number) => number } {
  return units === "imperial" ? { unit: "mph", convert: (v) => v / MPS_PER_MPH } : { unit: "m/s" };
}

/** Seconds as h:mm:ss or m:ss from the run's start. */
export function formatClock(s: number | null | undefined): string {
  if (!ok(s)) return none;
  const t = Math.max(0, Math.round(s));
  const h = Math.floor(t / 3600);
  const m = Math.floor((t % 3600) / 60);
  const sec = t % 60;
  const mm = h ? String(m).padStart(2, "0") : String(m);
  return `${h ? `${h}:` : ""}${mm}:${String(sec).padStart(2, "0")}`;
}

/** A span's length: "4.2 s", "3 min 05 s", "1 h 02 min". */
export function formatSpan(s: number | null | undefined): string {
  if (!ok(s)) return none;
  if (s < 60) return `${fixed(s, s < 10 ? 1 : 0)} s`;
  const t = Math.round(s);
  if (t < 3600) return `${Math.floor(t / 60)} min ${String(t % 60).padStart(2, "0")} s`;
  return `${Math.floor(t / 3600)} h ${String(Math.floor((t % 3600) / 60)).padStart(2, "0")} min`;
}
