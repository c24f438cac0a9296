import { RC_CHANNELS, sampleFields, type SampleBatch, type SampleField } from "./types";

/**
 * A view of samples [a, end) of a batch: every array is a subarray of the batch's own, no copy.
 * @example sliceBatch(batch, 2, 5).length // => 3
 */
export function sliceBatch(b: SampleBatch, a: number, end: number): SampleBatch {
  const columns = {} as Record<SampleField, Float64Array>;
  for (const f of sampleFields) columns[f] = b.columns[f].subarray(a, end);
  return {
    length: end - a,
    columns,
    rc: b.rc ? b.rc.subarray(a * RC_CHANNELS, end * RC_CHANNELS) : null,
    segmentStart: b.segmentStart.subarray(a, end),
    trackStart: b.trackStart.subarray(a, end),
    sourceLine: b.sourceLine.subarray(a, end),
  };
}
