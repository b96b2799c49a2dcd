/**
 * Benchmark: ray–cubic pair tests per second of the closed-form engine against bezier-js's
 * line intersection, mathjs polynomialRoot, and the subdivision and Newton engines, on the
 * same seeded random pairs in one process; then the accuracy of t against the BigNumber
 * twin, and a public-API batch of one million probe–segment pairs.
 * Not part of `npm test`. Run with `npm run bench`.
 */
import { Bezier } from 'bezier-js'
import {
  bezierJsEngine, closedFormEngine, intersectProbes, mathjsEngine, newtonEngine, parsePathData, subdivisionEngine,
} from '../../shared/geometry/index'
import type { IntersectionEngine, Probe } from '../../shared/geometry/index'
import { describeProbeForBezierJs } from '../../shared/geometry/engines/bezier-js'
import { createRandom, createRayCubicPairs } from '../geometry/support/seeded-random'
import { referenceLineCubicRoots } from '../geometry/reference/line-cubic-bignumber'

const SEED = 20_260_101
const PAIRS = 200_000
const WARM_UP_RUNS = 2
const TIMED_RUNS = 7
const ACCURACY_PAIRS = 3_000

const { cubics, rays } = createRayCubicPairs(SEED, PAIRS)
const out = new Float64Array(8)
/** Results land here so that no timed loop can be optimised away. */
let sink = 0

interface Timing { readonly name: string; readonly pairs: number; readonly median: number; readonly low: number; readonly high: number }

function time(name: string, pairs: number, body: (pairs: number) => number): Timing {
  for (let i = 0; i < WARM_UP_RUNS; i++) sink += body(pairs)
  const rates: number[] = []
  for (let i = 0; i < TIMED_RUNS; i++) {
    const start = process.hrtime.bigint()
    sink += body(pairs)
    const seconds = Number(process.hrtime.bigint() - start) / 1e9
    rates.push(pairs / seconds)
  }
  rates.sort((a, b) => a - b)
  return { name, pairs, median: rates[rates.length >> 1], low: rates[0], high: rates[rates.length - 1] }
}

function runEngine(engine: IntersectionEngine): (pairs: number) => number {
  return (pairs) => {
    let total = 0
    for (let i = 0; i < pairs; i++) {
      const r = 4 * i
      const count = engine.intersectCubic(cubics, 8 * i, rays[r], rays[r + 1], rays[r + 2], rays[r + 3], 0, Infinity, out)
      total += count + (count > 0 ? out[0] : 0)
    }
    return total
  }
}

/** Checksum outside the timed loops: total hit count of an engine over the first `pairs` pairs. */
function countHits(engine: IntersectionEngine, pairs: number): number {
  let total = 0
  for (let i = 0; i < pairs; i++) {
    const r = 4 * i
    total += engine.intersectCubic(cubics, 8 * i, rays[r], rays[r + 1], rays[r + 2], rays[r + 3], 0, Infinity, out)
  }
  return total
}

const slowPairs = 20_000
const mathjsPairs = 5_000
// bezier-js gets its curves and lines built before timing, so only lineIntersects is timed.
const curves = Array.from({ length: slowPairs }, (_, i) => {
  const o = 8 * i
  return new Bezier(cubics[o], cubics[o + 1], cubics[o + 2], cubics[o + 3], cubics[o + 4], cubics[o + 5], cubics[o + 6], cubics[o + 7])
})
const lines = Array.from({ length: slowPairs }, (_, i) =>
  describeProbeForBezierJs(cubics, 8 * i, rays[4 * i], rays[4 * i + 1], rays[4 * i + 2], rays[4 * i + 3], 0, Infinity))

// The closed form is timed on all PAIRS for its headline figure, and again on exactly the
// pairs each slower engine gets (the first slowPairs, the first mathjsPairs), so that every
// ratio compares the same pairs. It runs first, so its call site has seen only itself.
const closedFormTimings = new Map<number, Timing>()
for (const pairs of [PAIRS, slowPairs, mathjsPairs]) closedFormTimings.set(pairs, time('closed-form', pairs, runEngine(closedFormEngine)))

const timings: Timing[] = [
  ...closedFormTimings.values(),
  time('bezier-js (prebuilt curves)', slowPairs, (pairs) => {
    let total = 0
    for (let i = 0; i < pairs; i++) {
      const found = curves[i].lineIntersects(lines[i])
      total += found.length + (found.length > 0 ? found[0] : 0)
    }
    return total
  }),
  time('bezier-js (engine adapter)', slowPairs, runEngine(bezierJsEngine)),
  time('subdivision', slowPairs, runEngine(subdivisionEngine)),
  time('newton', PAIRS, runEngine(newtonEngine)),
  time('mathjs polynomialRoot', mathjsPairs, runEngine(mathjsEngine)),
]

/** The closed form's median rate on the same pairs as timing. */
const closedRateOn = (timing: Timing): number => closedFormTimings.get(timing.pairs)!.median
const format = (rate: number): string => (rate >= 1e6 ? `${(rate / 1e6).toFixed(2)} M` : `${(rate / 1e3).toFixed(1)} k`)
console.log(`Ray–cubic pair tests per second (seed ${SEED}; median of ${TIMED_RUNS} runs after ${WARM_UP_RUNS} warm-up runs; range low–high;`)
console.log('"closed-form ×" = closed-form rate on the same pairs / this rate)')
console.log('engine'.padEnd(30), 'pairs'.padStart(8), 'median/s'.padStart(11), 'range/s'.padStart(22), 'closed-form ×'.padStart(14))
for (const timing of timings) {
  console.log(
    timing.name.padEnd(30),
    String(timing.pairs).padStart(8),
    format(timing.median).padStart(11),
    `${format(timing.low)}–${format(timing.high)}`.padStart(22),
    (closedRateOn(timing) / timing.median).toFixed(1).padStart(14),
  )
}
const prebuilt = timings.find((timing) => timing.name === 'bezier-js (prebuilt curves)')!
console.log(`targets: closed-form ${format(closedFormTimings.get(PAIRS)!.median)}/s (≥ 20 M/s);`,
  `${(closedRateOn(prebuilt) / prebuilt.median).toFixed(1)}× bezier-js with prebuilt curves on the same ${slowPairs} pairs (≥ 10×)`)
console.log(`checksums (hits over the first ${slowPairs} pairs):`,
  [closedFormEngine, bezierJsEngine, subdivisionEngine, newtonEngine, mathjsEngine].map((e) => `${e.name} ${countHits(e, slowPairs)}`).join(', '))

// Accuracy of t against the BigNumber twin, in ULPs of the reference root.
function ulpOf(x: number): number {
  const magnitude = Math.max(Math.abs(x), 2 ** -1022)
  return 2 ** (Math.floor(Math.log2(magnitude)) - 52)
}
const engines = [closedFormEngine, bezierJsEngine, mathjsEngine, subdivisionEngine, newtonEngine]
/** An engine root farther than this from every reference root is counted as extra (and the reference one as missed). */
const MATCH_DISTANCE = 1e-6
interface RootErrors { all: number[]; common: number[]; missed: number; extra: number }
const accuracy = new Map<string, RootErrors>(engines.map((engine) => [engine.name, { all: [], common: [], missed: 0, extra: 0 }]))
for (let i = 0; i < ACCURACY_PAIRS; i++) {
  const r = 4 * i
  const [ox, oy, dx, dy] = [rays[r], rays[r + 1], rays[r + 2], rays[r + 3]]
  const curve = new Bezier(
    cubics[8 * i], cubics[8 * i + 1], cubics[8 * i + 2], cubics[8 * i + 3],
    cubics[8 * i + 4], cubics[8 * i + 5], cubics[8 * i + 6], cubics[8 * i + 7],
  )
  const reference = referenceLineCubicRoots(cubics, 8 * i, ox, oy, dx, dy).filter((t) => {
    const point = curve.get(t)
    return dx * (point.x - ox) + dy * (point.y - oy) >= 0
  })
  const found = engines.map((engine) => Array.from(out.subarray(0, engine.intersectCubic(cubics, 8 * i, ox, oy, dx, dy, 0, Infinity, out))))
  for (const t of reference) {
    const errors = found.map((roots) => {
      const nearest = roots.reduce((best, candidate) => (Math.abs(candidate - t) < Math.abs(best - t) ? candidate : best), Infinity)
      return Math.abs(nearest - t) <= MATCH_DISTANCE ? Math.abs(nearest - t) / ulpOf(t) : undefined
    })
    engines.forEach((engine, k) => {
      const entry = accuracy.get(engine.name)!
      const error = errors[k]
      if (error === undefined) entry.missed++
      else entry.all.push(error)
      if (errors.every((e) => e !== undefined)) entry.common.push(error as number)
    })
  }
  engines.forEach((engine, k) => {
    accuracy.get(engine.name)!.extra += found[k].filter((t) => !reference.some((ref) => Math.abs(ref - t) <= MATCH_DISTANCE)).length
  })
}
const maximum = (list: number[]): number => list.reduce((m, x) => Math.max(m, x), 0)
const median = (list: number[]): number => (list.length === 0 ? 0 : [...list].sort((a, b) => a - b)[list.length >> 1])
console.log(`\nAccuracy of t against the 60-digit BigNumber twin (${ACCURACY_PAIRS} pairs, error in ULPs of the exact root;`)
console.log('"common" = the roots that every engine found)')
console.log('engine'.padEnd(14), 'roots'.padStart(7), 'max ULP'.padStart(12), 'median ULP'.padStart(11), 'max common'.padStart(11), 'missed'.padStart(7), 'extra'.padStart(6))
for (const engine of engines) {
  const entry = accuracy.get(engine.name)!
  console.log(engine.name.padEnd(14), String(entry.all.length).padStart(7), maximum(entry.all).toExponential(2).padStart(12),
    median(entry.all).toFixed(1).padStart(11), maximum(entry.common).toExponential(2).padStart(11),
    String(entry.missed).padStart(7), String(entry.extra).padStart(6))
}

// One million probe–segment pairs through the public function: 1000 rays across a
// 1000-segment closed path of cubics.
const random = createRandom(SEED + 1)
let pathData = 'M 500 0'
for (let i = 1; i <= 1000; i++) {
  const angle = (i / 1000) * 2 * Math.PI
  const radius = 400 + 80 * random()
  pathData += ` C ${500 + radius * Math.cos(angle - 0.004)} ${500 + radius * Math.sin(angle - 0.004)} ${500 + radius * Math.cos(angle - 0.002)} ${500 + radius * Math.sin(angle - 0.002)} ${500 + 450 * Math.cos(angle)} ${500 + 450 * Math.sin(angle)}`
}
const parsed = parsePathData(`${pathData} Z`)
if (!parsed.ok) throw new Error(parsed.error.message)
const probes: Probe[] = Array.from({ length: 1000 }, () => {
  const angle = random() * 2 * Math.PI
  return { type: 'ray', origin: [500 + 100 * random(), 500 + 100 * random()], direction: [Math.cos(angle), Math.sin(angle)] }
})
const batch = time('public intersectProbes', parsed.path.segments.length * probes.length, () =>
  intersectProbes(parsed.path, probes).reduce((sum, hits) => sum + hits.length, 0))
console.log(`\nPublic intersectProbes, ${parsed.path.segments.length} segments × ${probes.length} rays = ${batch.pairs} pairs:`,
  `${(batch.pairs / batch.median * 1000).toFixed(0)} ms median`,
  `(${(batch.pairs / batch.high * 1000).toFixed(0)}–${(batch.pairs / batch.low * 1000).toFixed(0)} ms)`)
console.log(`sink ${sink.toFixed(3)}`)
