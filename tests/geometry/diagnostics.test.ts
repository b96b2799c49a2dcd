/**
 * Path diagnostics: each kind found on a fixture drawn to have it (expected indices, t and
 * points worked out by hand beside each case), none on clean shapes, the tolerances checked
 * just inside and just outside, scale invariance, and seeded property tests of the closed-form
 * loop and cusp against independent oracles (a fine polyline; cusps constructed exactly).
 */
import fc from 'fast-check'
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { diagnosePath, evaluateSegment, evaluateSegmentDerivative } from '../../shared/geometry/index'
import type { CubicSegment, Diagnostic, DiagnosticKind, NormalisedPath, Segment } from '../../shared/geometry/index'
import { CUSP_REL, STRAIGHT_REL } from '../../shared/geometry/diagnostics'
import { expectClose, pathOf } from './support/geometry-helpers'

const SEED = 20_260_404

/** Closed-form parameters and points of these small fixtures are within a few ulps: 2^-40 relative to their size ≤ 2^7. */
const FIXTURE_TOLERANCE = 2 ** -33

function kindsOf(diagnostics: readonly Diagnostic[]): DiagnosticKind[] {
  return diagnostics.map((diagnostic) => diagnostic.kind)
}

function diagnose(pathData: string): Diagnostic[] {
  return diagnosePath(pathOf(pathData))
}

/** One path of the given segment tuples as a single open subpath (for values path data cannot spell exactly). */
function openPathOf(...segments: Segment[]): NormalisedPath {
  return { segments, subpaths: [{ start: 0, count: segments.length, closed: false }] }
}

/** Control points (x, y interleaved) rotated by `degrees` about the origin, then moved by (dx, dy). */
function rotatePoints(values: readonly number[], degrees: number, dx = 0, dy = 0): CubicSegment {
  const [c, s] = [Math.cos((degrees * Math.PI) / 180), Math.sin((degrees * Math.PI) / 180)]
  return values.map((_, k) => (k % 2 === 0 ? dx + c * values[k] - s * values[k + 1] : dy + s * values[k - 1] + c * values[k])) as unknown as CubicSegment
}

/** The path with every coordinate multiplied by `factor` (arcs: end points, centre and radii; angles kept). */
function scalePath(path: NormalisedPath, factor: number): NormalisedPath {
  const scaleSegment = (segment: Segment): Segment =>
    segment.map((value, k) => (segment.length === 12 && k >= 8 ? value : value * factor)) as unknown as Segment
  return {
    segments: path.segments.map(scaleSegment),
    subpaths: path.subpaths,
    ...(path.dropped ? { dropped: path.dropped.map((piece) => ({ ...piece, point: [piece.point[0] * factor, piece.point[1] * factor] as const })) } : {}),
  }
}

describe('clean shapes have no diagnostics', () => {
  const oGlyph = JSON.parse(readFileSync(new URL('./fixtures/glyph-o-quadratic.json', import.meta.url), 'utf8')) as { path: string }
  // κ = 4(√2 − 1)/3 ≈ 0.5523: the common-practice cubic quarter circle (handle length κ·r).
  const k = 8 * 0.5522847498
  it.each([
    ['a circle of four quarter arcs', 'M60 50 A10 10 0 0 1 50 60 A10 10 0 0 1 40 50 A10 10 0 0 1 50 40 A10 10 0 0 1 60 50 Z'],
    ['a circle of two half arcs, rotated ellipse radii', 'M0 -30 A30 30 45 0 1 0 30 A30 30 45 0 1 0 -30 Z'],
    ['a rounded rect with arc corners, as the SVG import writes rect rx', 'M18 20 H82 A8 8 0 0 1 90 28 V52 A8 8 0 0 1 82 60 H18 A8 8 0 0 1 10 52 V28 A8 8 0 0 1 18 20 Z'],
    ['a rounded rect with cubic corners', `M18 20 H82 C${82 + k} 20 90 ${28 - k} 90 28 V52 C90 ${52 + k} ${82 + k} 60 82 60 H18 C${18 - k} 60 10 ${52 + k} 10 52 V28 C10 ${28 - k} ${18 - k} 20 18 20 Z`],
    ['an invented quadratic letter O (fixtures/glyph-o-quadratic.json)', oGlyph.path],
    ['an invented cubic letter D with its counter', 'M100 0 H300 C480 0 600 130 600 350 C600 570 480 700 300 700 H100 Z M200 100 V600 H300 C420 600 500 510 500 350 C500 190 420 100 300 100 Z'],
    ['an invented cubic S-curve stroke outline', 'M420 120 C360 40 120 40 120 180 C120 320 440 300 440 460 C440 620 160 640 80 540 L120 500 C180 580 380 570 380 460 C380 350 60 380 60 180 C60 0 360 -20 460 90 Z'],
  ])('%s', (_, pathData) => {
    expect(diagnose(pathData)).toEqual([])
  })

  it('gives none for the empty path and for a lone moveto (no drawing command, no contour)', () => {
    expect(diagnose('')).toEqual([])
    expect(diagnose('M5 5')).toEqual([])
    expect(diagnose('M0 0 L10 0 L10 10 Z M30 30')).toEqual([])
  })
})

describe('zero-length segments', () => {
  it.each([
    ['L', 'line', 'L10 0'],
    ['H', 'horizontal line', 'H10'],
    ['V', 'vertical line', 'V0'],
    ['Q', 'quadratic curve', 'Q10 0 10 0'],
    ['C', 'cubic curve', 'C10 0 10 0 10 0'],
    ['A', 'arc', 'A4 4 0 0 1 10 0'],
  ])('reports a dropped %s command where it sat, with no segment index', (_, name, command) => {
    const diagnostics = diagnose(`M0 0 L10 0 ${command} L10 10 Z`)
    expect(diagnostics).toEqual([{
      kind: 'zero-length-segment', segment: null, subpath: 0, t: null, point: [10, 0],
      message: `Zero-length ${name} at (10, 0): its points coincide, so it was left out.`,
    }])
  })

  it('puts a dropped piece between the diagnostics of the segments around it', () => {
    // Segment 0 has a control point on its end (coincident-points), then the dropped L at (10, 0), then segment 1 is open.
    const diagnostics = diagnose('M0 0 Q10 0 10 0 L10 0 L10 10 M40 40 L40 40 L50 40')
    expect(kindsOf(diagnostics)).toEqual(['coincident-points', 'straight-curve', 'zero-length-segment', 'open-subpath', 'zero-length-segment', 'open-subpath'])
    expect(diagnostics[2]).toMatchObject({ subpath: 0, point: [10, 0] })
    expect(diagnostics[4]).toMatchObject({ subpath: 1, point: [40, 40] })
  })

  it('reports a kept segment shorter than the coincidence distance 2^-40·L, and not one just longer', () => {
    // L = 64 (largest |coordinate|), so the coincidence distance is 2^-34.
    const short = openPathOf([0, 0, 64, 0], [64, 0, 64, 2 ** -35], [64, 2 ** -35, 0, 64])
    expect(diagnosePath(short).filter((d) => d.kind === 'zero-length-segment')).toEqual([{
      kind: 'zero-length-segment', segment: 1, subpath: 0, t: null, point: [64, 0],
      message: 'The line at (64, 0) has practically zero length: its points lie within rounding distance of each other.',
    }])
    const long = openPathOf([0, 0, 64, 0], [64, 0, 64, 2 ** -33], [64, 2 ** -33, 0, 64])
    expect(kindsOf(diagnosePath(long))).toEqual(['open-subpath'])
  })
})

describe('degenerate contours', () => {
  it('reports a dropped contour once, whatever its commands', () => {
    const diagnostics = diagnose('M0 0 L10 0 L0 10 Z M5 5 L5 5 Q5 5 5 5 Z M7 7 Z')
    expect(diagnostics).toEqual([
      { kind: 'degenerate-contour', segment: null, subpath: null, t: null, point: [5, 5], message: 'Contour at (5, 5) has all its points in one place; it draws nothing and was left out.' },
      { kind: 'degenerate-contour', segment: null, subpath: null, t: null, point: [7, 7], message: 'Contour at (7, 7) has all its points in one place; it draws nothing and was left out.' },
    ])
  })

  it('reports a kept subpath within the coincidence distance once, not per segment, per dropped piece or as open', () => {
    // L = 64 → coincidence distance 2^-34; subpath 1 spans 2^-36 and had a zero-length L dropped from it.
    const path: NormalisedPath = {
      segments: [[0, 0, 64, 0], [64, 0, 0, 64], [0, 64, 0, 0], [32, 32, 32, 32 + 2 ** -36], [32, 32 + 2 ** -36, 32 + 2 ** -36, 32]],
      subpaths: [{ start: 0, count: 3, closed: true }, { start: 3, count: 2, closed: false }],
      dropped: [{ kind: 'segment', command: 'L', point: [32, 32], subpath: 1, segmentsBefore: 3 }],
    }
    expect(diagnosePath(path)).toEqual([{
      kind: 'degenerate-contour', segment: null, subpath: 1, t: null, point: [32, 32],
      message: 'Contour at (32, 32) has all its points in one place (within rounding distance); it draws nothing.',
    }])
  })
})

describe('coincident points', () => {
  it('finds a control point on the start (t 0), on the end (t 1), and two equal control points (t null)', () => {
    const diagnostics = diagnose('M0 0 C0 0 10 10 20 0 C30 10 40 10 40 10 C50 0 50 0 60 10 Q70 20 70 20 Z')
    expect(diagnostics.filter((d) => d.kind === 'coincident-points')).toEqual([
      { kind: 'coincident-points', segment: 0, subpath: 0, t: 0, point: [0, 0], message: 'A control point of the cubic curve coincides with its start point at (0, 0); the tangent there is undefined.' },
      { kind: 'coincident-points', segment: 1, subpath: 0, t: 1, point: [40, 10], message: 'A control point of the cubic curve coincides with its end point at (40, 10); the tangent there is undefined.' },
      { kind: 'coincident-points', segment: 2, subpath: 0, t: null, point: [50, 0], message: 'A control point of the cubic curve coincides with the other control point at (50, 0).' },
      { kind: 'coincident-points', segment: 3, subpath: 0, t: 1, point: [70, 20], message: 'A control point of the quadratic curve coincides with its end point at (70, 20); the tangent there is undefined.' },
    ])
    // The quadratic with its control on its end is also a straight line; nothing is a cusp (the speed vanishes only at ends).
    expect(kindsOf(diagnostics)).toEqual(['coincident-points', 'coincident-points', 'coincident-points', 'coincident-points', 'straight-curve'])
  })

  it('does not count a segment end equal to the next start, or a closing point written out before Z', () => {
    expect(diagnose('M0 0 L10 0 C20 0 20 10 10 10 L0 10 L0 0 Z')).toEqual([])
  })
})

describe('straight curves', () => {
  it('finds cubics and quadratics whose control points lie on the chord, also doubling back', () => {
    const diagnostics = diagnose('M0 0 C10 0 20 0 30 0 Q40 10 50 20 C60 30 40 10 70 40 Z')
    expect(diagnostics.filter((d) => d.kind === 'straight-curve').map((d) => [d.segment, d.message])).toEqual([
      [0, 'The cubic curve from (0, 0) to (30, 0) is straight: its control points lie on one line.'],
      [1, 'The quadratic curve from (30, 0) to (50, 20) is straight: its control points lie on one line.'],
      [2, 'The cubic curve from (50, 20) to (70, 40) is straight: its control points lie on one line.'],
    ])
  })

  it('still finds a straight cubic after a rotation by 30° rounded its coordinates', () => {
    expect(kindsOf(diagnosePath(openPathOf(rotatePoints([0, 0, 100, 0, 200, 0, 300, 0], 30))))).toEqual(['straight-curve', 'open-subpath'])
  })

  it('calls a short cubic far from the origin straight when its points line up within what the coordinates can express', () => {
    // Size 2^-16 at 10^6: STRAIGHT_REL·size = 2^-36 ≈ 1.5e-11, while rounding to the doubles near 10^6 (spacing 1.2e-10)
    // leaves a control point 7.2e-11 off the line; the coincidence distance 2^-40·10^6 ≈ 9e-7 as a floor keeps it straight.
    const step = 2 ** -16 / 3
    const points = rotatePoints([0, 0, step, 0, 2 * step, 0, 3 * step, 0], 30, 1e6, 1e6)
    expect(kindsOf(diagnosePath(openPathOf(points)))).toEqual(['straight-curve', 'open-subpath'])
  })

  it('uses STRAIGHT_REL of the farthest pair: a control 2^-13 off a 300-long chord is straight, 2^-10 is not', () => {
    // Farthest pair P0–P3 at distance 300; the tolerance is 2^-20·300 ≈ 2.9e-4, between 2^-13 ≈ 1.2e-4 and 2^-10 ≈ 9.8e-4.
    expect(STRAIGHT_REL * 300).toBeGreaterThan(2 ** -13)
    expect(STRAIGHT_REL * 300).toBeLessThan(2 ** -10)
    expect(kindsOf(diagnosePath(openPathOf([0, 0, 100, 2 ** -13, 200, 0, 300, 0])))).toEqual(['straight-curve', 'open-subpath'])
    expect(kindsOf(diagnosePath(openPathOf([0, 0, 100, 2 ** -10, 200, 0, 300, 0])))).toEqual(['open-subpath'])
  })
})

describe('cusps', () => {
  it('finds the cusp of C(1 1)(0 1)(1 0) at t = ½, point (½, ¾)', () => {
    // Legs d0 = (1, 1), d1 = (−1, 0), d2 = (1, −1): P'/3 = (4t² − 4t + 1, 1 − 2t) = ((2t − 1)², 1 − 2t), zero at t = ½;
    // P(½) = (0 + 3/8 + 0 + 1/8, 0 + 3/8 + 3/8 + 0) = (½, ¾).
    const diagnostics = diagnose('M0 0 C1 1 0 1 1 0 Z')
    expect(diagnostics).toEqual([{
      kind: 'cusp', segment: 0, subpath: 0, t: 0.5, point: [0.5, 0.75],
      message: 'Cusp at (0.5, 0.75) (t = 0.5): the cubic curve stops and turns back.',
    }])
  })

  it('finds the cusp rotated by 30° and translated, where both components of P′ have simple roots', () => {
    const [c, s] = [Math.cos(Math.PI / 6), Math.sin(Math.PI / 6)]
    const cusps = diagnosePath(openPathOf(rotatePoints([0, 0, 100, 100, 0, 100, 100, 0], 30, 500, 700))).filter((d) => d.kind === 'cusp')
    expect(cusps).toHaveLength(1)
    expect(cusps[0].message.startsWith('Cusp at')).toBe(true)
    expectClose(cusps[0].t!, 0.5, FIXTURE_TOLERANCE, 't')
    // P(½) = (50, 75) before the rotation.
    expectClose(cusps[0].point![0], 500 + c * 50 - s * 75, FIXTURE_TOLERANCE * 1024, 'x')
    expectClose(cusps[0].point![1], 700 + s * 50 + c * 75, FIXTURE_TOLERANCE * 1024, 'y')
  })

  it('finds one exact cusp and no loop at every whole-degree rotation (rounding must not open a tiny loop)', () => {
    for (let degrees = 1; degrees < 360; degrees++) {
      const kinds = kindsOf(diagnosePath(openPathOf(rotatePoints([0, 0, 100, 100, 0, 100, 100, 0], degrees, 500, 700))))
      expect(kinds, `rotated by ${degrees}°`).toEqual(['cusp', 'open-subpath'])
    }
  })

  it('counts a tiny near-cusp as exact when its speed is below the coincidence distance of a large drawing', () => {
    // The near-cusp family below at size 2^-16 with h = 1/16: speed at t = ½ is 2^-16·h/4 = 2^-22, above CUSP_REL·(2^-16·√2)
    // ≈ 2.1e-8 but below the coincidence distance 2^-40·2^20 = 2^-20 set by the line out to x = 2^20.
    const size = 2 ** -16
    const path = openPathOf([0, 0, size, size, size / 16, size, size, 0], [size, 0, 2 ** 20, 0])
    const diagnostics = diagnosePath(path)
    expect(kindsOf(diagnostics)).toEqual(['cusp', 'open-subpath'])
    expect(diagnostics[0].message.startsWith('Cusp at')).toBe(true)
  })

  it('leaves a control point within the coincidence distance of its start to coincident-points, not a cusp', () => {
    // P1 sits 2^-40 behind P0 (coincidence distance 2^-34 at L = 100 → 2^-40·64): P′ changes sign in x at t ≈ 2^-47,
    // where the speed is tiny, but that spot is the start point itself.
    const diagnostics = diagnosePath(openPathOf([0, 0, -(2 ** -40), 0, 50, 50, 100, 0]))
    expect(kindsOf(diagnostics)).toEqual(['coincident-points', 'open-subpath'])
    expect(diagnostics[0]).toMatchObject({ t: 0, point: [0, 0] })
  })

  it('finds both turns of a straight cubic that doubles back, at t = (5 ∓ √5)/10', () => {
    // Legs (2, 0), (−3, 0), (2, 0): P'/3 = (10t² − 10t + 2, 0), zero at t = ½ ∓ √5/10; x there = ½ ± √5/10 by symmetry.
    const cusps = diagnose('M0 0 C2 0 -1 0 1 0').filter((d) => d.kind === 'cusp')
    expect(cusps.map((d) => d.segment)).toEqual([0, 0])
    expectClose(cusps[0].t!, (5 - Math.sqrt(5)) / 10, FIXTURE_TOLERANCE, 't1')
    expectClose(cusps[1].t!, (5 + Math.sqrt(5)) / 10, FIXTURE_TOLERANCE, 't2')
    expectClose(cusps[0].point![0], 0.5 + Math.sqrt(5) / 10, FIXTURE_TOLERANCE, 'x1')
    expect(cusps[0].point![1]).toBe(0)
  })

  it('finds the turn of a quadratic that doubles back, at t = |d0| / (|d0| + |d1|)', () => {
    // Legs (8, 0) and (−2, 0): P'/2 = (8 − 10t, 0), zero at t = 0.8; P(0.8) = 2·0.8·0.2·8 + 0.64·6 = 6.4.
    const cusps = diagnose('M0 0 Q8 0 6 0').filter((d) => d.kind === 'cusp')
    expect(cusps).toHaveLength(1)
    expectClose(cusps[0].t!, 0.8, FIXTURE_TOLERANCE, 't')
    expectClose(cusps[0].point![0], 6.4, FIXTURE_TOLERANCE, 'x')
  })

  describe('near-cusps: C(100 100)(100h 100)(100 0), where P′/3 at t = ½ is (25h, 0)', () => {
    // Legs (100, 100), (100h − 100, 0), (100 − 100h, −100): the y component of P'/3 is 100(1 − 2t), zero at ½, and the
    // x component there is 25h. The longest leg is 100√2, so the tolerance is CUSP_REL·100√2 ≈ 0.138, i.e. h ≤ 0.0055.
    const curve = (h: number): NormalisedPath => openPathOf([0, 0, 100, 100, 100 * h, 100, 100, 0])
    it('reports a near-cusp at t = ½ for h = 2^-8 (speed 0.098), with no loop on this side', () => {
      expect(25 * 2 ** -8).toBeLessThan(CUSP_REL * 100 * Math.SQRT2)
      const diagnostics = diagnosePath(curve(2 ** -8))
      expect(kindsOf(diagnostics)).toEqual(['cusp', 'open-subpath'])
      // P(½) = (3/8·100 + 3/8·100h + 1/8·100, 3/8·100 + 3/8·100) = (50 + 37.5h, 75).
      expect(diagnostics[0]).toEqual({
        kind: 'cusp', segment: 0, subpath: 0, t: 0.5, point: [50 + 37.5 * 2 ** -8, 75],
        message: 'Near-cusp at (50.1465, 75) (t = 0.5): the cubic curve almost stops and turns sharply.',
      })
    })
    it('reports nothing for h = 2^-7 (speed 0.195)', () => {
      expect(25 * 2 ** -7).toBeGreaterThan(CUSP_REL * 100 * Math.SQRT2)
      expect(kindsOf(diagnosePath(curve(2 ** -7)))).toEqual(['open-subpath'])
    })
    it('reports the near-cusp and the small loop for h = −2^-8', () => {
      const diagnostics = diagnosePath(curve(-(2 ** -8)))
      expect(kindsOf(diagnostics)).toEqual(['cusp', 'loop', 'open-subpath'])
      expect(diagnostics[0].t).toBe(0.5)
      const loopT = diagnostics[1].t!
      expect(loopT).toBeLessThan(0.5)
    })
  })
})

describe('loops', () => {
  it('finds the double point of C(30 30)(−10 30)(20 0) in closed form', () => {
    // Power form A = (140, 0), B = (−210, −90), C = (90, 90): σ = −(A×C)/(A×B) = 1 and σ² − π = (B×C)/(A×B) = 6/7,
    // so π = 1/7 and t = (1 ∓ √(3/7))/2. By the mirror symmetry about x = 10 the crossing is at x = 10, and
    // y(t) = 90·t(1 − t) = 90π = 90/7.
    const diagnostics = diagnose('M0 0 C30 30 -10 30 20 0 Z')
    expect(kindsOf(diagnostics)).toEqual(['loop'])
    const [loop] = diagnostics
    expect(loop).toMatchObject({ segment: 0, subpath: 0 })
    expectClose(loop.t!, (1 - Math.sqrt(3 / 7)) / 2, FIXTURE_TOLERANCE, 't1')
    expectClose(loop.point![0], 10, FIXTURE_TOLERANCE, 'x')
    expectClose(loop.point![1], 90 / 7, FIXTURE_TOLERANCE, 'y')
    expect(loop.message).toBe('Loop: the cubic curve crosses itself at (10, 12.8571) (t = 0.1727 and 0.8273).')
  })

  it('does not call a cubic whose two ends meet a loop, nor a cubic that only comes near itself', () => {
    expect(diagnose('M0 0 C10 10 -10 10 0 0 Z')).toEqual([])
    // A = (−10, 0), B = (15, −90), C = (15, 90): σ = 1, σ² − π = 3, so t = (1 ∓ 3)/2 = −1 and 2, outside [0, 1].
    expect(diagnose('M0 0 C5 30 15 30 20 0 Z')).toEqual([])
  })

  it('agrees with a 256-piece polyline on seeded random cubics', () => {
    const pieces = 256
    let loops = 0
    fc.assert(fc.property(fc.array(fc.integer({ min: 0, max: 1000 }), { minLength: 8, maxLength: 8 }), (values) => {
      const cubic = values.map((v) => v / 10) as unknown as CubicSegment
      const found = diagnosePath(openPathOf(cubic)).filter((d) => d.kind === 'loop')
      const crossing = findPolylineCrossing(cubic, pieces)
      if (found.length === 1) {
        loops++
        const t1 = found[0].t!
        const t2 = Number(/and ([0-9.e-]+)\)/.exec(found[0].message)![1])
        const [p, q] = [evaluateSegment(cubic, t1), evaluateSegment(cubic, t2)]
        // t2 in the message has 4 digits: P moves at most |P'|max·5e-5 ≤ 3·141·5e-5 ≈ 0.02 from it.
        expect(Math.hypot(p[0] - q[0], p[1] - q[1])).toBeLessThan(0.05)
        // A clear loop (both parameters away from the ends, well apart) must be seen by the polyline.
        if (t1 > 4 / pieces && t2 < 1 - 4 / pieces && t2 - t1 > 16 / pieces) expect(crossing).not.toBeNull()
      }
      // A polyline crossing between pieces at least two apart is a loop of the curve near those pieces.
      if (crossing !== null) {
        expect(found).toHaveLength(1)
        expect(Math.abs(found[0].t! - crossing[0] / pieces)).toBeLessThan(3 / pieces)
      }
    }), { seed: SEED, numRuns: 300 })
    // Random control points in a square give loops often enough that this is no empty check.
    expect(loops).toBeGreaterThan(15)
  })
})

describe('open subpaths', () => {
  it('reports the end of a subpath not closed by Z, at t 1 of its last segment', () => {
    expect(diagnose('M0 0 L10 0 L10 10 M20 20 L30 20 L30 30 Z')).toEqual([{
      kind: 'open-subpath', segment: 1, subpath: 0, t: 1, point: [10, 10],
      message: 'Open subpath: it ends at (10, 10), away from its start (0, 0); a fill closes it with a straight line.',
    }])
  })

  it('does not report an unclosed subpath that ends on its start', () => {
    expect(diagnose('M0 0 L10 0 L10 10 L0 0')).toEqual([])
  })
})

describe('conventions and degenerate input', () => {
  // One path with every kind: cusp, loop, straight, coincident, zero-length (dropped and kept), open, dropped contour.
  const showcase: NormalisedPath = {
    ...pathOf('M0 0 C1 1 0 1 1 0 C31 30 -9 30 21 0 C31 0 41 0 51 0 C51 0 61 10 71 0 L71 0 L71 30 M5 5 Z'),
  }
  const expectedKinds: DiagnosticKind[] = ['cusp', 'loop', 'straight-curve', 'coincident-points', 'zero-length-segment', 'open-subpath', 'degenerate-contour']

  it('answers the example of its JSDoc', () => {
    expect(kindsOf(diagnose('M0 0 L10 0 L10 0 C20 0 20 10 10 10'))).toEqual(['zero-length-segment', 'open-subpath'])
  })

  it('finds every kind on one path, in path order', () => {
    expect(kindsOf(diagnosePath(showcase))).toEqual(expectedKinds)
  })

  it.each([2 ** -900, 2 ** -20, 2 ** 30, 2 ** 900])('scales with the path: factor %s changes only the points, by exactly that factor', (factor) => {
    const reference = diagnosePath(showcase)
    const scaled = diagnosePath(scalePath(showcase, factor))
    expect(scaled.map(({ kind, segment, subpath, t }) => ({ kind, segment, subpath, t })))
      .toEqual(reference.map(({ kind, segment, subpath, t }) => ({ kind, segment, subpath, t })))
    scaled.forEach((diagnostic, i) => {
      const point = reference[i].point
      expect(diagnostic.point).toEqual(point === null ? null : [point[0] * factor, point[1] * factor])
    })
  })

  it('throws RangeError only for a malformed argument', () => {
    expect(() => diagnosePath(null as unknown as NormalisedPath)).toThrow(RangeError)
    expect(() => diagnosePath({ segments: [[0, 0, 1]], subpaths: [] } as unknown as NormalisedPath)).toThrow(RangeError)
    expect(() => diagnosePath(openPathOf([0, 0, Number.NaN, 1]))).toThrow(RangeError)
    expect(() => diagnosePath({ segments: [[0, 0, 1, 1]], subpaths: [{ start: 0, count: 2, closed: false }] })).toThrow(RangeError)
    // Degenerate but well-formed: no throw, and a segment outside every subpath still gets its diagnostics.
    expect(diagnosePath({ segments: [[0, 0, 0, 0]], subpaths: [] })).toMatchObject([{ kind: 'zero-length-segment', segment: 0, subpath: null }])
  })

  it('never throws on seeded random degenerate paths, and gives finite t in [0, 1] and finite points', () => {
    // Coordinates from a few values so that points coincide and controls line up often, at magnitudes up to 1e300.
    const value = fc.constantFrom(0, 1, -1, 3, 1e-300, 1e300, -1e300, 0.1)
    const command = fc.oneof(
      fc.tuple(value, value).map(([x, y]) => `L${x} ${y}`),
      fc.tuple(value, value, value, value).map((v) => `Q${v.join(' ')}`),
      fc.tuple(value, value, value, value, value, value).map((v) => `C${v.join(' ')}`),
      fc.tuple(value, value).map(([x, y]) => `A3 2 30 1 0 ${x} ${y}`),
      fc.constant('Z'),
    )
    const pathData = fc.array(fc.tuple(value, value, fc.array(command, { maxLength: 6 })), { minLength: 1, maxLength: 4 })
      .map((subpaths) => subpaths.map(([x, y, commands]) => `M${x} ${y} ${commands.join(' ')}`).join(' '))
    fc.assert(fc.property(pathData, (data) => {
      for (const diagnostic of diagnose(data)) {
        if (diagnostic.t !== null) expect(diagnostic.t >= 0 && diagnostic.t <= 1).toBe(true)
        if (diagnostic.point !== null) expect(diagnostic.point.every(Number.isFinite)).toBe(true)
        expect(diagnostic.message.length).toBeGreaterThan(20)
      }
    }), { seed: SEED, numRuns: 400 })
  })
})

describe('cusps constructed exactly (seeded)', () => {
  it('finds the cusp at the chosen t0 and no loop', () => {
    // P'/3 = (t − t0)(u·t + w) has a cusp at t0: legs d0 = −t0·w, d1 = d0 + (w − t0·u)/2, d2 = u + (w − t0·u) + d0.
    // With integer u, w and t0 = k/16 every control point is a dyadic rational, exact in doubles.
    const vector = fc.tuple(fc.integer({ min: -40, max: 40 }), fc.integer({ min: -40, max: 40 }))
    fc.assert(fc.property(vector, vector, fc.integer({ min: 2, max: 14 }), vector, (u, w, k, start) => {
      fc.pre(u[0] * w[1] - u[1] * w[0] !== 0)
      const t0 = k / 16
      const leg = (axis: number): [number, number, number] => {
        const d0 = -t0 * w[axis], b = w[axis] - t0 * u[axis]
        return [d0, d0 + b / 2, u[axis] + b + d0]
      }
      const [lx, ly] = [leg(0), leg(1)]
      const cubic: CubicSegment = [
        start[0], start[1], start[0] + lx[0], start[1] + ly[0],
        start[0] + lx[0] + lx[1], start[1] + ly[0] + ly[1], start[0] + lx[0] + lx[1] + lx[2], start[1] + ly[0] + ly[1] + ly[2],
      ]
      expect(Math.hypot(...evaluateSegmentDerivative(cubic, t0))).toBe(0)
      const diagnostics = diagnosePath(openPathOf(cubic))
      const cusps = diagnostics.filter((d) => d.kind === 'cusp')
      expect(cusps).toHaveLength(1)
      expect(cusps[0].message.startsWith('Cusp at')).toBe(true)
      expect(Math.abs(cusps[0].t! - t0)).toBeLessThan(FIXTURE_TOLERANCE)
      expect(diagnostics.some((d) => d.kind === 'loop')).toBe(false)
    }), { seed: SEED, numRuns: 300 })
  })
})

/** Orientation sign of (b − a) × (c − a). */
function orientation(a: readonly number[], b: readonly number[], c: readonly number[]): number {
  return Math.sign((b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]))
}

/** The first pair (i, j), j ≥ i + 2, of pieces of the cubic's n-piece polyline that cross properly, or null. */
function findPolylineCrossing(cubic: CubicSegment, n: number): [number, number] | null {
  const points = Array.from({ length: n + 1 }, (_, i) => evaluateSegment(cubic, i / n))
  for (let i = 0; i < n; i++) {
    for (let j = i + 2; j < n; j++) {
      const [a, b, c, d] = [points[i], points[i + 1], points[j], points[j + 1]]
      if (orientation(a, b, c) * orientation(a, b, d) < 0 && orientation(c, d, a) * orientation(c, d, b) < 0) return [i, j]
    }
  }
  return null
}
