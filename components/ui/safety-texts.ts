/** The standing cautions, as text: shown by SafetyNote and printed in the PDF debrief. */
export const safetyTexts = {
  general:
    "Sortie is review software, not an airworthiness or certification tool. Follow your local aviation authority's rules (line of sight, altitude limits, registration) and your local radio-power limits.",
  failsafe: "Bench-test failsafes with propellers off and wheels lifted. Confirm the result on the bench before the next run.",
  bench:
    "On the bench: propellers off, wheels lifted, the vehicle held down, and nobody within reach of anything that can move before you arm it and switch the transmitter off.",
  battery: "Lithium batteries can catch fire when over-discharged, damaged or charged wrongly. Charge on a fire-safe surface, never unattended.",
  range: "A range estimate comes from one run and does not replace a range check before flight.",
} as const;

export type SafetyTopic = keyof typeof safetyTexts;
