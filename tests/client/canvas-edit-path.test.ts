import { describe, expect, it } from 'vitest'
import { parsePathData, type NormalisedPath, type Segment } from '../../shared/geometry'
import {
  appendCubic,
  appendLine,
  changeSegmentKind,
  closeContour,
  deletePoints,
  getPoint,
  listPoints,
  mapNormalisedSegments,
  movePoints,
  nearestPoint,
  parseEditPath,
  removeLastSegment,
  segmentStart,
  serializeEditPath,
  setPoint,
  snapPoint,
  startContour,
} from '../../src/canvas/edit-path'
import type { EditPath, EditSegment, PointRef } from '../../src/canvas/types'
import { createSeededRandom } from '../helpers/seeded-random'

/** Four icons copied from DEMO_PATHS in server/services/seed.service.ts (our own invented demo drawings). */
const DEMO_DATA = {
  uTurn: 'M6 20V10A5 5 0 0 1 16 10V14H19L14.5 19L10 14H13V10A2 2 0 0 0 9 10V20Z',
  mapPin: 'M12 2C8.13 2 5 5.13 5 9C5 14.25 12 22 12 22S19 14.25 19 9C19 5.13 15.87 2 12 2Z M12 6.5A2.5 2.5 0 1 1 12 11.5A2.5 2.5 0 1 1 12 6.5Z',
  waveLine: 'M2 18Q4.5 16 7 18T12 18T17 18T22 18V21H2Z',
  anchor: 'M11 3H13V7H16V9H13V18.9C15.8 18.5 18 16.5 18.5 14H16.5L19.5 11L22 14H20.5C20 18 16.5 21 12 21S4 18 3.5 14H2L4.5 11L7.5 14H5.5C6 16.5 8.2 18.5 11 18.9V9H8V7H11Z',
}

function parsed(data: string): EditPath {
  const result = parseEditPath(data)
  if (!result.ok) throw new Error(`test data did not parse: ${result.message}`)
  return result.path
}

function normalised(data: string): NormalisedPath {
  const result = parsePathData(data)
  if (!result.ok) throw new Error(`core refused ${data}: ${result.error.message}`)
  return result.path
}

const at = (contour: number, segment: number, role: PointRef['role']): PointRef => ({ contour, segment, role })

describe('parseEditPath', () => {
  it('turns H and V into lines and relative commands into absolute ones', () => {
    expect(parsed('m1 2 h3 v4 l-1 1')).toEqual({
      contours: [{ start: [1, 2], segments: [{ kind: 'line', to: [4, 2] }, { kind: 'line', to: [4, 6] }, { kind: 'line', to: [3, 7] }], closed: false }],
    })
  })

  it('expands S and T by reflecting the previous control (SVG 1.1 §8.3.6 and §8.3.7)', () => {
    // S reflects c2 (3, 4) about the end (4, 4) → c1 (5, 4); T reflects Q's control (8, 2) about (9, 4) → (10, 6).
    expect(parsed('M0 0 C1 2 3 4 4 4 S7 2 8 4 Q8 2 9 4 T11 4').contours[0].segments).toEqual([
      { kind: 'cubic', c1: [1, 2], c2: [3, 4], to: [4, 4] },
      { kind: 'cubic', c1: [5, 4], c2: [7, 2], to: [8, 4] },
      { kind: 'quadratic', c1: [8, 2], to: [9, 4] },
      { kind: 'quadratic', c1: [10, 6], to: [11, 4] },
    ])
  })

  it('keeps an arc with its own parameters and a relative end made absolute', () => {
    expect(parsed('M6 20a5 4 30 1 0 10 -10').contours[0].segments).toEqual([
      { kind: 'arc', rx: 5, ry: 4, rotation: 30, largeArc: true, sweep: false, to: [16, 10] },
    ])
  })

  it('reads several contours, and a drawing command after Z starts a contour at the closed one’s start', () => {
    const path = parsed('M0 0 L10 0 L10 10 Z l5 -5 M20 20 L30 30 z')
    expect(path.contours).toEqual([
      { start: [0, 0], segments: [{ kind: 'line', to: [10, 0] }, { kind: 'line', to: [10, 10] }], closed: true },
      { start: [0, 0], segments: [{ kind: 'line', to: [5, -5] }], closed: false },
      { start: [20, 20], segments: [{ kind: 'line', to: [30, 30] }], closed: true },
    ])
  })

  it('drops a moveto that draws nothing, also one followed only by Z', () => {
    expect(parsed('M1 1 M2 2 L3 3 M4 4 Z M5 5').contours).toEqual([{ start: [2, 2], segments: [{ kind: 'line', to: [3, 3] }], closed: false }])
  })

  it('refuses malformed data with the core parser’s sentence', () => {
    const result = parseEditPath('M0 0 L1')
    const core = parsePathData('M0 0 L1')
    expect(core.ok).toBe(false)
    expect(result).toEqual({ ok: false, message: core.ok ? '' : core.error.message })
    expect(parseEditPath('L1 1').ok).toBe(false)
  })
})

describe('serializeEditPath', () => {
  it('writes absolute commands with the shortest round-trip numbers, −0 as 0', () => {
    const path: EditPath = {
      contours: [
        {
          start: [-0, 0.1],
          segments: [
            { kind: 'quadratic', c1: [1 / 3, 2], to: [3, 4] },
            { kind: 'cubic', c1: [5, 6], c2: [7, 8], to: [1e21, 1e-7] },
            { kind: 'arc', rx: 2, ry: 1.5, rotation: -45, largeArc: false, sweep: true, to: [0, 0] },
          ],
          closed: true,
        },
      ],
    }
    expect(serializeEditPath(path)).toBe('M 0 0.1 Q 0.3333333333333333 2 3 4 C 5 6 7 8 1e+21 1e-7 A 2 1.5 -45 0 1 0 0 Z')
  })

  const roundTrips: Record<string, string> = {
    ...DEMO_DATA,
    relativeAndShorthands: 'm3 4 h5 v-2 c1 1 2 2 3 0 s2 -2 3 0 q1 1 2 0 t2 0 a1.5 1.5 0 0 1 -3 0 z',
    zThenDrawing: 'M0 0 L10 0 L10 10 Z L5 -5 l1 1 z m2 2 h1',
    zeroLengthPieces: 'M0 0 L0 0 L4 0 Q4 0 4 0 C4 0 4 0 4 0 A1 1 0 0 1 4 0 L4 4 Z M9 9 L9 9 Z',
    awkwardNumbers: 'M0.1 0.2 L0.30000000000000004 -1e-9 L123456789.123 7e20',
  }
  for (const [name, data] of Object.entries(roundTrips)) {
    it(`round-trips ${name}: parse(serialize(p)) equals p and the core sees the same segments`, () => {
      const path = parsed(data)
      const written = serializeEditPath(path)
      expect(parsed(written)).toEqual(path)
      const before = normalised(data)
      const after = normalised(written)
      expect(after.segments).toEqual(before.segments)
      expect(after.subpaths).toEqual(before.subpaths)
    })
  }

  it('leaves out a contour the pen just started', () => {
    const started = startContour(parsed('M0 0 L1 1'), [5, 5])
    expect(serializeEditPath(started.path)).toBe('M 0 0 L 1 1')
  })
})

describe('points', () => {
  const path = parsed('M0 0 Q1 2 3 0 C4 1 5 1 6 0 L7 7')

  it('lists every point in drawing order with on-curve flags', () => {
    expect(listPoints(path)).toEqual([
      { ref: at(0, -1, 'start'), point: [0, 0], onCurve: true },
      { ref: at(0, 0, 'c1'), point: [1, 2], onCurve: false },
      { ref: at(0, 0, 'to'), point: [3, 0], onCurve: true },
      { ref: at(0, 1, 'c1'), point: [4, 1], onCurve: false },
      { ref: at(0, 1, 'c2'), point: [5, 1], onCurve: false },
      { ref: at(0, 1, 'to'), point: [6, 0], onCurve: true },
      { ref: at(0, 2, 'to'), point: [7, 7], onCurve: true },
    ])
  })

  it('gets points and segment starts, and refuses points the path lacks', () => {
    expect(getPoint(path, at(0, 1, 'c2'))).toEqual([5, 1])
    expect(segmentStart(path, 0, 0)).toEqual([0, 0])
    expect(segmentStart(path, 0, 2)).toEqual([6, 0])
    expect(() => getPoint(path, at(0, 0, 'c2'))).toThrow(RangeError)
    expect(() => getPoint(path, at(1, -1, 'start'))).toThrow(RangeError)
    expect(() => segmentStart(path, 0, 3)).toThrow(RangeError)
  })
})

describe('movePoints and setPoint', () => {
  it('carries the controls attached to a moved on-curve point and shares what did not move', () => {
    const path = parsed('M0 0 C1 0 2 1 3 1 C4 1 5 0 6 0 M20 20 L30 30')
    const moved = movePoints(path, [at(0, 0, 'to')], 10, 20)
    expect(moved.contours[0]).toEqual({
      start: [0, 0],
      segments: [
        { kind: 'cubic', c1: [1, 0], c2: [12, 21], to: [13, 21] },
        { kind: 'cubic', c1: [14, 21], c2: [5, 0], to: [6, 0] },
      ],
      closed: false,
    })
    expect(moved.contours[1]).toBe(path.contours[1])
  })

  it('moves a control point alone, and a point listed twice (or also carried) once', () => {
    const path = parsed('M0 0 C1 0 2 1 3 1')
    expect(movePoints(path, [at(0, 0, 'c1')], 1, 1).contours[0].segments[0]).toEqual({ kind: 'cubic', c1: [2, 1], c2: [2, 1], to: [3, 1] })
    const twice = movePoints(path, [at(0, 0, 'to'), at(0, 0, 'to'), at(0, 0, 'c2')], 1, 1)
    expect(twice.contours[0].segments[0]).toEqual({ kind: 'cubic', c1: [1, 0], c2: [3, 2], to: [4, 2] })
  })

  it('moves a quadratic’s shared control only when both its ends move', () => {
    const path = parsed('M0 0 Q2 4 4 0')
    expect(movePoints(path, [at(0, 0, 'to')], 1, 0).contours[0].segments[0]).toEqual({ kind: 'quadratic', c1: [2, 4], to: [5, 0] })
    expect(movePoints(path, [at(0, -1, 'start')], 1, 0).contours[0].segments[0]).toEqual({ kind: 'quadratic', c1: [2, 4], to: [4, 0] })
    const both = movePoints(path, [at(0, -1, 'start'), at(0, 0, 'to')], 1, 0)
    expect(both.contours[0]).toEqual({ start: [1, 0], segments: [{ kind: 'quadratic', c1: [3, 4], to: [5, 0] }], closed: false })
  })

  it('moves the start and the last end of a closed contour together when they coincide', () => {
    const path = parsed('M0 0 C1 -1 9 -1 10 0 L10 10 C9 11 1 11 0 0 Z')
    const expected = {
      start: [5, 5],
      segments: [
        { kind: 'cubic', c1: [6, 4], c2: [9, -1], to: [10, 0] },
        { kind: 'line', to: [10, 10] },
        { kind: 'cubic', c1: [9, 11], c2: [6, 16], to: [5, 5] },
      ],
      closed: true,
    }
    expect(movePoints(path, [at(0, -1, 'start')], 5, 5).contours[0]).toEqual(expected)
    expect(movePoints(path, [at(0, 2, 'to')], 5, 5).contours[0]).toEqual(expected)
    expect(movePoints(path, [at(0, -1, 'start'), at(0, 2, 'to')], 5, 5).contours[0]).toEqual(expected)
  })

  it('keeps the start apart from a closing end that does not coincide, or on an open contour', () => {
    const closed = parsed('M0 0 L10 0 L10 10 Z')
    expect(movePoints(closed, [at(0, -1, 'start')], 1, 1).contours[0].segments).toBe(closed.contours[0].segments)
    const open = parsed('M0 0 L10 0 L0 0')
    expect(movePoints(open, [at(0, -1, 'start')], 1, 1).contours[0].segments[1]).toEqual({ kind: 'line', to: [0, 0] })
  })

  it('returns the path itself for a zero move, and refuses a missing point or a non-finite move', () => {
    const path = parsed('M0 0 L1 1')
    expect(movePoints(path, [at(0, 0, 'to')], 0, 0)).toBe(path)
    expect(() => movePoints(path, [at(0, 0, 'c1')], 1, 1)).toThrow(RangeError)
    expect(() => movePoints(path, [at(0, 0, 'to')], Number.NaN, 1)).toThrow(RangeError)
  })

  it('sets a point exactly and carries its controls by the difference', () => {
    const path = parsed('M0 0 C1 0 2 1 3 1 C4 1 5 0 6 0')
    // 0.1 + (0.3 − 3) would not give 0.3 back exactly in doubles; the set point must be exact.
    const set = setPoint(path, at(0, 0, 'to'), [0.3, 0.7])
    expect(set.contours[0].segments[0]).toEqual({ kind: 'cubic', c1: [1, 0], c2: [2 + (0.3 - 3), 1 + (0.7 - 1)], to: [0.3, 0.7] })
    expect(set.contours[0].segments[1]).toEqual({ kind: 'cubic', c1: [4 + (0.3 - 3), 1 + (0.7 - 1)], c2: [5, 0], to: [6, 0] })
    const ring = parsed('M0 0 L10 0 L0 0 Z')
    expect(setPoint(ring, at(0, 1, 'to'), [0.1, 0.2]).contours[0]).toEqual({
      start: [0.1, 0.2],
      segments: [{ kind: 'line', to: [10, 0] }, { kind: 'line', to: [0.1, 0.2] }],
      closed: true,
    })
    expect(setPoint(path, at(0, 1, 'to'), [6, 0])).toBe(path)
  })
})

describe('deletePoints', () => {
  it('removes the segment ending at a deleted vertex; the next one starts from the previous point', () => {
    const path = parsed('M0 0 L10 0 C12 2 12 8 10 10 L0 10')
    expect(deletePoints(path, [at(0, 0, 'to')]).contours[0]).toEqual({
      start: [0, 0],
      segments: [{ kind: 'cubic', c1: [12, 2], c2: [12, 8], to: [10, 10] }, { kind: 'line', to: [0, 10] }],
      closed: false,
    })
  })

  it('makes the first segment’s end the start when the start is deleted', () => {
    expect(deletePoints(parsed('M0 0 L10 0 L10 10 Z'), [at(0, -1, 'start')]).contours[0]).toEqual({
      start: [10, 0],
      segments: [{ kind: 'line', to: [10, 10] }],
      closed: true,
    })
    expect(deletePoints(parsed('M0 0 L1 0 L2 0 L3 0'), [at(0, -1, 'start'), at(0, 0, 'to')]).contours[0]).toEqual({
      start: [2, 0],
      segments: [{ kind: 'line', to: [3, 0] }],
      closed: false,
    })
  })

  it('deletes a closed contour’s linked vertex with both its segments, the closing line joining the neighbours', () => {
    expect(deletePoints(parsed('M0 0 L10 0 L10 10 L0 0 Z'), [at(0, 2, 'to')]).contours[0]).toEqual({
      start: [10, 0],
      segments: [{ kind: 'line', to: [10, 10] }],
      closed: true,
    })
  })

  it('removes a contour left without segments and keeps the others', () => {
    const path = parsed('M0 0 L5 5 M20 20 L30 30')
    expect(deletePoints(path, [at(0, 0, 'to')])).toEqual({ contours: [path.contours[1]] })
    expect(deletePoints(path, [at(1, -1, 'start')]).contours).toHaveLength(1)
  })

  it('turns a cubic losing a control into a quadratic with the other one, and a quadratic into a line', () => {
    const path = parsed('M0 0 C1 2 3 4 5 0 Q6 3 7 0 C8 1 9 1 10 0')
    const result = deletePoints(path, [at(0, 0, 'c1'), at(0, 1, 'c1'), at(0, 2, 'c1'), at(0, 2, 'c2')])
    expect(result.contours[0].segments).toEqual([
      { kind: 'quadratic', c1: [3, 4], to: [5, 0] },
      { kind: 'line', to: [7, 0] },
      { kind: 'line', to: [10, 0] },
    ])
    expect(deletePoints(path, [at(0, 0, 'c2')]).contours[0].segments[0]).toEqual({ kind: 'quadratic', c1: [1, 2], to: [5, 0] })
    expect(deletePoints(path, [])).toBe(path)
  })
})

describe('changeSegmentKind', () => {
  const kindOf = (path: EditPath): EditSegment => path.contours[0].segments[0]
  const line = parsed('M0 0 L6 12')

  it('makes a line a quadratic with the control at the midpoint, and a cubic with controls at 1/3 and 2/3', () => {
    expect(kindOf(changeSegmentKind(line, { contour: 0, segment: 0 }, 'quadratic'))).toEqual({ kind: 'quadratic', c1: [3, 6], to: [6, 12] })
    expect(kindOf(changeSegmentKind(line, { contour: 0, segment: 0 }, 'cubic'))).toEqual({ kind: 'cubic', c1: [2, 4], c2: [4, 8], to: [6, 12] })
  })

  it('elevates a quadratic exactly: P0, P0 + 2/3(Q − P0), P2 + 2/3(Q − P2), P2', () => {
    // Degree elevation of a Bézier curve, a standard identity (e.g. Farin, Curves and Surfaces for CAGD, §6; from memory).
    const quadratic = parsed('M0 0 Q3 6 6 0')
    expect(kindOf(changeSegmentKind(quadratic, { contour: 0, segment: 0 }, 'cubic'))).toEqual({ kind: 'cubic', c1: [2, 4], c2: [4, 4], to: [6, 0] })
  })

  it('lowers a cubic to the quadratic with control (3(c1 + c2) − (P0 + P3))/4', () => {
    // The elevated cubic of Q (3, 6) gives Q back; (0,0)(0,4)(4,4)(4,0): (3·(4, 8) − (4, 0))/4 = (2, 6).
    expect(kindOf(changeSegmentKind(parsed('M0 0 C2 4 4 4 6 0'), { contour: 0, segment: 0 }, 'quadratic'))).toEqual({ kind: 'quadratic', c1: [3, 6], to: [6, 0] })
    expect(kindOf(changeSegmentKind(parsed('M0 0 C0 4 4 4 4 0'), { contour: 0, segment: 0 }, 'quadratic'))).toEqual({ kind: 'quadratic', c1: [2, 6], to: [4, 0] })
  })

  it('makes anything a line, and lines and curves a half circle on the chord', () => {
    const ref = { contour: 0, segment: 0 }
    expect(kindOf(changeSegmentKind(parsed('M0 0 C1 2 3 4 5 0'), ref, 'line'))).toEqual({ kind: 'line', to: [5, 0] })
    expect(kindOf(changeSegmentKind(parsed('M0 0 A5 5 0 0 1 6 8'), ref, 'line'))).toEqual({ kind: 'line', to: [6, 8] })
    // Chord (0,0)–(6,8) has length 10 (a 3-4-5 triangle), so the radius is 5.
    const arc = { kind: 'arc', rx: 5, ry: 5, rotation: 0, largeArc: false, sweep: true, to: [6, 8] }
    expect(kindOf(changeSegmentKind(parsed('M0 0 L6 8'), ref, 'arc'))).toEqual(arc)
    expect(kindOf(changeSegmentKind(parsed('M0 0 Q9 9 6 8'), ref, 'arc'))).toEqual(arc)
    expect(kindOf(changeSegmentKind(parsed('M0 0 C1 2 3 4 6 8'), ref, 'arc'))).toEqual(arc)
  })

  it('makes an arc a cubic on its chord (not exact) and keeps the neighbours', () => {
    const path = parsed('M1 1 L0 0 A5 5 0 0 1 6 -3 L9 9')
    const result = changeSegmentKind(path, { contour: 0, segment: 1 }, 'cubic')
    expect(result.contours[0].segments[1]).toEqual({ kind: 'cubic', c1: [2, -1], c2: [4, -2], to: [6, -3] })
    expect(result.contours[0].segments[0]).toBe(path.contours[0].segments[0])
    expect(result.contours[0].segments[2]).toBe(path.contours[0].segments[2])
    expect(changeSegmentKind(path, { contour: 0, segment: 1 }, 'arc')).toBe(path)
    expect(() => changeSegmentKind(path, { contour: 0, segment: 3 }, 'line')).toThrow(RangeError)
  })
})

describe('pen', () => {
  it('starts a contour, draws lines and cubics, closes it and takes segments back', () => {
    const started = startContour(parsed('M0 0 L1 1'), [10, 10])
    expect(started.contour).toBe(1)
    let path = appendLine(started.path, 1, [20, 10])
    path = appendCubic(path, 1, [25, 10], [25, 20], [20, 20])
    path = appendLine(path, 1, [10, 10])
    path = closeContour(path, 1)
    expect(path.contours[1]).toEqual({
      start: [10, 10],
      segments: [{ kind: 'line', to: [20, 10] }, { kind: 'cubic', c1: [25, 10], c2: [25, 20], to: [20, 20] }, { kind: 'line', to: [10, 10] }],
      closed: true,
    })
    // The last end is the start, so the core adds no closing line: 1 + 3 segments.
    expect(normalised(serializeEditPath(path)).segments).toHaveLength(4)
    expect(closeContour(path, 1)).toBe(path)
    expect(() => appendLine(path, 1, [0, 0])).toThrow(RangeError)
    const shorter = removeLastSegment(path, 1)
    expect(shorter.contours[1].segments).toHaveLength(2)
    expect(shorter.contours[0]).toBe(path.contours[0])
  })

  it('keeps an emptied pen contour, and leaves a contour without segments unchanged', () => {
    const started = startContour({ contours: [] }, [3, 4])
    const drawn = appendLine(started.path, 0, [5, 6])
    const emptied = removeLastSegment(drawn, 0)
    expect(emptied).toEqual({ contours: [{ start: [3, 4], segments: [], closed: false }] })
    expect(removeLastSegment(emptied, 0)).toBe(emptied)
    expect(() => appendLine(emptied, 1, [0, 0])).toThrow(RangeError)
  })
})

/** The end point of a normalised segment tuple: (x1, y1) for lines and arcs, the last pair for curves. */
function segmentEnd(segment: Segment): readonly [number, number] {
  if (segment.length === 12) return [segment[2], segment[3]]
  return [segment[segment.length - 2], segment[segment.length - 1]]
}

/** The checked claim: the map has one entry per core segment, each ending where its EditPath segment (or the contour start) ends. */
function expectMapMatchesCore(path: EditPath, context: string): void {
  const map = mapNormalisedSegments(path)
  const core = normalised(serializeEditPath(path))
  expect(map.length, context).toBe(core.segments.length)
  let subpath = 0
  map.forEach((ref, i) => {
    while (i >= core.subpaths[subpath].start + core.subpaths[subpath].count) subpath++
    if (ref === null) {
      expect(core.subpaths[subpath].closed, context).toBe(true)
      expect(i, context).toBe(core.subpaths[subpath].start + core.subpaths[subpath].count - 1)
      return
    }
    expect(segmentEnd(core.segments[i]), `${context}, segment ${i}`).toEqual(path.contours[ref.contour].segments[ref.segment].to)
  })
}

describe('mapNormalisedSegments', () => {
  it('maps an implicit closing line to null and skips a zero-length segment', () => {
    const path = parsed('M0 0 L10 0 L10 0 L10 10 Z')
    expect(mapNormalisedSegments(path)).toEqual([{ contour: 0, segment: 0 }, { contour: 0, segment: 2 }, null])
    expectMapMatchesCore(path, 'square with a repeated vertex')
  })

  it('skips zero-length curves and arcs and a contour of only such pieces, and adds no closing line at the start', () => {
    const path = parsed('M0 0 L4 0 Q4 0 4 0 C4 0 4 0 4 0 A1 1 0 0 1 4 0 Q5 5 4 0 L0 0 Z M9 9 L9 9 Z M1 1 L2 2')
    expect(mapNormalisedSegments(path)).toEqual([
      { contour: 0, segment: 0 },
      { contour: 0, segment: 4 },
      { contour: 0, segment: 5 },
      { contour: 2, segment: 0 },
    ])
    expectMapMatchesCore(path, 'zero-length pieces')
  })

  it('matches the core on the demo icons', () => {
    for (const [name, data] of Object.entries(DEMO_DATA)) expectMapMatchesCore(parsed(data), name)
  })

  it('matches the core on seeded random paths full of coincident points', () => {
    for (let seed = 1; seed <= 40; seed++) {
      const random = createSeededRandom(seed)
      // A 3×3 integer grid makes coincident points (zero-length pieces, closing ends at the start) common.
      const point = (): [number, number] => [random.integer(0, 2), random.integer(0, 2)]
      let data = ''
      for (let c = random.integer(1, 3); c > 0; c--) {
        data += `M${point().join(' ')}`
        for (let s = random.integer(1, 4); s > 0; s--) {
          const kind = random.pick(['L', 'Q', 'C', 'A'] as const)
          if (kind === 'L') data += ` L${point().join(' ')}`
          else if (kind === 'Q') data += ` Q${[...point(), ...point()].join(' ')}`
          else if (kind === 'C') data += ` C${[...point(), ...point(), ...point()].join(' ')}`
          else data += ` A1 1 0 0 1 ${point().join(' ')}`
        }
        if (random.next() < 0.6) data += ' Z '
      }
      expectMapMatchesCore(parsed(data), `seed ${seed}: ${data}`)
    }
  })
})

describe('nearestPoint', () => {
  const path = parsed('M0 0 C1 0 2 1 3 1 L3 5')

  it('finds the nearest point within the radius, controls only when asked', () => {
    expect(nearestPoint(path, [2.9, 1.2], 0.5, true)).toEqual(at(0, 0, 'to'))
    expect(nearestPoint(path, [1.1, 0.1], 0.5, true)).toEqual(at(0, 0, 'c1'))
    expect(nearestPoint(path, [1.1, 0.1], 0.5, false)).toBeNull()
    expect(nearestPoint(path, [3, 3], 1.5, true)).toBeNull()
    // Distance 2 exactly is within a radius of 2.
    expect(nearestPoint(path, [3, 3], 2, true)).toEqual(at(0, 1, 'to'))
  })

  it('prefers an on-curve point over a control at the same distance, and the later-drawn of equals', () => {
    // The start (0, 0) and the later-listed control c1 (0, 0) are both at distance 1.
    const touching = parsed('M0 0 C0 0 2 1 3 1')
    expect(nearestPoint(touching, [0, 1], 1, true)).toEqual(at(0, -1, 'start'))
    const ring = parsed('M0 0 L4 0 L0 0 Z')
    expect(nearestPoint(ring, [0, 1], 2, false)).toEqual(at(0, 1, 'to'))
  })
})

describe('snapPoint', () => {
  it('snaps to the nearest target within the radius before the grid', () => {
    const targets = [[10, 10], [10.5, 10.5], [20, 20]] as const
    expect(snapPoint([10.4, 10.3], { gridStep: 5, targets, radius: 1 })).toEqual({ point: [10.5, 10.5], snappedTo: 'point' })
  })

  it('rounds to the grid when no target is near, exactly for decimal steps', () => {
    expect(snapPoint([7.4, -2.6], { gridStep: 5, targets: [[20, 20]], radius: 1 })).toEqual({ point: [5, -5], snappedTo: 'grid' })
    // 3 × 0.1 is 0.30000000000000004 in doubles; the grid gives the double nearest 0.3.
    expect(snapPoint([0.31, -0.04], { gridStep: 0.1, targets: [], radius: 1 })).toEqual({ point: [0.3, 0], snappedTo: 'grid' })
    expect(Object.is(snapPoint([0.31, -0.04], { gridStep: 0.1, targets: [], radius: 1 }).point[1], 0)).toBe(true)
  })

  it('leaves the point alone without grid or near target, and refuses a grid step of 0', () => {
    const point = [3.7, 1.2] as const
    expect(snapPoint(point, { gridStep: null, targets: [[9, 9]], radius: 2 })).toEqual({ point: [3.7, 1.2], snappedTo: null })
    expect(() => snapPoint(point, { gridStep: 0, targets: [], radius: 2 })).toThrow(RangeError)
  })
})
