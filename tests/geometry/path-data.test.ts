/**
 * Path data → normalised segments. The expected segments follow from the path grammar of
 * SVG 1.1 §8.3 (relative commands, H/V, the S and T reflections, Z and the subpath start).
 */
import { describe, expect, it } from 'vitest'
import { parsePathData } from '../../shared/geometry/index'
import { pathOf } from './support/geometry-helpers'

describe('normalisation', () => {
  it('turns relative commands and H/V into the same absolute lines', () => {
    const relative = pathOf('m10 20 h5 v5 l-5 0 z')
    const absolute = pathOf('M10 20 H15 V25 L10 25 Z')
    expect(relative).toEqual(absolute)
    expect(absolute.segments).toEqual([[10, 20, 15, 20], [15, 20, 15, 25], [15, 25, 10, 25], [10, 25, 10, 20]])
    expect(absolute.subpaths).toEqual([{ start: 0, count: 4, closed: true }])
  })

  it('reflects the previous control point for S and T', () => {
    // S: first control = reflection of (3, 4) about (5, 5) = (7, 6). T: control = reflection of (2, 4) about (4, 0) = (6, −4).
    expect(pathOf('M0 0 C1 2 3 4 5 5 S9 8 10 10').segments[1]).toEqual([5, 5, 7, 6, 9, 8, 10, 10])
    expect(pathOf('M0 0 Q2 4 4 0 T8 0').segments[1]).toEqual([4, 0, 6, -4, 8, 0])
    // S after a non-curve uses the current point as its first control.
    expect(pathOf('M0 0 L1 1 S3 3 4 4').segments[1]).toEqual([1, 1, 1, 1, 3, 3, 4, 4])
  })

  it('adds a closing line only when the end is away from the start', () => {
    expect(pathOf('M0 0 L10 0 L10 10 Z').segments).toHaveLength(3)
    expect(pathOf('M0 0 L10 0 L10 10 L0 0 Z').segments).toHaveLength(3)
    expect(pathOf('M0 0 L10 0 L10 10 L0 0 Z').subpaths[0].closed).toBe(true)
  })

  it('keeps subpaths apart, and starts a subpath after Z at the closed one’s start', () => {
    const path = pathOf('M0 0 L10 0 L10 10 Z L5 -5 M20 20 L30 30')
    expect(path.subpaths).toEqual([
      { start: 0, count: 3, closed: true },
      { start: 3, count: 1, closed: false },
      { start: 4, count: 1, closed: false },
    ])
    expect(path.segments[3]).toEqual([0, 0, 5, -5])
    // m after z is relative to the closed subpath's start (1, 1).
    expect(pathOf('m1 1 l2 2 z m1 1 l1 0').segments[2]).toEqual([2, 2, 3, 2])
  })

  it('treats coordinate pairs after M as implicit line commands', () => {
    expect(pathOf('M0 0 1 1 2 0').segments).toEqual([[0, 0, 1, 1], [1, 1, 2, 0]])
  })

  it('drops zero-length pieces and the subpaths they leave empty', () => {
    const path = pathOf('M0 0 L0 0 C0 0 0 0 0 0 L5 0 M7 7 Z M8 8 A3 3 0 0 1 8 8')
    expect(path.segments).toEqual([[0, 0, 5, 0]])
    expect(path.subpaths).toEqual([{ start: 0, count: 1, closed: false }])
    // A cubic with coincident end points but other controls is a loop, not empty.
    expect(pathOf('M0 0 C10 10 -10 10 0 0').segments).toHaveLength(1)
  })

  it('lists the dropped pieces in path-data order, leaving segment and subpath indices as they were', () => {
    const path = pathOf('M0 0 L0 0 C0 0 0 0 0 0 L5 0 M7 7 Z M8 8 A3 3 0 0 1 8 8 M9 9 L9 9 H9 V9 L10 9 Q10 9 10 9')
    expect(path.segments).toEqual([[0, 0, 5, 0], [9, 9, 10, 9]])
    expect(path.subpaths).toEqual([{ start: 0, count: 1, closed: false }, { start: 1, count: 1, closed: false }])
    expect(path.dropped).toEqual([
      { kind: 'segment', command: 'L', point: [0, 0], subpath: 0, segmentsBefore: 0 },
      { kind: 'segment', command: 'C', point: [0, 0], subpath: 0, segmentsBefore: 0 },
      { kind: 'contour', point: [7, 7], commands: 1, subpathsBefore: 1, segmentsBefore: 1 },
      { kind: 'contour', point: [8, 8], commands: 1, subpathsBefore: 1, segmentsBefore: 1 },
      { kind: 'segment', command: 'L', point: [9, 9], subpath: 1, segmentsBefore: 1 },
      { kind: 'segment', command: 'H', point: [9, 9], subpath: 1, segmentsBefore: 1 },
      { kind: 'segment', command: 'V', point: [9, 9], subpath: 1, segmentsBefore: 1 },
      { kind: 'segment', command: 'Q', point: [10, 9], subpath: 1, segmentsBefore: 2 },
    ])
  })

  it('records no dropped list when nothing was dropped, nor for a closing point written out before Z or a lone moveto', () => {
    expect(pathOf('M0 0 L10 0 L10 10 L0 0 Z M40 40').dropped).toBeUndefined()
    // A contour after Z without a moveto starts at the closed one's start (0, 0); Z Z makes a one-point contour there.
    expect(pathOf('M0 0 L10 0 L10 10 Z Z').dropped).toEqual([{ kind: 'contour', point: [0, 0], commands: 1, subpathsBefore: 1, segmentsBefore: 3 }])
  })

  it('keeps arcs exact (12 values) and makes a zero-radius arc a line', () => {
    const path = pathOf('M0 0 A5 5 0 0 1 10 0 A0 3 0 0 1 20 0')
    expect(path.segments[0]).toHaveLength(12)
    expect(path.segments[1]).toEqual([10, 0, 20, 0])
  })

  it('accepts the empty path as no segments', () => {
    expect(parsePathData('')).toEqual({ ok: true, path: { segments: [], subpaths: [] } })
  })
})

describe('malformed path data', () => {
  it('reports truncated data with the invalid_path code and the position', () => {
    const result = parsePathData('M10 10 L 20')
    expect(result).toEqual({
      ok: false,
      error: { code: 'invalid_path', message: 'Path data is malformed at character 11: missed param.', position: 11 },
    })
  })

  it.each([
    ['no initial moveto', 'L1 2'],
    ['a truncated curve', 'M1 2 C1 2 3'],
    ['an unknown command', 'M0 0 L1 1 X'],
    ['a bad arc flag', 'M0 0 A5 5 0 2 0 10 10'],
    ['a NaN', 'M0 0 l NaN 2'],
    ['a trailing comma', 'M0,0 L1,1,'],
    ['a number overflowing to infinity', 'M1e400 0 L2 2'],
  ])('refuses %s', (_, pathData) => {
    const result = parsePathData(pathData)
    expect(result.ok).toBe(false)
    if (!result.ok) {
      expect(result.error.code).toBe('invalid_path')
      expect(result.error.message.length).toBeGreaterThan(10)
    }
  })

  it('throws RangeError when called with something that is not a string', () => {
    expect(() => parsePathData(42 as unknown as string)).toThrow(RangeError)
  })
})
