/**
 * Seeded pseudo-random numbers for tests: mulberry32 (a small 32-bit generator in common
 * practice), combined into 53-bit doubles. Never Math.random: every failure can be replayed
 * from the seed it prints.
 */
export interface SeededRandom {
  readonly seed: number
  /** Uniform in [0, 1) with 53 random bits. */
  next(): number
  /** Uniform in [low, high). */
  uniform(low: number, high: number): number
  /** Integer uniform in [low, high] (both inclusive). */
  integer(low: number, high: number): number
  /** +1 or −1 with equal chance. */
  sign(): 1 | -1
  /** ±2^e with e uniform in [minExponent, maxExponent), mantissa uniform in [1, 2). */
  logUniform(minExponent: number, maxExponent: number): number
  /** One element of a non-empty list. */
  pick<T>(items: readonly T[]): T
}

/** The mulberry32 stream of 32-bit unsigned integers for a seed. */
export function createMulberry32(seed: number): () => number {
  let state = seed >>> 0
  return () => {
    state = (state + 0x6d2b79f5) >>> 0
    let t = state
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return (t ^ (t >>> 14)) >>> 0
  }
}

export function createSeededRandom(seed: number): SeededRandom {
  const next32 = createMulberry32(seed)
  const next = (): number => ((next32() >>> 5) * 67108864 + (next32() >>> 6)) / 9007199254740992
  const random: SeededRandom = {
    seed,
    next,
    uniform: (low, high) => low + (high - low) * next(),
    integer: (low, high) => low + Math.floor(next() * (high - low + 1)),
    sign: () => (next32() & 1 ? 1 : -1),
    logUniform: (minExponent, maxExponent) =>
      random.sign() * (1 + next()) * 2 ** Math.floor(minExponent + (maxExponent - minExponent) * next()),
    pick: (items) => items[Math.floor(next() * items.length)]!,
  }
  return random
}
