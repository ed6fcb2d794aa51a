/** Median, 95th percentile and maximum of some samples (nearest-rank). */
export function quantiles(samples: number[]): { median: number; p95: number; max: number } {
  const sorted = [...samples].sort((a, b) => a - b)
  const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!
  return { median: at(0.5), p95: at(0.95), max: sorted.at(-1)! }
}
