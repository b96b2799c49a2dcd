/**
 * SVG import: our own fixture drawings (fixtures/svg/) read into path data and checked against
 * values computed by hand from the SVG 1.1 specification (sections named beside each check),
 * then every refusal: XML bomb, DOCTYPE, PNG bytes, non-SVG XML, external references and the
 * element, depth, segment and size limits.
 */
import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { describe, expect, it } from 'vitest'
import { evaluateSegment } from '../../shared/geometry/index'
import type { ArcSegment } from '../../shared/geometry/index'
import { importSvg, SVG_IMPORT_LIMITS } from '../../server/services/import/svg-import'
import type { ImportedPath, SvgImportResult } from '../../server/services/import/svg-import'
import { pathOf } from '../geometry/support/geometry-helpers'
import { commandsOf } from './support/path-commands'
import type { Command } from './support/path-commands'

/**
 * Output numbers keep 12 significant digits (path-data-format.ts); for coordinates below 1000
 * that is within 5e-10, so hand-computed irrational values are compared within twice that.
 */
const ROUNDED_TOLERANCE = 1e-9
/** Arc angles are written with 9 decimals: within 5e-10 degrees of the exact angle. */
const ANGLE_TOLERANCE = 1e-9
/** Points evaluated on a rounded arc: radii and ends within 5e-10 move a point by a few 1e-9 at r ≈ 10. */
const CURVE_POINT_TOLERANCE = 1e-8

const SVG_NS = 'xmlns="http://www.w3.org/2000/svg"'

function fixture(name: string): Buffer {
  return readFileSync(new URL(`./fixtures/svg/${name}`, import.meta.url))
}

function imported(result: SvgImportResult): { paths: ImportedPath[]; warnings: string[] } {
  if (!result.ok) throw new Error(`expected an import, got ${result.code}: ${result.message}`)
  return result
}

function importFixture(name: string): { paths: ImportedPath[]; warnings: string[] } {
  return imported(importSvg(fixture(name), name))
}

function importText(text: string): SvgImportResult {
  return importSvg(Buffer.from(text, 'utf8'), 'inline.svg')
}

function byName(paths: readonly ImportedPath[]): Record<string, ImportedPath> {
  return Object.fromEntries(paths.map((path) => [path.name, path]))
}

function dataByName(paths: readonly ImportedPath[]): Record<string, string> {
  return Object.fromEntries(paths.map((path) => [path.name, path.data]))
}

function expectCommandsClose(actual: string, expected: Command[], tolerance: number): void {
  const commands = commandsOf(actual)
  expect(commands.map((command) => command[0]), actual).toEqual(expected.map((command) => command[0]))
  commands.forEach((command, i) => {
    expect(command.length, `${actual}: command ${i}`).toBe(expected[i].length)
    for (let k = 1; k < command.length; k++) {
      expect(Math.abs((command[k] as number) - (expected[i][k] as number)), `${actual}: command ${i} number ${k}`).toBeLessThanOrEqual(tolerance)
    }
  })
}

/** An ellipse's radii and rotation in one form: rx ≥ ry, angle in [0°, 180°). */
function canonicalEllipse(rx: number, ry: number, angle: number): [number, number, number] {
  const [major, minor, turned] = rx >= ry ? [rx, ry, angle] : [ry, rx, angle + 90]
  return [major, minor, ((turned % 180) + 180) % 180]
}

describe('every element kind (every-element.svg; SVG 1.1 chapter 9, basic shapes)', () => {
  const { paths, warnings } = importFixture('every-element.svg')
  const data = dataByName(paths)

  it('finds one path per element, named by id, in document order', () => {
    expect(paths.map((path) => [path.name, path.element, path.elementId])).toEqual([
      ['post', 'path', 'post'], ['board', 'rect', 'board'], ['pill', 'rect', 'pill'], ['square', 'rect', 'square'],
      ['sun', 'circle', 'sun'], ['pond', 'ellipse', 'pond'], ['ground', 'line', 'ground'],
      ['fence', 'polyline', 'fence'], ['flag', 'polygon', 'flag'],
    ])
    expect(warnings).toEqual([])
    expect(paths.every((path) => path.fillRule === 'nonzero' && path.warnings.length === 0)).toBe(true)
  })

  it('keeps path data as written when nothing transforms it', () => {
    expect(data.post).toBe('M10 70 L10 20 L30 20')
  })

  it('rounds rect corners with arcs per §9.2, ry taken from rx', () => {
    // x 20, y 10, width 40, height 20, rx 5 → ry 5: move to (x+rx, y), then H/A/V/A/H/A/V/A.
    expect(data.board).toBe('M25 10 H55 A5 5 0 0 1 60 15 V25 A5 5 0 0 1 55 30 H25 A5 5 0 0 1 20 25 V15 A5 5 0 0 1 25 10 Z')
  })

  it('clamps each corner radius to half its side per §9.2 (the other radius is not reduced with it)', () => {
    // rx 8 → ry 8; ry clamped to height/2 = 5; rx stays 8 ≤ width/2 = 15. The vertical sides vanish
    // (height = 2·ry), so no V command is written.
    expect(data.pill).toBe('M8 40 H22 A8 5 0 0 1 30 45 A8 5 0 0 1 22 50 H8 A8 5 0 0 1 0 45 A8 5 0 0 1 8 40 Z')
  })

  it('draws a rect without radii as four lines', () => {
    expect(data.square).toBe('M70 10 H80 V20 H70 Z')
  })

  it('draws circle and ellipse as four quarter arcs from the rightmost point (§9.3, §9.4)', () => {
    expect(data.sun).toBe('M110 20 A10 10 0 0 1 100 30 A10 10 0 0 1 90 20 A10 10 0 0 1 100 10 A10 10 0 0 1 110 20 Z')
    expect(data.pond).toBe('M110 60 A20 5 0 0 1 90 65 A20 5 0 0 1 70 60 A20 5 0 0 1 90 55 A20 5 0 0 1 110 60 Z')
    // Each arc is centred on (cx, cy) and turns +90° (sweep-flag 1: the positive-angle direction).
    const arcs = pathOf(data.sun).segments as ArcSegment[]
    expect(arcs).toHaveLength(4)
    for (const arc of arcs) {
      expect([arc[4], arc[5], arc[6], arc[7]]).toEqual([100, 20, 10, 10])
      expect(arc[11]).toBeCloseTo(Math.PI / 2, 14)
    }
  })

  it('draws line, polyline and polygon as lines; only polygon closes (§9.5–9.7)', () => {
    expect(data.ground).toBe('M0 75 L120 75')
    expect(data.fence).toBe('M40 60 L50 50 L60 60 L70 50')
    expect(data.flag).toBe('M30 20 L45 25 L30 30 Z')
    expect(pathOf(data.fence).subpaths).toEqual([{ start: 0, count: 3, closed: false }])
    expect(pathOf(data.flag).subpaths).toEqual([{ start: 0, count: 3, closed: true }])
  })
})

describe('nested transforms (nested-transforms.svg; SVG 1.1 §7.4–7.6)', () => {
  const data = dataByName(importFixture('nested-transforms.svg').paths)

  it('composes translate and scale of nested groups, outer last', () => {
    // (x, y) → (2x + 100, 2y + 50): (0, 0), (5, 0), (5, 5) → (100, 50), (110, 50), (110, 60).
    expect(data.tick).toBe('M100 50 L110 50 L110 60')
  })

  it('rotates by 90° exactly inside the scaled group', () => {
    // rotate(90): (x, y) → (−y, x), so (10, 0) → (0, 10) and (10, 5) → (−5, 10); then ×2, +(100, 50).
    expect(data.turned).toBe('M100 70 L90 70')
  })

  it('rotates about a centre: rotate(a, cx, cy) = translate(cx, cy) rotate(a) translate(−cx, −cy)', () => {
    // rotate(180, 10, 10): (x, y) → (20 − x, 20 − y): (0, 0) → (20, 20), (20, 0) → (0, 20); then +(100, 50).
    // The horizontal line stays horizontal, so svgpath keeps it an H command.
    expect(data.spun).toBe('M120 70 H100')
  })

  it('skews along x and y (tan 45° = 1)', () => {
    // skewX(45): x' = x + y → (0, 100) → (100, 100), (0, 120) → (120, 120).
    expect(data.leaning).toBe('M100 100 L120 120')
    // skewY(45): y' = y + x → (10, 150) → (10, 160), (20, 150) → (20, 170).
    expect(data.rising).toBe('M10 160 L20 170')
  })

  it('applies matrix(a b c d e f) as (a·x + c·y + e, b·x + d·y + f)', () => {
    // matrix(1 0 0 −1 0 200): (30, 10) → (30, 190), (40, 30) → (40, 170).
    expect(data.mirrored).toBe('M30 190 L40 170')
  })

  it('applies a transform list right to left (§7.6: "translate(50,0) scale(0.5)" scales first)', () => {
    expect(data.listed).toBe('M100 50 L110 50')
  })
})

describe('arcs stay arcs under transforms (arcs-transformed.svg)', () => {
  const paths = byName(importFixture('arcs-transformed.svg').paths)

  it('rotates an arc: same radii, rotation angle 30°, end point rotated', () => {
    // End (40, 0) rotated by 30°: (40·cos 30°, 40·sin 30°) = (20√3, 20).
    expectCommandsClose(paths['rotated-arc'].data, [['M', 0, 0], ['A', 20, 10, 30, 0, 1, 20 * Math.sqrt(3), 20]], ROUNDED_TOLERANCE)
  })

  it('rotates an arc by 120°: the same ellipse, whichever axis is written first', () => {
    const [command] = commandsOf(paths['turned-arc'].data).filter((c) => c[0] === 'A')
    const [major, minor, angle] = canonicalEllipse(command[1], command[2], command[3])
    expect([major, minor]).toEqual([20, 10])
    expect(Math.abs(angle - 120)).toBeLessThanOrEqual(ANGLE_TOLERANCE)
    // End (40, 0) → (40·cos 120°, 40·sin 120°) = (−20, 20√3).
    expect(Math.abs(command[6] - -20)).toBeLessThanOrEqual(ROUNDED_TOLERANCE)
    expect(Math.abs(command[7] - 20 * Math.sqrt(3))).toBeLessThanOrEqual(ROUNDED_TOLERANCE)
  })

  it('skews a circle into an ellipse with the radii and angle derived by hand', () => {
    // skewX(30) = [[1, t], [0, 1]], t = tan 30° = 1/√3. The circle of radius 10 maps to the ellipse
    // whose squared semi-axes are 100 × the eigenvalues of M·Mᵀ = [[1 + t², t], [t, 1]]:
    // λ = (7 ± √13) / 6; the major axis is at θ with tan 2θ = 2t / t² = 2√3.
    const major = 10 * Math.sqrt((7 + Math.sqrt(13)) / 6)
    const minor = 10 * Math.sqrt((7 - Math.sqrt(13)) / 6)
    const theta = (Math.atan(2 * Math.sqrt(3)) / 2) * (180 / Math.PI)
    const arcs = commandsOf(paths['skewed-dot'].data).filter((c) => c[0] === 'A')
    expect(arcs).toHaveLength(4)
    for (const arc of arcs) {
      const [a, b, angle] = canonicalEllipse(arc[1], arc[2], arc[3])
      expect(Math.abs(a - major)).toBeLessThanOrEqual(ROUNDED_TOLERANCE)
      expect(Math.abs(b - minor)).toBeLessThanOrEqual(ROUNDED_TOLERANCE)
      expect(Math.abs(angle - theta)).toBeLessThanOrEqual(ANGLE_TOLERANCE)
    }
    // Every point of the imported arcs un-skews onto the circle |p| = 10.
    const tangent = 1 / Math.sqrt(3)
    for (const segment of pathOf(paths['skewed-dot'].data).segments) {
      for (const t of [0.1, 0.35, 0.5, 0.8]) {
        const [x, y] = evaluateSegment(segment, t)
        expect(Math.abs(Math.hypot(x - tangent * y, y) - 10)).toBeLessThanOrEqual(CURVE_POINT_TOLERANCE)
      }
    }
  })

  it('scales an arc non-uniformly: radii scale per axis', () => {
    expect(paths['stretched-arc'].data).toBe('M0 0 A30 10 0 0 1 60 0')
  })

  it('flips the sweep flag under a mirror, so the arc bulges the mirrored way', () => {
    // A5 5 0 0 1 from (0, 0) to (10, 0): centre (5, 0), the angle grows from π to 2π (sweep-flag 1,
    // SVG 1.1 §8.3.8), passing (5, −5) at 3π/2. Mirrored by scale(1, −1) it must pass (5, 5): sweep-flag 0.
    expect(paths['mirrored-arc'].data).toBe('M0 0 A5 5 0 0 0 10 0')
    const middle = (data: string): readonly number[] => evaluateSegment(pathOf(data).segments[0], 0.5)
    for (const [data, expected] of [['M0 0 A5 5 0 0 1 10 0', [5, -5]], [paths['mirrored-arc'].data, [5, 5]]] as const) {
      const [x, y] = middle(data)
      expect(Math.abs(x - expected[0]), data).toBeLessThanOrEqual(CURVE_POINT_TOLERANCE)
      expect(Math.abs(y - expected[1]), data).toBeLessThanOrEqual(CURVE_POINT_TOLERANCE)
    }
  })
})

describe('viewBox and preserveAspectRatio (SVG 1.1 §7.7, §7.8, §7.9)', () => {
  it('maps the root viewBox into width × height, xMidYMid meet by default', () => {
    // viewBox −10 0 20 10 into 200 × 200: scale = min(200/20, 200/10) = 10; x: −(−10)·10 + (200 − 200)/2 = 100;
    // y: 0 + (200 − 100)/2 = 50. (−10, 0) → (0, 50); (10, 10) → (200, 150).
    expect(importFixture('viewbox-root.svg').paths[0].data).toBe('M0 50 L200 150')
  })

  it('places nested viewports at (x, y) and aligns them per preserveAspectRatio', () => {
    const data = dataByName(importFixture('viewbox-nested.svg').paths)
    // All map viewBox 0 0 10 10 into 100 × 50. meet: scale min(10, 5) = 5, slice: max = 10, none: 10 and 5.
    expect(data['min-meet']).toBe('M0 0 L50 50') // xMin: no offset.
    expect(data['max-meet']).toBe('M150 0 L200 50') // x = 100, plus 100 − 50 = 50 free width.
    expect(data['mid-slice']).toBe('M200 -25 L300 75') // x = 200; y: (50 − 100)/2 = −25.
    expect(data.none).toBe('M0 50 L100 100') // y = 50; scale (10, 5).
    expect(data.default).toBe('M125 50 L175 100') // xMidYMid meet: 100 + (100 − 50)/2.
  })

  it('converts absolute units of width and height (1in = 96px, §7.10)', () => {
    // 1in × 0.5in = 96 × 48 px; viewBox 48 × 24 → scale 2.
    const result = imported(importText(`<svg ${SVG_NS} width="1in" height="0.5in" viewBox="0 0 48 24"><path d="M0 0 L48 24"/></svg>`))
    expect(result.paths[0].data).toBe('M0 0 L96 48')
  })

  it('takes the missing height from the viewBox aspect ratio when only width is given', () => {
    // width 40, viewBox 20 × 10 → height 20, scale 2.
    const result = imported(importText(`<svg ${SVG_NS} width="40" viewBox="0 0 20 10"><path d="M0 0 L20 10"/></svg>`))
    expect(result.paths[0].data).toBe('M0 0 L40 20')
  })

  it('uses the viewBox size when width and height are absent or percentages (coordinates from its corner)', () => {
    const absent = imported(importText(`<svg ${SVG_NS} viewBox="5 5 10 10"><path d="M5 5 L15 15"/></svg>`))
    const percent = imported(importText(`<svg ${SVG_NS} width="100%" height="100%" viewBox="5 5 10 10"><path d="M5 5 L15 15"/></svg>`))
    expect(absent.paths[0].data).toBe('M0 0 L10 10')
    expect(percent.paths[0].data).toBe('M0 0 L10 10')
    expect(percent.warnings).toEqual([])
  })

  it('resolves percentages of shapes against the nearest viewBox (§7.10)', () => {
    // 50% of the viewBox width 20 = 10, 25% of its height 8 = 2.
    const result = imported(importText(`<svg ${SVG_NS} viewBox="0 0 20 8"><rect width="50%" height="25%"/></svg>`))
    expect(result.paths[0].data).toBe('M0 0 H10 V2 H0 Z')
  })

  it('draws nothing for a zero-size viewBox and says so', () => {
    const result = imported(importText(`<svg ${SVG_NS} viewBox="0 0 0 10"><rect width="5" height="5"/></svg>`))
    expect(result.paths).toEqual([])
    expect(result.warnings.some((w) => w.includes('viewBox has zero'))).toBe(true)
  })
})

describe('every path command, absolute and relative (path-commands.svg; SVG 1.1 §8.3)', () => {
  const data = dataByName(importFixture('path-commands.svg').paths)
  // Relative commands by hand: m10 10 → (10, 10); l10 0 → (20, 10); h10 → x 30; v10 → y 20;
  // c0 5 −5 10 −10 10 from (30, 20) → C30 25 25 30 20 30; s−10 −5 −10 −10 → S10 25 10 20;
  // q0 −5 5 −5 → Q10 15 15 15; t5 −5 → T20 10; a… 10 0 → A… 30 10; after z the current point is the
  // subpath start (10, 10) (§8.3.3), so m5 5 → (15, 15).
  const expected = 'M10 10 L20 10 H30 V20 C30 25 25 30 20 30 S10 25 10 20 Q10 15 15 15 T20 10 A5 5 0 0 1 30 10 Z M15 15 H20 V20 Z'

  it('writes absolute commands back unchanged', () => {
    expect(data.absolute).toBe(expected)
  })

  it('turns relative commands into the same absolute ones', () => {
    expect(data.relative).toBe(expected)
  })

  it('reads pairs after m as implicit relative linetos (§8.3.2)', () => {
    expect(data.implicit).toBe('M1 2 L4 6 L9 12')
  })

  it('reads compact numbers greedily (§8.3.9: ".5.5" is two numbers, "1e1-2" is 10 then −2)', () => {
    expect(data.compact).toBe('M0.5 0.5 L10 -2')
  })

  it('gives the core the segments the commands describe', () => {
    const path = pathOf(data.relative)
    expect(path.segments.map((segment) => segment.length)).toEqual([4, 4, 4, 8, 8, 6, 6, 12, 4, 4, 4, 4])
    expect(path.subpaths.map((subpath) => subpath.closed)).toEqual([true, true])
  })
})

describe('fill rules and names (names-and-fill-rules.svg)', () => {
  const { paths } = importFixture('names-and-fill-rules.svg')

  it('names by id, then <title>, then "<element> n" counting that element in document order', () => {
    expect(paths.map((path) => path.name)).toEqual(['path 1', 'Left wing', 'tail', 'path 4', 'rect 1', 'circle 1', 'café&co'])
    expect(paths[6].elementId).toBe('café&co') // &#233; and &amp; decoded.
    expect(paths[1].elementId).toBeUndefined()
  })

  it('inherits fill-rule; the style attribute wins over the attribute (SVG 1.1 §11.3, chapter 6)', () => {
    // Root evenodd → path 1; group style nonzero → Left wing; own attribute evenodd → tail;
    // style "inherit" beats the attribute evenodd → the group's nonzero.
    expect(paths.map((path) => path.fillRule)).toEqual(['evenodd', 'nonzero', 'evenodd', 'nonzero', 'evenodd', 'evenodd', 'evenodd'])
  })

  it('imports display:none shapes with a warning, also when an ancestor hides them', () => {
    expect(paths[4].warnings).toEqual(['hidden by display:none (on this element or an ancestor); imported anyway'])
    expect(paths[5].warnings).toEqual(['hidden by display:none (on this element or an ancestor); imported anyway'])
    expect(paths[0].warnings).toEqual([])
  })
})

describe('ignored content and warnings (warnings.svg)', () => {
  const result = importFixture('warnings.svg')
  const paths = byName(result.paths)

  it('resolves <use> of a local path and of a symbol with its viewBox', () => {
    // <use x=20 y=30> of the leaf: translate(20, 30).
    expect(paths['leaf-a'].data).toBe('M20 30 Q25 25 30 30 Q25 35 20 30 Z')
    // Symbol viewBox 0 0 10 10 in the use's 20 × 20 at (50, 50): scale 2, then +(50, 50).
    expect(paths['rect 1'].data).toBe('M50 50 H70 V70 H50 Z')
    expect(paths['leaf-a'].warnings).toEqual(['drawn through <use href="#leaf">'])
  })

  it('warns per element about event attributes, and never stores them', () => {
    expect(paths.button.warnings).toEqual([
      'event attribute onclick ignored (never run or stored)', 'event attribute onmouseover ignored (never run or stored)',
    ])
    expect(result.warnings).toContain('event attribute onload on <svg> ignored (never run or stored)')
  })

  it('ignores script, foreignObject, image and text with a warning each', () => {
    expect(result.warnings).toEqual(expect.arrayContaining([
      '<script> ignored (never run or stored)',
      '<foreignObject> ignored with everything inside it',
      '<image> ignored: only vector shapes are imported',
      '<text> ignored: text is not converted to outlines',
    ]))
  })

  it('warns about an unresolvable <use> and about zero-size shapes, which are left out', () => {
    expect(result.warnings).toEqual(expect.arrayContaining([
      '<use>: #nowhere does not exist; ignored',
      'rect #flat: zero size (width 0, height 10), draws nothing; not imported',
      'circle #dot: zero size (r 0), draws nothing; not imported',
    ]))
    expect(Object.keys(paths).sort()).toEqual(['button', 'leaf-a', 'rect 1'])
  })

  it('keeps nothing of scripts, handlers, embedded markup or text in the result', () => {
    const stored = JSON.stringify(result)
    for (const fragment of ['alert', 'steal', 'hello', 'label', 'iVBOR']) expect(stored).not.toContain(fragment)
  })

  it('warns about shapes in <defs> that nothing draws', () => {
    const unused = imported(importText(`<svg ${SVG_NS}><defs><path d="M0 0 H1 V1 Z"/><circle r="1"/></defs></svg>`))
    expect(unused.warnings).toContain('2 shape(s) inside <defs>, <symbol>, <clipPath>, <mask>, <marker> or <pattern> are not drawn by any <use>; not imported')
    expect(unused.paths).toEqual([])
  })

  it('ignores a malformed transform with a warning and keeps the shape', () => {
    const result = imported(importText(`<svg ${SVG_NS}><path transform="rotate(30" d="M0 0 H1"/></svg>`))
    expect(result.paths[0].data).toBe('M0 0 H1')
    expect(result.paths[0].warnings).toEqual(['transform="rotate(30" is malformed; ignored'])
  })

  it('keeps the points before an error in points, and drops an odd last coordinate (§9.7.1)', () => {
    const result = imported(importText(`<svg ${SVG_NS}><polyline points="0 0 10 0 10 10 x 20"/><polygon points="0 0 5 0 5 5 7"/></svg>`))
    expect(result.paths.map((path) => path.data)).toEqual(['M0 0 L10 0 L10 10', 'M0 0 L5 0 L5 5 Z'])
    expect(result.paths[0].warnings).toEqual(['points has an error after 6 numbers; the points before it are kept'])
    expect(result.paths[1].warnings).toEqual(['points has an odd number of coordinates; the last one is dropped'])
  })

  it('leaves out a path with malformed data, with the parser\'s message', () => {
    const result = imported(importText(`<svg ${SVG_NS}><path id="bad" d="M0 0 L10"/><path id="good" d="M0 0 L1 1"/></svg>`))
    expect(result.paths.map((path) => path.name)).toEqual(['good'])
    expect(result.warnings).toHaveLength(1)
    expect(result.warnings[0]).toMatch(/^path #bad: Path data is malformed.*Not imported\.$/)
  })

  it('stops a <use> that refers to itself', () => {
    const result = imported(importText(`<svg ${SVG_NS}><g id="loop"><rect width="1" height="1"/><use href="#loop"/></g></svg>`))
    expect(result.paths.map((path) => path.data)).toEqual(['M0 0 H1 V1 H0 Z', 'M0 0 H1 V1 H0 Z'])
    expect(result.warnings).toEqual(['<use>: #loop refers back to itself; ignored'])
  })
})

describe('refusals', () => {
  function refusal(result: SvgImportResult): { code: string; message: string } {
    if (result.ok) throw new Error(`expected a refusal, got ${result.paths.length} paths`)
    expect(result.fileName).toBeTypeOf('string')
    return { code: result.code, message: result.message }
  }

  it('refuses an XML bomb on its DOCTYPE, before any entity could expand', () => {
    const result = refusal(importSvg(fixture('billion-laughs.svg'), 'billion-laughs.svg'))
    expect(result.code).toBe('doctype')
    expect(result.message).toContain('line 3')
  })

  it('refuses an ENTITY declaration even without a DOCTYPE, and undeclared entity references', () => {
    expect(refusal(importText(`<svg ${SVG_NS}><!ENTITY a "b"></svg>`)).code).toBe('entity')
    expect(refusal(importText(`<svg ${SVG_NS}><title>a&nbsp;b</title></svg>`)).code).toBe('entity')
  })

  it('refuses an SVG with a DOCTYPE, ours and the one shipped in the font-awesome package', () => {
    expect(refusal(importSvg(fixture('doctype.svg'), 'doctype.svg')).code).toBe('doctype')
    const webfont = readFileSync(createRequire(import.meta.url).resolve('font-awesome/fonts/fontawesome-webfont.svg'))
    expect(refusal(importSvg(webfont, 'fontawesome-webfont.svg')).code).toBe('doctype')
  })

  it('refuses a PNG renamed .svg, naming what it is', () => {
    const result = refusal(importSvg(fixture('png-renamed.svg'), 'png-renamed.svg'))
    expect(result).toEqual({ code: 'not_xml', message: 'The file is a PNG image, not SVG text.' })
  })

  it('refuses bytes that are not text, and text that is not XML', () => {
    expect(refusal(importSvg(Buffer.from([0x3c, 0x73, 0xff, 0xfe, 0x00]), 'x.svg')).code).toBe('not_xml')
    expect(refusal(importText('just some words')).code).toBe('not_xml')
    expect(refusal(importText('')).code).toBe('not_xml')
  })

  it('refuses XML that is not well-formed (truncated, mismatched, bare &, two roots)', () => {
    const whole = fixture('every-element.svg').toString('utf8')
    const cases = [
      whole.slice(0, whole.length / 2),
      `<svg ${SVG_NS}><g></svg>`,
      `<svg ${SVG_NS}><title>salt & pepper</title></svg>`,
      `<svg ${SVG_NS}/><svg ${SVG_NS}/>`,
      `<svg ${SVG_NS} width=10/>`,
      `<svg ${SVG_NS} id="a" id="b"/>`,
      `<svg ${SVG_NS}><!-- never closed </svg>`,
      `<svg ${SVG_NS}><title>&#0;</title></svg>`,
    ]
    for (const text of cases) expect(refusal(importText(text)).code, text.slice(0, 60)).toBe('not_xml')
  })

  it('refuses XML whose root is not <svg>', () => {
    expect(refusal(importSvg(fixture('not-svg.svg'), 'not-svg.svg'))).toEqual({
      code: 'not_svg', message: 'The file is XML but not SVG: its root element is <recipe>, not <svg>.',
    })
    expect(refusal(importText('<svg xmlns="http://example.com/not-svg"/>')).code).toBe('not_svg')
  })

  it('refuses every kind of reference outside the file', () => {
    expect(refusal(importSvg(fixture('external-href.svg'), 'external-href.svg')).code).toBe('external_reference')
    const cases = [
      `<svg ${SVG_NS}><image href="photo.png" width="1" height="1"/></svg>`,
      `<svg ${SVG_NS}><a href="javascript:steal()"><rect width="1" height="1"/></a></svg>`,
      `<svg ${SVG_NS}><rect fill="url(other.svg#paint)" width="1" height="1"/></svg>`,
      `<svg ${SVG_NS}><rect style="fill: url( 'http://example.com/p.svg#g' )" width="1" height="1"/></svg>`,
      `<svg ${SVG_NS}><style>@import "https://example.com/a.css";</style></svg>`,
      `<svg ${SVG_NS}><style><![CDATA[ rect { fill: url(https://example.com/p#x) } ]]></style></svg>`,
      `<?xml-stylesheet href="https://example.com/a.css"?><svg ${SVG_NS}/>`,
    ]
    for (const text of cases) expect(refusal(importText(text)).code, text).toBe('external_reference')
    // Local references are fine.
    const local = importText(`<svg ${SVG_NS}><rect fill="url(#paint)" width="1" height="1"/><use href="#nothing"/></svg>`)
    expect(local.ok).toBe(true)
  })

  it('refuses more than 10,000 elements, and accepts exactly 10,000', () => {
    const file = (groups: number): string => `<svg ${SVG_NS}>${'<g/>'.repeat(groups)}</svg>`
    expect(SVG_IMPORT_LIMITS.maxElements).toBe(10_000)
    expect(importText(file(9_999)).ok).toBe(true) // 9,999 groups + the root
    expect(refusal(importText(file(10_000))).code).toBe('too_many_elements')
  })

  it('refuses a <use> fan-out that would draw more than 10,000 elements', () => {
    // Five levels of ten uses each: 10^5 drawn copies from about 60 elements.
    let defs = '<path id="u0" d="M0 0 H1 V1 Z"/>'
    for (let level = 1; level <= 5; level++) defs += `<g id="u${level}">${`<use href="#u${level - 1}"/>`.repeat(10)}</g>`
    const result = refusal(importText(`<svg ${SVG_NS}><defs>${defs}</defs><use href="#u5"/></svg>`))
    expect(result.code).toBe('too_many_elements')
  })

  it('refuses nesting deeper than the depth limit', () => {
    const depth = SVG_IMPORT_LIMITS.maxDepth
    const nest = (groups: number): string => `<svg ${SVG_NS}>${'<g>'.repeat(groups)}<rect width="1" height="1"/>${'</g>'.repeat(groups)}</svg>`
    expect(importText(nest(depth - 2)).ok).toBe(true) // svg + groups + rect = depth
    expect(refusal(importText(nest(depth))).code).toBe('too_deep')
  })

  it('refuses a path over 20,000 segments, and accepts exactly 20,000', () => {
    // A path declaring ~1e9 segments cannot fit in the 2 MB byte limit; over 20,000 can.
    const path = (segments: number): string => `<svg ${SVG_NS}><path d="M0 0${' h1'.repeat(segments)}"/></svg>`
    const accepted = imported(importText(path(20_000)))
    expect(pathOf(accepted.paths[0].data).segments).toHaveLength(20_000)
    const result = refusal(importText(path(20_001)))
    expect(result).toEqual({ code: 'too_many_segments', message: 'path 1 has 20001 segments; at most 20000 are allowed per path.' })
  })

  it('refuses more than 200,000 segments in one file', () => {
    const paths = Array.from({ length: 11 }, () => `<path d="M0 0${' h1'.repeat(20_000)}"/>`).join('')
    expect(refusal(importText(`<svg ${SVG_NS}>${paths}</svg>`)).code).toBe('too_many_segments')
  })

  it('refuses a 50 MB upload by size alone', () => {
    const result = refusal(importSvg(Buffer.alloc(50 * 1024 * 1024, 0x20), 'huge.svg'))
    expect(result.code).toBe('too_large')
  })
})
