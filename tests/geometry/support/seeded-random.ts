import { createMulberry32 } from '../../helpers/seeded-random'

/**
 * Seeded uniform numbers in [0, 1) with 32 random bits, for tests and the benchmark (the
 * same mulberry32 stream as tests/helpers/seeded-random.ts). Never Math.random.
 */
export function createRandom(seed: number): () => number {
  const next32 = createMulberry32(seed)
  return () => next32() / 4294967296
}

/**
 * `count` random cubic Béziers with control points in [0, size]² and rays from a point in
 * that square in a uniformly random direction, packed: cubics 8 values, rays 4 (ox, oy, dx, dy).
 */
export function createRayCubicPairs(seed: number, count: number, size = 100): { cubics: Float64Array; rays: Float64Array } {
  const random = createRandom(seed)
  const cubics = new Float64Array(8 * count)
  const rays = new Float64Array(4 * count)
  for (let i = 0; i < count; i++) {
    for (let k = 0; k < 8; k++) cubics[8 * i + k] = random() * size
    const angle = random() * 2 * Math.PI
    rays[4 * i] = random() * size
    rays[4 * i + 1] = random() * size
    rays[4 * i + 2] = Math.cos(angle)
    rays[4 * i + 3] = Math.sin(angle)
  }
  return { cubics, rays }
}
