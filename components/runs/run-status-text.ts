/** Run states in the words the pages use. */
export const runStatusText: Record<string, string> = {
  queued: "Waiting to be read",
  parsing: "Reading the log",
  analysing: "Analysing",
  ready: "Ready",
  failed: "Could not be read",
};
