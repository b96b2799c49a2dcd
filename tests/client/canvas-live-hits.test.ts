import { describe, expect, it } from 'vitest'
import type { Hit, NormalisedPath, Probe } from '../../shared/geometry'
import { containsPoints, intersectProbes, parsePathData, windingNumber } from '../../shared/geometry'
import { compareHits, computeLiveHits, sampleWindingGrid, SERVER_AGREEMENT_REL } from '../../src/canvas/live-hits'
import { sweepLines, toCoreProbe } from '../../src/canvas/probe-geometry'
import type { CanvasProbe, CanvasSweep } from '../../src/canvas/types'
import { createSeededRandom } from '../helpers/seeded-random'

function pathOf(data: string): NormalisedPath {
  const result = parsePathData(data)
  if (!result.ok) throw new Error(`test path did not parse: ${result.error.message}`)
  return result.path
}

/** Demo icons, copied from DEMO_PATHS in server/services/seed.service.ts (drawn for the demo on a 24-unit grid). */
const DEMO_ICONS: Record<string, string> = {
  'Arrow east': 'M4 11H14V6L22 12L14 18V13H4Z',
  'Map pin': 'M12 2C8.13 2 5 5.13 5 9C5 14.25 12 22 12 22S19 14.25 19 9C19 5.13 15.87 2 12 2Z M12 6.5A2.5 2.5 0 1 1 12 11.5A2.5 2.5 0 1 1 12 6.5Z',
  'U-turn arrow': 'M6 20V10A5 5 0 0 1 16 10V14H19L14.5 19L10 14H13V10A2 2 0 0 0 9 10V20Z',
  Ferry: 'M2 15H22L19.5 20Q12 21.5 4.5 20Z M6 14V10H17L19 14Z M9 9V6H13V9Z',
  'Crossing knot': 'M12 12C4 2 4 22 12 12C20 2 20 22 12 12Z',
}

/** Probes that meet the icons at their joins, along their edges and through the knot's crossing. */
const EXACT_PROBES: CanvasProbe[] = [
  { id: 'along-edge', type: 'line', a: [0, 11], b: [1, 0] },
  { id: 'through-tip', type: 'ray', a: [0, 12], b: [1, 0] },
  { id: 'vertical', type: 'segment', a: [12, -1], b: [12, 25] },
  { id: 'diagonal', type: 'ray', a: [12, 12], b: [-1, -1] },
  { id: 'inside-hole', type: 'ray', a: [12, 9], b: [0, -1] },
  // On the edge of the arrow's and the ferry's boxes (y = 6), and from the arrow's tip onwards: culling must keep them.
  { id: 'box-edge', type: 'line', a: [-3, 6], b: [2, 0] },
  { id: 'from-tip', type: 'ray', a: [22, 12], b: [1, 0] },
]

function randomProbes(seed: number, count: number): CanvasProbe[] {
  const random = createSeededRandom(seed)
  const types = ['ray', 'line', 'segment'] as const
  return Array.from({ length: count }, (_, i) => {
    const type = random.pick(types)
    const a = [random.uniform(-2, 26), random.uniform(-2, 26)] as const
    const b = type === 'segment'
      ? [random.uniform(-2, 26), random.uniform(-2, 26)] as const
      : [random.uniform(-1, 1), random.uniform(-1, 1)] as const
    return { id: `r${i}`, type, a, b }
  })
}

describe('computeLiveHits equals the core on the demo icons', () => {
  const seed = 20_260_517
  const probes = [...EXACT_PROBES, ...randomProbes(seed, 60)]
  const sweep: CanvasSweep = { id: 'rows', angle: 0, spacing: 1.5, count: 16, origin: [0, 0.25] }
  const slanted: CanvasSweep = { id: 'slant', angle: 30, spacing: 2, count: 10, origin: [4, -4] }

  it('gives every probe and sweep line the hits of intersectProbes, path by path', () => {
    const paths = Object.entries(DEMO_ICONS).map(([key, data]) => ({ key, path: pathOf(data) }))
    const result = computeLiveHits(paths, probes, [sweep, slanted])
    const sweepProbes: Probe[] = [sweep, slanted].flatMap((s) => sweepLines(s).map(({ origin, direction }): Probe => ({ type: 'line', origin, direction })))
    const expectedProbes = [...probes.map(toCoreProbe), ...sweepProbes]
    expect(result.lines.map((line) => line.probe)).toStrictEqual(expectedProbes)
    for (const { key, path } of paths) {
      const expected = intersectProbes(path, expectedProbes)
      result.lines.forEach((line, i) => {
        const entry = line.perPath.find((p) => p.pathKey === key)!
        expect(entry.hits, `seed ${seed}, ${key}, line ${line.lineId}: ${JSON.stringify(line.probe)}`).toStrictEqual(expected[i])
      })
    }
    const total = result.lines.reduce((sum, line) => sum + line.perPath.reduce((n, p) => n + p.hits.length, 0), 0)
    expect(total).toBeGreaterThan(200)
  })

  it('culls nothing it should not on a path of many subpaths (all icons in one)', () => {
    // Each icon copied at four places of a 2 × 2 layout, so that most subpaths lie away from a probe.
    const shifted = (data: string, dx: number, dy: number): string =>
      data.replace(/([MLHVCSQTAZ])([^MLHVCSQTAZ]*)/gi, (_, command: string, args: string) => {
        const numbers = args.trim() === '' ? [] : args.trim().split(/[\s,]+/).map(Number)
        const upper = command.toUpperCase()
        const moved = numbers.map((n, i) => {
          if (upper === 'H') return n + dx
          if (upper === 'V') return n + dy
          if (upper === 'A') return i % 7 === 5 ? n + dx : i % 7 === 6 ? n + dy : n
          return i % 2 === 0 ? n + dx : n + dy
        })
        return `${command}${moved.join(' ')}`
      })
    const data = Object.values(DEMO_ICONS).flatMap((icon) => [shifted(icon, 0, 0), shifted(icon, 30, 0), shifted(icon, 0, 30), shifted(icon, 30, 30)]).join(' ')
    const path = pathOf(data)
    expect(path.subpaths.length).toBe(4 * 8)
    const manyProbes = [...probes, ...randomProbes(seed + 1, 80).map((p) => ({ ...p, a: [p.a[0] * 2, p.a[1] * 2] as const }))]
    const result = computeLiveHits([{ key: 'all', path }], manyProbes, [sweep])
    const expected = intersectProbes(path, result.lines.map((line) => line.probe))
    result.lines.forEach((line, i) => {
      expect(line.perPath[0].hits, `seed ${seed}, line ${line.lineId}: ${JSON.stringify(line.probe)}`).toStrictEqual(expected[i])
    })
    const rays = result.lines.filter((line) => line.probe.type === 'ray')
    const verdicts = containsPoints(path, rays.map((line) => (line.probe as { origin: readonly [number, number] }).origin), 'evenodd')
    rays.forEach((line, i) => {
      const origin = line.perPath[0].origin!
      expect({ winding: origin.winding, onBoundary: origin.onBoundary, evenodd: origin.evenodd }, `seed ${seed}, ray ${line.lineId}`)
        .toStrictEqual({ winding: verdicts[i].winding, onBoundary: verdicts[i].onBoundary, evenodd: verdicts[i].inside })
    })
  })

  it('gives each ray the containment of its origin under both fill rules, and lines and segments none', () => {
    const pin = pathOf(DEMO_ICONS['Map pin'])
    const result = computeLiveHits([{ key: 'pin', path: pin }], probes, [])
    for (const line of result.lines) {
      const entry = line.perPath[0]
      if (line.probe.type !== 'ray') {
        expect(entry.origin).toBeUndefined()
        continue
      }
      const origin = line.probe.origin
      const [nonzero] = containsPoints(pin, [origin], 'nonzero')
      const [evenodd] = containsPoints(pin, [origin], 'evenodd')
      expect(entry.origin, `seed ${seed}, ray ${line.lineId}`).toStrictEqual({
        winding: nonzero.winding, onBoundary: nonzero.onBoundary, nonzero: nonzero.inside, evenodd: evenodd.inside,
      })
    }
    // By hand: the body runs top → left → bottom → right (counter-clockwise on screen), so along
    // +x from (12, 4) the one crossing goes up (ty < 0): winding −1. The hole's arcs (sweep flag 1)
    // run clockwise, +1 on its right side, so its centre (12, 9) has winding 0: filled by neither rule.
    expect(result.lines.find((line) => line.lineId === 'inside-hole')!.perPath[0].origin)
      .toStrictEqual({ winding: 0, onBoundary: false, nonzero: false, evenodd: false })
    const body = computeLiveHits([{ key: 'pin', path: pin }], [{ id: 'b', type: 'ray', a: [12, 4], b: [0, 1] }], [])
    expect(body.lines[0].perPath[0].origin).toStrictEqual({ winding: -1, onBoundary: false, nonzero: true, evenodd: true })
  })
})

describe('computeLiveHits on hand-worked cases', () => {
  const unitSquare = pathOf('M0 0 H1 V1 H0 Z')

  it('finds one crossing of a ray from the centre of the unit square, winding +1', () => {
    // The ray (1, 0) leaves through the side V1, segment 1 from (1, 0) to (1, 1), halfway down.
    // Winding = sign(direction × tangent) = 1·1 − 0·0 > 0 (types.ts), and that is the winding number.
    const result = computeLiveHits([{ key: 'sq', path: unitSquare }], [{ id: 'r', type: 'ray', a: [0.5, 0.5], b: [1, 0] }], [])
    expect(result.lines).toHaveLength(1)
    const [line] = result.lines
    expect(line).toMatchObject({ lineId: 'r', probeId: 'r', sweepId: null })
    expect(line.perPath).toStrictEqual([{
      pathKey: 'sq',
      hits: [{ segment: 1, t: 0.5, s: 0.5, point: [1, 0.5], kind: 'crossing', winding: 1 }],
      origin: { winding: 1, onBoundary: false, nonzero: true, evenodd: true },
    }])
  })

  it('judges a ray from outside and one from the boundary', () => {
    const result = computeLiveHits([{ key: 'sq', path: unitSquare }], [
      { id: 'out', type: 'ray', a: [2, 0.5], b: [1, 0] },
      { id: 'edge', type: 'ray', a: [1, 0.25], b: [0, 1] },
    ], [])
    expect(result.lines[0].perPath[0]).toStrictEqual({ pathKey: 'sq', hits: [], origin: { winding: 0, onBoundary: false, nonzero: false, evenodd: false } })
    expect(result.lines[1].perPath[0].origin!.onBoundary).toBe(true)
  })

  it('answers each row of a sweep across a 10 × 10 square at the rows worked out by hand', () => {
    const square = pathOf('M0 0 H10 V10 H0 Z')
    // angle 0, spacing 2.5 from (0, 2.5): rows y = 2.5, 5, 7.5 along +x, so s is x. Each row
    // enters through the closing side (0, 10) → (0, 0), segment 3, tangent (0, −1): winding −1,
    // and leaves through V10, segment 1, tangent (0, 1): winding +1.
    const rows = computeLiveHits([{ key: 'sq', path: square }], [], [{ id: 'w', angle: 0, spacing: 2.5, count: 3, origin: [0, 2.5] }])
    expect(rows.lines.map((line) => [line.lineId, line.probeId, line.sweepId])).toStrictEqual([['w#0', null, 'w'], ['w#1', null, 'w'], ['w#2', null, 'w']])
    expect(rows.lines.map((line) => line.perPath[0].hits)).toStrictEqual([2.5, 5, 7.5].map((y) => [
      { segment: 3, t: 1 - y / 10, s: 0, point: [0, y], kind: 'crossing', winding: -1 },
      { segment: 1, t: y / 10, s: 10, point: [10, y], kind: 'crossing', winding: 1 },
    ]))
    // angle 90: lines along +y stepping towards −x, x = 7.5, 5, 2.5. They cross the top, segment 0
    // with tangent (1, 0): 0·0 − 1·1 = −1, and the bottom, segment 2 with tangent (−1, 0): +1.
    const columns = computeLiveHits([{ key: 'sq', path: square }], [], [{ id: 'c', angle: 90, spacing: 2.5, count: 3, origin: [7.5, 0] }])
    expect(columns.lines.map((line) => line.perPath[0].hits)).toStrictEqual([7.5, 5, 2.5].map((x) => [
      { segment: 0, t: x / 10, s: 0, point: [x, 0], kind: 'crossing', winding: -1 },
      { segment: 2, t: 1 - x / 10, s: 10, point: [x, 10], kind: 'crossing', winding: 1 },
    ]))
  })

  it('answers a probe with a zero direction with no hits, and refuses non-finite numbers', () => {
    const result = computeLiveHits([{ key: 'sq', path: unitSquare }], [
      { id: 'dot', type: 'segment', a: [0.5, 0.5], b: [0.5, 0.5] },
      { id: 'still', type: 'ray', a: [0.5, 0.5], b: [0, 0] },
    ], [])
    expect(result.lines[0].perPath[0]).toStrictEqual({ pathKey: 'sq', hits: [] })
    expect(result.lines[1].perPath[0]).toStrictEqual({ pathKey: 'sq', hits: [], origin: { winding: 1, onBoundary: false, nonzero: true, evenodd: true } })
    expect(() => computeLiveHits([], [{ id: 'bad', type: 'ray', a: [Number.NaN, 0], b: [0, 0] }], [])).toThrow(RangeError)
  })

  it('keeps the paths in their order for every line', () => {
    const result = computeLiveHits(
      [{ key: 'b', path: unitSquare }, { key: 'a', path: pathOf('M5 0 H6 V1 H5 Z') }],
      [{ id: 'l', type: 'line', a: [0, 0.5], b: [1, 0] }],
      [],
    )
    expect(result.lines[0].perPath.map((p) => [p.pathKey, p.hits.map((h) => h.s)])).toStrictEqual([['b', [0, 1]], ['a', [5, 6]]])
  })
})

function hit(x: number, y: number, s: number, extra: Partial<Hit> = {}): Hit {
  return { segment: 2, t: 0.25, s, point: [x, y], kind: 'crossing', winding: 1, ...extra }
}

/** 4.001 − 4 is exact (Sterbenz), and the double 4.001 is within ulp(4)/2 ≈ 4.4e-16 of 4.001. */
const GAP_ROUNDING = 1e-15

describe('compareHits (tolerance SERVER_AGREEMENT_REL · size)', () => {
  const size = 10
  const tolerance = SERVER_AGREEMENT_REL * size
  const live = [hit(1, 4, 1), hit(3, 4, 3, { winding: -1 }), hit(6, 4, 6, { kind: 'tangent', winding: 0, segment: 5 })]

  it('finds nothing between equal lists', () => {
    expect(compareHits(live, live.map((h) => ({ ...h })), size)).toStrictEqual([])
  })

  it('reports a hit that moved, with the distance', () => {
    const server = [live[0], hit(3, 4.001, 3, { winding: -1 }), live[2]]
    const differences = compareHits(live, server, size)
    expect(differences).toHaveLength(1)
    expect(differences[0]).toMatchObject({ kind: 'moved', live: live[1], server: server[1] })
    expect(Math.abs(differences[0].distance! - 0.001)).toBeLessThanOrEqual(GAP_ROUNDING)
  })

  it('agrees just under the tolerance and reports moved just over it', () => {
    const at = (gap: number) => compareHits([hit(3, 4, 3)], [hit(3 + gap, 4, 3)], size)
    expect(at(0.99 * tolerance)).toStrictEqual([])
    expect(at(1.01 * tolerance).map((d) => d.kind)).toStrictEqual(['moved'])
  })

  it('reports hits missing on the server and extra ones, without stealing a good pair', () => {
    // The server lacks the first hit: it must pair the second with its match, not with the first.
    expect(compareHits(live, [live[1], live[2]], size)).toStrictEqual([{ kind: 'missing-on-server', live: live[0], server: null, distance: null }])
    const extra = hit(9, 4, 9)
    expect(compareHits(live, [...live, extra], size)).toStrictEqual([{ kind: 'extra-on-server', live: null, server: extra, distance: null }])
  })

  it('reports a different kind, winding or segment of an agreeing pair, once each, sorted by s', () => {
    const server = [hit(1, 4, 1, { segment: 3 }), hit(3, 4, 3, { winding: 1 }), hit(6, 4, 6, { kind: 'crossing', winding: 1, segment: 5 })]
    expect(compareHits(live, server, size).map((d) => [d.kind, d.distance])).toStrictEqual([['segment', 0], ['winding', 0], ['kind', 0]])
  })

  it('needs exact agreement for a path of size 0', () => {
    expect(compareHits([hit(0, 0, 0)], [hit(0, 5e-324, 0)], 0).map((d) => d.kind)).toStrictEqual(['moved'])
  })
})

describe('sampleWindingGrid', () => {
  it('gives the winding numbers of a square at cell centres, row-major', () => {
    // Cells of [−5, 15]² in 4 × 4 are centred at −2.5, 2.5, 7.5, 12.5: the middle four lie in the
    // square, which winds clockwise on screen, +1 by the sign convention.
    const grid = sampleWindingGrid(pathOf('M0 0 H10 V10 H0 Z'), [-5, -5, 15, 15], 4, 4)
    expect(Array.from(grid)).toStrictEqual([0, 0, 0, 0, 0, 1, 1, 0, 0, 1, 1, 0, 0, 0, 0, 0])
    // One row through y = 2.5: the square drawn twice winds twice; drawn the other way round, −1.
    const twice = sampleWindingGrid(pathOf('M0 0 H10 V10 H0 Z M0 0 H10 V10 H0 Z'), [-5, 0, 15, 5], 4, 1)
    expect(Array.from(twice)).toStrictEqual([0, 2, 2, 0])
    const reversed = sampleWindingGrid(pathOf('M0 0 V10 H10 V0 Z'), [-5, 0, 15, 5], 4, 1)
    expect(Array.from(reversed)).toStrictEqual([0, -1, -1, 0])
  })

  it('equals windingNumber at every centre of a grid over the knot and the pin', () => {
    for (const name of ['Crossing knot', 'Map pin', 'U-turn arrow']) {
      const path = pathOf(DEMO_ICONS[name])
      const cols = 23, rows = 17
      const grid = sampleWindingGrid(path, [1, 1, 23, 23], cols, rows)
      for (let row = 0; row < rows; row++) {
        for (let col = 0; col < cols; col++) {
          const centre = [1 + (col + 0.5) * (22 / cols), 1 + (row + 0.5) * (22 / rows)] as const
          expect(grid[row * cols + col], `${name} at ${centre}`).toBe(windingNumber(path, centre))
        }
      }
      expect(grid.some((w) => w !== 0), name).toBe(true)
    }
  })

  it('is empty for no cells and refuses fractional counts', () => {
    expect(sampleWindingGrid(pathOf('M0 0 H1 V1 Z'), [0, 0, 1, 1], 0, 5)).toHaveLength(0)
    expect(() => sampleWindingGrid(pathOf('M0 0 H1 V1 Z'), [0, 0, 1, 1], 2.5, 5)).toThrow(RangeError)
  })
})
