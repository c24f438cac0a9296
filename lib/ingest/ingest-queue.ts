import { ingestRun } from "./ingest-run";

/**
 * In-process ingest jobs. The route handler answers at once; parsing continues on this server
 * and its progress is read from the run row. At most two at a time on a 2-core machine, so reads
 * stay quick during bursts; more wait their turn in order.
 */
const MAX_PARALLEL = 2;
const g = globalThis as unknown as { sortieIngest?: { running: Set<number>; waiting: number[]; idle: (() => void)[] } };
const state = (g.sortieIngest ??= { running: new Set(), waiting: [], idle: [] });

function pump(): void {
  while (state.running.size < MAX_PARALLEL && state.waiting.length > 0) {
    const runId = state.waiting.shift()!;
    state.running.add(runId);
    ingestRun(runId)
      .catch((e) => console.error(`[ingest] run ${runId} crashed: ${(e as Error).message}`))
      .finally(() => {
        state.running.delete(runId);
        pump();
        if (state.running.size === 0 && state.waiting.length === 0) for (const f of state.idle.splice(0)) f();
      });
  }
}

export function startIngest(runId: number): void {
  if (state.running.has(runId) || state.waiting.includes(runId)) return;
  state.waiting.push(runId);
  pump();
}

export function ingestBusy(runId: number): boolean {
  return state.running.has(runId) || state.waiting.includes(runId);
}

/** Resolves when no ingest is running (for scripts that seed through the pipeline). */
export function ingestIdle(): Promise<void> {
  if (state.running.size === 0 && state.waiting.length === 0) return Promise.resolve();
  return new Promise((r) => state.idle.push(r));
}
