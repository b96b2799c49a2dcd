/**
 * Seeded pseudo-random numbers for tests and the benchmark (mulberry32, a public-domain
 * 32-bit generator; common practice for reproducible test data). Never Math.random.
 */
export function createRandom(seed: number): () => number {
  let state = seed >>> 0
  return () => {
    state = (state + 0x6d2b79f5) >>> 0
    let z = state
    z = Math.imul(z ^ (z >>> 15), z | 1)
    z ^= z + Math.imul(z ^ (z >>> 7), z | 61)
    return ((z ^ (z >>> 14)) >>> 0) / 4294967296
  }
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
