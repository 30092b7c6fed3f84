/**
 * Order statistics for the shop's reports.
 *
 * Median: the middle value, or the mean of the two middle values for an even count (the usual
 * textbook definition; NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.5.1 "Measures of
 * Location").
 *
 * Percentile: the nearest-rank method: the P-th percentile of N sorted values is the value at rank
 * ⌈P/100 × N⌉ (1-based), so it is always a figure that really happened ("9 jobs in 10 left
 * Fabricate within this many business days"). NIST e-Handbook 7.2.6.2 lists it among the
 * definitions in use; it is the one a person can check by counting.
 */
export function median(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

export function percentile(values: readonly number[], p: number): number | null {
  if (values.length === 0) return null;
  if (!(p > 0 && p <= 100)) throw new RangeError(`A percentile is above 0 and at most 100; got ${p}`);
  const sorted = [...values].sort((a, b) => a - b);
  const rank = Math.ceil((p / 100) * sorted.length);
  return sorted[rank - 1];
}
