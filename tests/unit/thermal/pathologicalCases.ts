/**
 * Cases that once hung or crashed the engine (absurd sizes, extreme coefficients, jumps
 * in conductivity), each with the field its refusal must name and the words of the
 * reason: shared by the engine and command-line regression tests.
 */

/** The longest an answer may take, wall clock, before a case counts as hung. */
export const ANSWER_WITHIN_MS = 5000

const steel = { k: 40, rho: 7850, cp: 475 }
/** A two-layer section: conductivity k1 to x = 0.5, k2 beyond (a jump at 0.5). */
const layered = (k1: number, k2: number) => ({
  profile: [{ x: 0, k: k1, rhoCp: 3.7e6 }, { x: 0.5, k: k1, rhoCp: 3.7e6 }, { x: 0.5, k: k2, rhoCp: 3.7e6 }, { x: 1, k: k2, rhoCp: 3.7e6 }],
})
const oilThenAir = [{ surface: { h: 800, ambient_C: 60 }, duration_s: 180 }, { surface: { h: 15, ambient_C: 25 } }]

/** The cases, each with the field its refusal must name. */
export const PATHOLOGICAL_CASES: { name: string; input: Record<string, unknown>; field: string; message: RegExp }[] = [
  {
    name: 'a slab 1e-300 m thick (looped for good)',
    input: { geometry: 'slab', size_m: 1e-300, material: steel, initial_C: 850, stages: oilThenAir, target: { below_C: 100 } },
    field: 'size_m',
    message: /must be between 0\.05 mm and 5 m/,
  },
  {
    name: 'a rod 1e-300 m in radius (looped for good)',
    input: { geometry: 'rod', size_m: 1e-300, material: steel, initial_C: 850, stages: oilThenAir, target: { below_C: 100 } },
    field: 'size_m',
    message: /must be between 0\.05 mm and 5 m/,
  },
  {
    name: 'a graded rod 1e-200 m in radius (looped for good)',
    input: {
      geometry: 'rod',
      size_m: 1e-200,
      material: { profile: [{ x: 0, k: 40, rhoCp: 3.7e6 }, { x: 0.9, k: 40, rhoCp: 3.7e6 }, { x: 0.9, k: 36, rhoCp: 3.7e6 }, { x: 1, k: 36, rhoCp: 3.7e6 }] },
      initial_C: 850,
      stages: oilThenAir,
      target: { below_C: 100 },
    },
    field: 'size_m',
    message: /must be between 0\.05 mm and 5 m/,
  },
  {
    name: 'a conductivity jump of 1e12 (crashed with a stack trace)',
    input: {
      geometry: 'slab',
      size_m: 0.02,
      material: layered(1e-6, 1e6),
      initial_C: 850,
      stages: oilThenAir,
      target: { below_C: 100 },
    },
    field: 'material.profile.0.k',
    message: /must be between 0\.1 W\/m·K and 500 W\/m·K/,
  },
  {
    name: 'a conductivity jump of 4000× inside the range (0.1 to 400 W/m·K)',
    input: {
      geometry: 'slab',
      size_m: 0.02,
      material: layered(0.1, 400),
      initial_C: 850,
      stages: oilThenAir,
      target: { below_C: 100 },
    },
    field: 'material.profile.2.k',
    message: /more than 1000×/,
  },
  {
    name: '1000 alternating profile points (crashed with a stack trace)',
    input: {
      geometry: 'slab',
      size_m: 0.05,
      material: { profile: Array.from({ length: 1000 }, (_, i) => ({ x: i / 999, k: i % 2 ? 10 : 60, rhoCp: i % 2 ? 3e6 : 4e6 })) },
      initial_C: 850,
      stages: oilThenAir,
      target: { below_C: 100 },
    },
    field: 'material.profile',
    message: /at most 64 points/,
  },
]
