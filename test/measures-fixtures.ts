// Builders of small test matrices for the measures' tests (no module under test here).
import type { Csr } from '../extension/src/engine/matrix/csr';
import { mulberry32 } from '../extension/src/engine/random/seeded-random';
import { distancesFromGram } from '../extension/src/engine/measures/gram-distances';
import { knnFromSimilarities, neighborDistances } from '../extension/src/engine/measures/knn';
import { sampleSimilarities } from '../extension/src/engine/measures/sample-similarity';

/** Dense rows → CSR, dropping zeros. */
export function denseToCsr(rows: number[][], cols = rows[0]?.length ?? 0): Csr {
  const indptr = new Uint32Array(rows.length + 1);
  const indices: number[] = [];
  const data: number[] = [];
  rows.forEach((row, r) => {
    row.forEach((v, c) => {
      if (v !== 0) {
        indices.push(c);
        data.push(v);
      }
    });
    indptr[r + 1] = indices.length;
  });
  return { rows: rows.length, cols, indptr, indices: Uint32Array.from(indices), data: Float64Array.from(data) };
}

/** Random non-negative sparse rows, l2-normalised; `emptyEvery` > 0 leaves every such row empty. */
export function randomUnitRows(random: () => number, n: number, cols: number, density: number, emptyEvery = 0): number[][] {
  const rows: number[][] = [];
  for (let r = 0; r < n; r++) {
    const row: number[] = new Array<number>(cols).fill(0);
    if (!(emptyEvery > 0 && r % emptyEvery === emptyEvery - 1)) {
      for (let c = 0; c < cols; c++) if (random() < density) row[c] = random();
      if (!row.some((v) => v !== 0)) row[Math.floor(random() * cols)] = 1;
      const norm = Math.hypot(...row);
      for (let c = 0; c < cols; c++) row[c]! /= norm;
    }
    rows.push(row);
  }
  return rows;
}

/**
 * A standard normal draw by the Box–Muller transform (Box & Muller, "A note on the generation of
 * random normal deviates", Ann. Math. Stat. 29, 1958); 1 − u keeps the logarithm's argument in (0, 1].
 */
export function standardNormal(random: () => number): number {
  const u = 1 - random();
  const v = random();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

/**
 * k nearest neighbours of point clouds by distance, through the engine's own ranking: the nearest
 * point is the one with the largest −distance. Returns the m×k neighbour distances as well.
 */
export function knnByDistance(dist: Float64Array, m: number, k: number, valid: Uint8Array): { neighbors: Uint32Array; distances: Float64Array } {
  const { neighbors } = knnFromSimilarities(dist.map((d) => -d), m, k, valid);
  return { neighbors, distances: neighborDistances(dist, m, neighbors, k) };
}

/** n iid standard normal points in d dimensions, row-major. */
export function gaussianPoints(random: () => number, n: number, d: number): Float64Array {
  const out = new Float64Array(n * d);
  for (let i = 0; i < out.length; i++) out[i] = standardNormal(random);
  return out;
}

/** Row-major dense points as a CSR matrix with every entry stored. */
export function pointsToCsr(points: Float64Array, n: number, d: number): Csr {
  const indptr = new Uint32Array(n + 1);
  const indices = new Uint32Array(n * d);
  for (let r = 0; r < n; r++) {
    indptr[r + 1] = (r + 1) * d;
    for (let c = 0; c < d; c++) indices[r * d + c] = c;
  }
  return { rows: n, cols: d, indptr, indices, data: Float64Array.from(points) };
}

/** Euclidean distance matrix of raw (unnormalised) points through the engine's Gram path. */
export function euclideanDistances(points: Float64Array, n: number, d: number): Float64Array {
  const all = new Uint32Array(n);
  for (let i = 0; i < n; i++) all[i] = i;
  return distancesFromGram(sampleSimilarities(pointsToCsr(points, n, d), all), n);
}

export function allValid(m: number): Uint8Array {
  return new Uint8Array(m).fill(1);
}

export function dot(a: readonly number[], b: readonly number[]): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i]! * b[i]!;
  return s;
}

/**
 * n points uniform in the unit d-cube, mapped into `ambient` dimensions by d random orthonormal
 * directions (Gram–Schmidt on Gaussian vectors): a rotation, so distances are those of the cube.
 */
export function embeddedCube(random: () => number, n: number, d: number, ambient: number): Float64Array {
  const basis: Float64Array[] = [];
  for (let b = 0; b < d; b++) {
    const v = new Float64Array(ambient);
    for (let i = 0; i < ambient; i++) v[i] = standardNormal(random);
    for (const u of basis) {
      let p = 0;
      for (let i = 0; i < ambient; i++) p += u[i]! * v[i]!;
      for (let i = 0; i < ambient; i++) v[i]! -= p * u[i]!;
    }
    let norm = 0;
    for (let i = 0; i < ambient; i++) norm += v[i]! * v[i]!;
    norm = Math.sqrt(norm);
    for (let i = 0; i < ambient; i++) v[i]! /= norm;
    basis.push(v);
  }
  const out = new Float64Array(n * ambient);
  for (let p = 0; p < n; p++) {
    for (let b = 0; b < d; b++) {
      const c = random();
      const u = basis[b]!;
      for (let i = 0; i < ambient; i++) out[p * ambient + i]! += c * u[i]!;
    }
  }
  return out;
}

const cubeCache = new Map<string, Float64Array>();

/**
 * Distances of n points uniform in the unit d-cube rotated into `ambient` dimensions, computed
 * once per process: the TwoNN and MLE checks share them.
 */
export function cubeDistances(d: number, n = 2000, ambient = 100, seed = 40): Float64Array {
  const key = `${d}/${n}/${ambient}/${seed}`;
  let dist = cubeCache.get(key);
  if (dist === undefined) {
    dist = euclideanDistances(embeddedCube(mulberry32(seed + d), n, d, ambient), n, ambient);
    cubeCache.set(key, dist);
  }
  return dist;
}

/** Distances of n points uniform on the flat d-torus [0, 1)^d (wrap-around, no boundary). */
export function torusDistances(random: () => number, n: number, d: number): Float64Array {
  const x = new Float64Array(n * d);
  for (let i = 0; i < x.length; i++) x[i] = random();
  const dist = new Float64Array(n * n);
  for (let a = 0; a < n; a++) {
    for (let b = a + 1; b < n; b++) {
      let s = 0;
      for (let c = 0; c < d; c++) {
        let diff = Math.abs(x[a * d + c]! - x[b * d + c]!);
        if (diff > 0.5) diff = 1 - diff;
        s += diff * diff;
      }
      dist[a * n + b] = dist[b * n + a] = Math.sqrt(s);
    }
  }
  return dist;
}
