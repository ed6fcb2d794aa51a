/**
 * Seeded Gaussian noise for synthetic logs: the Park–Miller minimal standard
 * generator (Park & Miller, CACM 31 (1988) 1192) fed through the Box–Muller
 * transform, so a failing figure can be reproduced exactly.
 */
export function gaussianNoise(sd_K: number, seed: number): () => number {
  let state = seed % 2147483647 || 1
  const uniform = () => {
    state = (state * 16807) % 2147483647
    return state / 2147483647
  }
  return () => sd_K * Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform())
}
