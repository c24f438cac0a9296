/**
 * Sheet check: reads a build's link sheet and failsafe plan (and, when given, facts gathered from
 * the build's logs) and says what looks wrong, why it matters and how to fix it. Pure: no I/O,
 * no clock. The facts from logs are gathered by lib/builds/sheet-evidence.ts.
 */
import type { ChannelFunction, FailsafeAction } from "@/db/schema/builds";

export type Severity = "error" | "warning" | "info";

export interface SheetChannel {
  channel: number;
  function: ChannelFunction;
  switchLabel: string | null;
  positions: number | null;
  engageMinUs: number | null;
  engageMaxUs: number | null;
  failsafeUs: number | null;
}

export interface SheetInput {
  channels: SheetChannel[];
  failsafeAction: FailsafeAction | null;
  failsafeWithinS: number | null;
  bandMhz: number | null;
  rxSensitivityDbm: number | null;
}

/** What one run's log says, gathered by sheet-evidence.ts (and made by hand in tests). */
export interface RunEvidence {
  runId: number;
  title: string;
  /** From the run's summary.failsafe; null when the run has no summary. */
  failsafe: { result: string | null; action: string | null; planAction: string | null } | null;
  /** From a stride sample of the run's stored RC channels; null when the log has none. */
  rc: RcFacts | null;
}

export interface RcFacts {
  /** Sampled rows that carried RC values. */
  rows: number;
  /** One entry per channel 1–18 (index = channel − 1). */
  channels: ChannelFacts[];
}

export interface ChannelFacts {
  /** Sampled rows where this channel had a value. */
  present: number;
  /**
   * How often each whole µs value was seen: `counts[v − COUNT_BASE_US]` for v in
   * COUNT_BASE_US…COUNT_BASE_US + counts.length − 1 (values outside are not counted).
   */
  counts: ArrayLike<number>;
  /** Pearson r with channels 1–4 (index 0–3); null when too few rows or either channel is flat. */
  stickR: (number | null)[];
}

/** The first µs value that ChannelFacts.counts holds. */
export const COUNT_BASE_US = 500;

/**
 * PWM conventions the rules rely on. Hobby radios put switch positions at 1000 / 1500 / 2000 µs
 * by default, with a few tens of µs of trim and endpoint variation, and the four sticks on
 * channels 1–4 in every common channel order — all common practice, not a published standard.
 */
export const PWM = {
  lowUs: 1000,
  highUs: 2000,
  /** Half-width of the window a switch position is expected in (common practice). */
  positionToleranceUs: 100,
  /** Values a hobby receiver can put out (common practice); outside this a range is a typo. */
  validMinUs: 800,
  validMaxUs: 2200,
} as const;

export const STICK_CHANNELS = [1, 2, 3, 4] as const;

/** Limits of the evidence rules — our own choices. */
export const EVIDENCE_LIMITS = {
  /** |r| with a stick channel above which an RSSI channel is taken to follow the sticks. */
  stickCorrelation: 0.8,
  /** Fewest sampled rows with the channel present before "never reached" is said. */
  minRows: 100,
} as const;

/** Functions set by a switch, which need an engage range. */
const SWITCH_FUNCTIONS: readonly ChannelFunction[] = ["arm", "return-to-home", "mission", "mode"];
/** Functions that belong on a switch at all (aux may carry a range, but need not). */
const SWITCHED: readonly ChannelFunction[] = [...SWITCH_FUNCTIONS, "aux"];

export const FUNCTION_WORDS: Record<ChannelFunction, string> = {
  roll: "roll",
  pitch: "pitch",
  throttle: "throttle",
  yaw: "yaw",
  arm: "arm",
  "return-to-home": "return to home",
  mission: "mission",
  mode: "mode",
  rssi: "RSSI",
  aux: "aux",
  unused: "unused",
};

const ACTION_WORDS: Record<string, string> = { "return-to-home": "return to home", hold: "hold", land: "land", none: "nothing" };

export interface RuleDef {
  severity: Severity;
  title: string;
  /** Why it matters, in plain words. */
  why: string;
  /** How to fix it. */
  fix: string;
}

/** Every rule the check knows, in the order findings are listed within a severity. */
export const SHEET_RULES = {
  "arm-duplicate": {
    severity: "error",
    title: "Arm is on more than one channel",
    why: "With two arm channels the vehicle may arm from a switch you did not mean to touch, or stay armed when you flip the one you think disarms it.",
    fix: "Keep arm on the one channel your arm switch drives and set the other to its real function or to unused.",
  },
  "arm-missing": {
    severity: "warning",
    title: "No channel arms the vehicle",
    why: "Without an arm channel on the sheet nobody can tell from the sheet how the vehicle is armed and disarmed, and the armed/disarmed check before a run has nothing to point at.",
    fix: "Mark the channel your arm switch drives as arm, with the range in which it arms.",
  },
  "rth-duplicate": {
    severity: "error",
    title: "Return to home is on more than one channel",
    why: "Two channels that both command return to home can fight each other, and the failsafe analysis reads only one of them, so its result may not match what the vehicle did.",
    fix: "Keep return to home on one channel and set the other to its real function or to unused.",
  },
  "rth-missing": {
    severity: "warning",
    title: "No channel commands return to home",
    why: "Without a return-to-home channel you cannot bring the vehicle back from the radio, and a failsafe plan of return to home has no channel to act through.",
    fix: "Mark the channel of your return-to-home switch, or note in the build why this vehicle has none.",
  },
  "mission-duplicate": {
    severity: "error",
    title: "Mission is on more than one channel",
    why: "Two channels that start the mission make it unclear which switch the pilot must use to start or pause the route.",
    fix: "Keep mission on one channel and set the other to its real function or to unused.",
  },
  "mission-missing": {
    severity: "warning",
    title: "No channel starts the mission",
    why: "Route plans are flown or driven in mission mode; without a mission channel the sheet does not say how a run is started or paused.",
    fix: "Mark the channel of the switch that starts the mission.",
  },
  "rssi-on-stick": {
    severity: "error",
    title: "RSSI is on a stick channel",
    why: "Channels 1–4 carry the sticks in every common channel order (common practice). A receiver that writes RSSI there overwrites a control, and a log reading that channel as signal strength shows stick movement instead.",
    fix: "Have the receiver put RSSI on a spare channel above 4 and record that channel as RSSI.",
  },
  "rssi-duplicate": {
    severity: "error",
    title: "More than one channel is marked RSSI",
    why: "A receiver reports RSSI on one channel. With two marked, the link analysis may read the wrong one.",
    fix: "Keep RSSI on the channel the receiver writes it to and set the other to its real function.",
  },
  "rssi-has-switch": {
    severity: "warning",
    title: "The RSSI channel also has a switch or an engage range",
    why: "RSSI is a value the receiver reports, not something a switch commands. A switch or engage range recorded on it suggests a function was left on the RSSI channel — a common setup mistake.",
    fix: "Remove the switch and engage range from the RSSI channel, or move the function to its own channel.",
  },
  "failsafe-plan-incomplete": {
    severity: "warning",
    title: "The failsafe plan is not complete",
    why: "The analysis compares every link loss with the plan: what the vehicle should do and how soon. Without both it cannot say whether the failsafe passed, was late or did the wrong thing.",
    fix: "Choose the expected action and the time within which it should start.",
  },
  "failsafe-no-channel": {
    severity: "error",
    title: "No channel carries the planned failsafe action",
    why: "When the link is lost the receiver outputs its failsafe values; the planned action happens only if a channel's failsafe value engages it. With no such channel the vehicle may hold its last stick values instead.",
    fix: "Record the channel that commands the planned action (return to home, or the mode channel for hold or land) and its failsafe value.",
  },
  "failsafe-value-missing": {
    severity: "error",
    title: "The failsafe channel has no failsafe value",
    why: "Without the value the receiver sends on link loss, nobody can check that the link loss commands the planned action.",
    fix: "Read the receiver's failsafe value for that channel on the bench (transmitter off) and record it.",
  },
  "failsafe-value-outside": {
    severity: "error",
    title: "The failsafe value does not engage the planned action",
    why: "On link loss the receiver sends this value; it lies outside the channel's engage range, so the planned action will not start.",
    fix: "Set the receiver's failsafe for that channel to a value inside the engage range, then bench-test it with the transmitter off.",
  },
  "engage-range-invalid": {
    severity: "error",
    title: "An engage range is not a usable range",
    why: "A range with only one end, with its ends swapped, or outside 800–2200 µs (beyond what hobby receivers put out, common practice) cannot be met, so the checks that depend on it are meaningless.",
    fix: "Enter both ends, lower first, in µs as the receiver reports them.",
  },
  "engage-range-missing": {
    severity: "warning",
    title: "A switch function has no engage range",
    why: "Without the range in which the function engages, neither the sheet check nor the failsafe analysis can tell whether a value engages it.",
    fix: "Flip the switch on the bench, read the channel's value in each position, and record the range that engages the function.",
  },
  "engage-overlap": {
    severity: "error",
    title: "Two functions on one switch engage at the same position",
    why: "Where the engage ranges of two functions on the same switch overlap, one position engages both at once.",
    fix: "Give each function on the switch its own positions so the ranges do not overlap.",
  },
  "switch-never-engages": {
    severity: "error",
    title: "No switch position reaches the engage range",
    why: "Switch positions sit near 1000, 1500 and 2000 µs (± 100 µs, common practice; evenly spaced for switches with more positions). None of this switch's positions falls in the range, so the function cannot be engaged from the switch.",
    fix: "Correct the range to the values the switch really gives, or correct the number of positions.",
  },
  "switch-position-unassigned": {
    severity: "warning",
    title: "A switch position does nothing",
    why: "One position of a switch can be the 'off' position; more than one that engages nothing means a position was left unassigned, and a pilot flipping to it under stress gets no response.",
    fix: "Assign the spare position a function, or record the switch with fewer positions.",
  },
  "switch-position-edge": {
    severity: "warning",
    title: "A switch position sits on the edge of an engage range",
    why: "The position's value is within 100 µs of where the range starts or ends (common practice tolerance), so small trim or endpoint changes decide whether the function engages.",
    fix: "Widen or move the range so each position lies clearly inside or clearly outside it.",
  },
  "band-missing": {
    severity: "info",
    title: "The link band is not recorded",
    why: "The range estimate draws the free-space reference (ITU-R P.525) from the band; without it only the fit from the log is shown.",
    fix: "Enter the link's band in MHz (for example 868 or 2440).",
  },
  "sensitivity-missing": {
    severity: "warning",
    title: "The receiver sensitivity is not recorded",
    why: "The range estimate and the dBm fade threshold are measured from the receiver's sensitivity; without it a general default is used and the estimate may be far off.",
    fix: "Enter the receiver's sensitivity in dBm from its documentation.",
  },
  "logs-rssi-follows-sticks": {
    severity: "error",
    title: "The RSSI channel moves with the sticks in the logs",
    why: "A channel that carries RSSI should follow the signal, not the pilot's hands. When it rises and falls with a stick channel, the channel is carrying a control (or the wrong channel is marked RSSI), and the link analysis is reading stick movement.",
    fix: "Check which channel the receiver writes RSSI to and correct the sheet, or move the control off that channel.",
  },
  "logs-failsafe-action": {
    severity: "error",
    title: "A failsafe in the logs did something other than the plan",
    why: "The failsafe fired, but the vehicle did not do what the plan says. The receiver's failsafe values or the flight controller's failsafe setting do not match the plan.",
    fix: "Bench-test the failsafe (propellers off, wheels lifted, transmitter off) and correct the receiver or flight-controller setting — or the plan, if the vehicle's behaviour is the one you want.",
  },
  "logs-engage-unreached": {
    severity: "warning",
    title: "The logs never show a switch inside its engage range",
    why: "In the logged runs this channel's values never entered the recorded engage range. Either the function was not used in these runs, the range is wrong, or the switch is reversed.",
    fix: "Flip the switch on the bench and compare its values with the sheet; reverse the channel on the transmitter or correct the range.",
  },
} as const satisfies Record<string, RuleDef>;

export type RuleId = keyof typeof SHEET_RULES;
export const RULE_IDS = Object.keys(SHEET_RULES) as RuleId[];

export interface Finding extends RuleDef {
  rule: RuleId;
  /** What exactly was found, naming channels, values and runs. */
  detail: string;
  channels: number[];
  runIds: number[];
}

export interface SheetCheckResult {
  findings: Finding[];
  counts: Record<Severity, number>;
  evidence: { runs: number; runsWithRc: number };
}

// ---- helpers -------------------------------------------------------------------------------

const validRange = (c: SheetChannel): c is SheetChannel & { engageMinUs: number; engageMaxUs: number } =>
  c.engageMinUs != null &&
  c.engageMaxUs != null &&
  c.engageMinUs <= c.engageMaxUs &&
  c.engageMinUs >= PWM.validMinUs &&
  c.engageMaxUs <= PWM.validMaxUs;

const list = (cs: number[]) => (cs.length === 1 ? `channel ${cs[0]}` : `channels ${cs.slice(0, -1).join(", ")} and ${cs[cs.length - 1]}`);
const us = (v: number) => `${Math.round(v)} µs`;
const span = (min: number, max: number) => `${Math.round(min)}–${Math.round(max)} µs`;

/**
 * Where the positions of an n-position switch sit: evenly from 1000 to 2000 µs (common practice),
 * with the window each is expected in: ± 100 µs, narrowed to a quarter of the step for switches
 * of more than 3 positions so neighbouring windows never touch.
 * @example switchPositions(3) // => { values: [1000, 1500, 2000], toleranceUs: 100 }
 */
export function switchPositions(n: number): { values: number[]; toleranceUs: number } {
  const step = (PWM.highUs - PWM.lowUs) / (n - 1);
  return {
    values: Array.from({ length: n }, (_, k) => Math.round(PWM.lowUs + k * step)),
    toleranceUs: Math.min(PWM.positionToleranceUs, Math.floor(step / 4)),
  };
}

/** Share of the position's window inside the range: "in" wholly, "out" wholly, or on the "edge". */
function positionAgainst(p: number, tol: number, min: number, max: number): "in" | "out" | "edge" {
  if (p - tol >= min && p + tol <= max) return "in";
  if (p + tol < min || p - tol > max) return "out";
  return "edge";
}

/** Which action channel the plan acts through: return to home has its own, hold and land are modes. */
export function planFunction(action: FailsafeAction): ChannelFunction {
  return action === "return-to-home" ? "return-to-home" : "mode";
}

/** Values seen in [min, max] µs. */
export function countIn(f: ChannelFacts, min: number, max: number): number {
  let n = 0;
  const lo = Math.max(0, Math.ceil(min) - COUNT_BASE_US);
  const hi = Math.min(f.counts.length - 1, Math.floor(max) - COUNT_BASE_US);
  for (let i = lo; i <= hi; i++) n += f.counts[i];
  return n;
}

// ---- the check -----------------------------------------------------------------------------

/**
 * Runs every rule of {@link SHEET_RULES} over the sheet, and the `logs-*` rules over `evidence`.
 * Findings come sorted by severity (error, warning, info), then in rule order, then by channel.
 *
 * Cost: O(channels² + runs × channels × PWM span). Pure.
 *
 * @param sheet the link sheet (18 channels), failsafe plan, band and sensitivity
 * @param evidence facts per run from the build's logs (none: only the sheet is checked)
 * @example
 * checkSheet({ channels, failsafeAction: "return-to-home", failsafeWithinS: 1.5, bandMhz: 868, rxSensitivityDbm: -112 }).counts
 * // => { error: 0, warning: 0, info: 0 } for a complete, consistent sheet
 */
export function checkSheet(sheet: SheetInput, evidence: RunEvidence[] = []): SheetCheckResult {
  const out: Finding[] = [];
  const add = (rule: RuleId, detail: string, channels: number[] = [], runIds: number[] = []) =>
    out.push({ rule, ...SHEET_RULES[rule], detail, channels: [...channels].sort((a, b) => a - b), runIds });
  const chs = [...sheet.channels].sort((a, b) => a.channel - b.channel);
  const withFn = (fn: ChannelFunction) => chs.filter((c) => c.function === fn);

  // Each of arm, return to home and mission on exactly one channel.
  const counted: [ChannelFunction, RuleId, RuleId][] = [
    ["arm", "arm-duplicate", "arm-missing"],
    ["return-to-home", "rth-duplicate", "rth-missing"],
    ["mission", "mission-duplicate", "mission-missing"],
  ];
  for (const [fn, dup, missing] of counted) {
    const on = withFn(fn).map((c) => c.channel);
    if (on.length > 1) add(dup, `${FUNCTION_WORDS[fn][0].toUpperCase()}${FUNCTION_WORDS[fn].slice(1)} is on ${list(on)}.`, on);
    if (on.length === 0) add(missing, `No channel is marked ${FUNCTION_WORDS[fn]}.`);
  }

  // RSSI: off the sticks, once, and carrying no control.
  const rssi = withFn("rssi");
  const onSticks = rssi.filter((c) => (STICK_CHANNELS as readonly number[]).includes(c.channel)).map((c) => c.channel);
  if (onSticks.length) add("rssi-on-stick", `RSSI is marked on ${list(onSticks)}.`, onSticks);
  if (rssi.length > 1) add("rssi-duplicate", `RSSI is marked on ${list(rssi.map((c) => c.channel))}.`, rssi.map((c) => c.channel));
  for (const c of rssi) {
    const extras = [c.switchLabel && `switch “${c.switchLabel}”`, c.positions != null && `${c.positions} positions`, (c.engageMinUs != null || c.engageMaxUs != null) && "an engage range"].filter(Boolean);
    if (extras.length) add("rssi-has-switch", `Channel ${c.channel} is marked RSSI but also has ${extras.join(", ")}.`, [c.channel]);
  }

  // Engage ranges: usable, present where a switch function needs one.
  for (const c of chs) {
    if (c.function === "unused" || c.function === "rssi") continue;
    const hasAny = c.engageMinUs != null || c.engageMaxUs != null;
    if (hasAny && !validRange(c)) {
      const why =
        c.engageMinUs == null || c.engageMaxUs == null
          ? "has only one end"
          : c.engageMinUs > c.engageMaxUs
            ? `runs backwards (${us(c.engageMinUs)} to ${us(c.engageMaxUs)})`
            : `reaches outside ${PWM.validMinUs}–${PWM.validMaxUs} µs (${us(c.engageMinUs)} to ${us(c.engageMaxUs)})`;
      add("engage-range-invalid", `The engage range of channel ${c.channel} (${FUNCTION_WORDS[c.function]}) ${why}.`, [c.channel]);
    }
    if (!hasAny && SWITCH_FUNCTIONS.includes(c.function))
      add("engage-range-missing", `Channel ${c.channel} (${FUNCTION_WORDS[c.function]}) has no engage range.`, [c.channel]);
  }

  // Failsafe plan: complete, and acted on through a channel whose failsafe value engages it.
  if (!sheet.failsafeAction || sheet.failsafeWithinS == null) {
    const missing = [!sheet.failsafeAction && "the expected action", sheet.failsafeWithinS == null && "the expected time"].filter(Boolean).join(" and ");
    add("failsafe-plan-incomplete", `The plan is missing ${missing}.`);
  }
  if (sheet.failsafeAction) {
    const fn = planFunction(sheet.failsafeAction);
    const carriers = withFn(fn);
    const planWords = ACTION_WORDS[sheet.failsafeAction];
    if (carriers.length === 0) {
      add("failsafe-no-channel", `The plan is ${planWords}, but no channel is marked ${FUNCTION_WORDS[fn]}${fn === "mode" ? " (hold and land are flight or drive modes)" : ""}.`);
    } else if (!carriers.some((c) => validRange(c) && c.failsafeUs != null && c.failsafeUs >= c.engageMinUs && c.failsafeUs <= c.engageMaxUs)) {
      const valued = carriers.filter((c) => c.failsafeUs != null);
      if (valued.length === 0) {
        add("failsafe-value-missing", `The plan is ${planWords}; ${list(carriers.map((c) => c.channel))} (${FUNCTION_WORDS[fn]}) has no failsafe value.`, carriers.map((c) => c.channel));
      } else {
        for (const c of valued.filter(validRange))
          add(
            "failsafe-value-outside",
            `The plan is ${planWords}; channel ${c.channel} goes to ${us(c.failsafeUs!)} on link loss, outside its engage range ${span(c.engageMinUs!, c.engageMaxUs!)}.`,
            [c.channel],
          );
      }
    }
  }

  // Switches: channels sharing a switch label are one switch; a channel with no label is its own.
  const groups = new Map<string, SheetChannel[]>();
  for (const c of chs) {
    if (!SWITCHED.includes(c.function)) continue;
    const key = c.switchLabel?.trim().toLowerCase() || `#${c.channel}`;
    groups.set(key, [...(groups.get(key) ?? []), c]);
  }
  for (const members of groups.values()) {
    const ranged = members.filter(validRange);
    const name = members[0].switchLabel?.trim() ? `switch “${members[0].switchLabel!.trim()}”` : `the switch on channel ${members[0].channel}`;
    for (let i = 0; i < ranged.length; i++)
      for (let j = i + 1; j < ranged.length; j++) {
        const [a, b] = [ranged[i], ranged[j]];
        if (a.engageMaxUs >= b.engageMinUs && b.engageMaxUs >= a.engageMinUs)
          add(
            "engage-overlap",
            `On ${name}, channel ${a.channel} (${FUNCTION_WORDS[a.function]}, ${span(a.engageMinUs, a.engageMaxUs)}) and channel ${b.channel} (${FUNCTION_WORDS[b.function]}, ${span(b.engageMinUs, b.engageMaxUs)}) overlap.`,
            [a.channel, b.channel],
          );
      }
    const n = Math.max(0, ...members.map((c) => c.positions ?? 0));
    if (n < 2 || ranged.length === 0 || ranged.length < members.filter((c) => SWITCH_FUNCTIONS.includes(c.function)).length) continue;
    const { values, toleranceUs } = switchPositions(n);
    const where = values.map((p) => {
      const states = ranged.map((c) => positionAgainst(p, toleranceUs, c.engageMinUs, c.engageMaxUs));
      return { p, in: states.includes("in"), edge: states.includes("edge") };
    });
    const channels = ranged.map((c) => c.channel);
    for (const c of ranged)
      if (!values.some((p) => positionAgainst(p, toleranceUs, c.engageMinUs, c.engageMaxUs) !== "out"))
        add("switch-never-engages", `On ${name} (${n} positions at ${values.map(us).join(", ")}), none reaches channel ${c.channel}'s range ${span(c.engageMinUs, c.engageMaxUs)}.`, [c.channel]);
    const idle = where.filter((w) => !w.in && !w.edge);
    if (idle.length > 1 && where.some((w) => w.in))
      add("switch-position-unassigned", `On ${name}, the positions at ${idle.map((w) => `≈${us(w.p)}`).join(" and ")} engage nothing.`, channels);
    for (const w of where.filter((x) => x.edge))
      add("switch-position-edge", `On ${name}, the position at ≈${us(w.p)} (± ${toleranceUs} µs) straddles an engage-range boundary.`, channels);
  }

  // What the range estimate needs.
  if (sheet.bandMhz == null) add("band-missing", "The build has no link band.");
  if (sheet.rxSensitivityDbm == null) add("sensitivity-missing", "The build has no receiver sensitivity.");

  // Evidence from the logs.
  const withRc = evidence.filter((e) => e.rc && e.rc.rows > 0);
  for (const c of rssi) {
    const hits: { run: RunEvidence; stick: number; r: number }[] = [];
    for (const e of withRc) {
      const f = e.rc!.channels[c.channel - 1];
      if (!f) continue;
      let best: { stick: number; r: number } | null = null;
      for (let k = 0; k < f.stickR.length; k++) {
        const r = f.stickR[k];
        if (r == null || k + 1 === c.channel) continue;
        if (Math.abs(r) > EVIDENCE_LIMITS.stickCorrelation && (!best || Math.abs(r) > Math.abs(best.r))) best = { stick: k + 1, r };
      }
      if (best) hits.push({ run: e, ...best });
    }
    if (hits.length)
      add(
        "logs-rssi-follows-sticks",
        `Channel ${c.channel} (RSSI) ${hits.map((h) => `moves with channel ${h.stick} (r = ${h.r.toFixed(2)}) in “${h.run.title}”`).join("; ")}.`,
        [c.channel],
        hits.map((h) => h.run.runId),
      );
  }
  const wrong = evidence.filter((e) => {
    const done = e.failsafe?.action;
    const planned = sheet.failsafeAction ?? e.failsafe?.planAction ?? null;
    return done && done !== "none" && planned && done !== planned;
  });
  if (wrong.length)
    add(
      "logs-failsafe-action",
      wrong.map((e) => `In “${e.title}” the vehicle did ${ACTION_WORDS[e.failsafe!.action!] ?? e.failsafe!.action} after the failsafe; the plan is ${ACTION_WORDS[sheet.failsafeAction ?? e.failsafe!.planAction!]}.`).join(" "),
      [],
      wrong.map((e) => e.runId),
    );
  for (const c of chs.filter((x) => SWITCH_FUNCTIONS.includes(x.function) && validRange(x))) {
    let present = 0;
    let inside = 0;
    let mirrored = 0;
    for (const e of withRc) {
      const f = e.rc!.channels[c.channel - 1];
      if (!f) continue;
      present += f.present;
      inside += countIn(f, c.engageMinUs!, c.engageMaxUs!);
      // Reflected about the centre (1500 µs): where a reversed switch would put the range.
      mirrored += countIn(f, PWM.lowUs + PWM.highUs - c.engageMaxUs!, PWM.lowUs + PWM.highUs - c.engageMinUs!);
    }
    if (present >= EVIDENCE_LIMITS.minRows && inside === 0) {
      const reversed = mirrored > 0 ? ` It does reach the mirrored range ${span(PWM.lowUs + PWM.highUs - c.engageMaxUs!, PWM.lowUs + PWM.highUs - c.engageMinUs!)}, so the switch may be reversed.` : "";
      add(
        "logs-engage-unreached",
        `Channel ${c.channel} (${FUNCTION_WORDS[c.function]}) never entered ${span(c.engageMinUs!, c.engageMaxUs!)} in ${present} sampled rows of ${withRc.length} run${withRc.length === 1 ? "" : "s"}.${reversed}`,
        [c.channel],
        withRc.filter((e) => (e.rc!.channels[c.channel - 1]?.present ?? 0) > 0).map((e) => e.runId),
      );
    }
  }

  const sevRank: Record<Severity, number> = { error: 0, warning: 1, info: 2 };
  const ruleRank = new Map(RULE_IDS.map((r, i) => [r, i]));
  out.sort((a, b) => sevRank[a.severity] - sevRank[b.severity] || ruleRank.get(a.rule)! - ruleRank.get(b.rule)! || (a.channels[0] ?? 0) - (b.channels[0] ?? 0));
  const counts: Record<Severity, number> = { error: 0, warning: 0, info: 0 };
  for (const f of out) counts[f.severity]++;
  return { findings: out, counts, evidence: { runs: evidence.length, runsWithRc: withRc.length } };
}
