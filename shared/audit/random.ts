/**
 * Seeded randomness of the audit: mulberry32 (a small 32-bit generator in common practice)
 * and a 32-bit mixing step to derive independent streams from (seed, index) words, so that
 * the k-th probe of a category is the same whether or not the others are generated.
 * Never Math.random: the same seed gives the same probes, samples and JSON.
 */

/** 2^32, the range of one mulberry32 output. */
const TWO_POW_32 = 4294967296

/** The mulberry32 stream of unsigned 32-bit integers for a 32-bit seed. */
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

/** A uniform double in [0, 1) with 53 random bits, from two draws of a 32-bit stream. */
export function drawUnit(next32: () => number): number {
  return ((next32() >>> 5) * 67108864 + (next32() >>> 6)) / 9007199254740992
}

/**
 * Mixes a 32-bit word into a 32-bit hash state (the word spread by the golden-ratio
 * constant, then murmur3's fmix32 finaliser, common practice): every input bit reaches every
 * output bit, so neighbouring indices give unrelated streams.
 */
export function mixWord(state: number, word: number): number {
  let h = (state ^ Math.imul(word | 0, 0x9e3779b1)) >>> 0
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b)
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35)
  return (h ^ (h >>> 16)) >>> 0
}

/** A 32-bit seed from any safe integer: its low and high words mixed. */
export function foldSeed(seed: number): number {
  return mixWord(seed >>> 0, Math.floor(seed / TWO_POW_32) >>> 0)
}

/** A 53-bit non-negative safe integer from a 32-bit hash state (one more mix for the low bits). */
export function spreadKey(state: number): number {
  return (state >>> 0) * 2097152 + (mixWord(state, 0x51ed270b) >>> 11)
}
