/**
 * Reference values computed with mpmath by scripts/reference/generate.py
 * (tests/fixtures/reference-values.json): stored as 30-digit decimal strings, read here as numbers.
 */
import fixture from '../fixtures/reference-values.json'
import type { Geometry } from '../../server/thermal/types'

export const referenceHeader = fixture.header

export const besselValues = fixture.besselValues.map((row) => ({ x: Number(row.x), J0: Number(row.J0), J1: Number(row.J1) }))

export const besselZeros = {
  J0: fixture.besselZeros.J0.map(Number),
  J1: fixture.besselZeros.J1.map(Number),
}

export interface BiotRoots {
  geometry: Geometry
  bi: number
  /** λ_1 … λ_6 of the symmetric body. */
  roots: number[]
  /** C_n of a uniform initial excess for each root. */
  coefficients: number[]
}

const geometries: Geometry[] = ['slab', 'rod', 'sphere']

export const biotRoots: BiotRoots[] = geometries.flatMap((geometry) =>
  fixture.biotRoots[geometry].map((row) => ({
    geometry,
    bi: Number(row.bi),
    roots: row.roots.map(Number),
    coefficients: row.coefficients.map(Number),
  })),
)

/** The first root and coefficient for one geometry and Biot number of the grid. */
export function firstMode(geometry: Geometry, bi: number): { zeta: number; c1: number } {
  const row = biotRoots.find((r) => r.geometry === geometry && r.bi === bi)
  if (!row) throw new Error(`no reference roots for ${geometry} at Bi = ${bi}`)
  return { zeta: row.roots[0]!, c1: row.coefficients[0]! }
}

/** Centre excess ratio (T − T∞)/(T₀ − T∞) of a uniform start, the full series; bi = Infinity is a held surface. */
export const centreSeries = geometries.flatMap((geometry) =>
  fixture.centreSeries[geometry].map((row) => ({
    geometry,
    bi: row.bi === 'inf' ? Infinity : Number(row.bi),
    fo: Number(row.fo),
    centreRatio: Number(row.centreRatio),
  })),
)

/** Σ 2(−1)^{n+1} sin(nπx)/(nπx) e^{−n²π²Fo}: a sphere whose surface is held from t = 0. */
export const fixedSurfaceSphere = fixture.fixedSurfaceSphere.map((row) => ({ x: Number(row.x), fo: Number(row.fo), ratio: Number(row.ratio) }))
