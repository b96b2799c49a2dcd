import { describe, expect, it } from 'vitest'
import type { Hit, NormalisedPath, Point } from '../../shared/geometry'
import { parsePathData } from '../../shared/geometry'
import { DARK_CANVAS_PALETTE, LIGHT_CANVAS_PALETTE } from '../../src/canvas/canvas-style'
import type { HitRow } from '../../src/canvas/hit-export'
import { HIT_ROW_COLUMNS, hitRows, hitsToCsv, hitsToJson } from '../../src/canvas/hit-export'
import { computeLiveHits } from '../../src/canvas/live-hits'
import { describeProbe } from '../../src/canvas/probe-geometry'
import type { CanvasProbe, CanvasSweep } from '../../src/canvas/types'
import { buildViewSvg, VIEW_SVG_CLASS } from '../../src/canvas/view-svg'

function pathOf(data: string): NormalisedPath {
  const result = parsePathData(data)
  if (!result.ok) throw new Error(`test path did not parse: ${result.error.message}`)
  return result.path
}

/** A small RFC 4180 reader for the test: quoted fields with doubled quotes, CRLF between records. */
function readCsv(text: string): string[][] {
  const records: string[][] = []
  let record: string[] = [], field = '', quoted = false, i = 0
  while (i < text.length) {
    const c = text[i]
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') { field += '"'; i += 2; continue }
      if (c === '"') { quoted = false; i++; continue }
      field += c; i++; continue
    }
    if (c === '"') { quoted = true; i++; continue }
    if (c === ',') { record.push(field); field = ''; i++; continue }
    if (c === '\r' && text[i + 1] === '\n') { record.push(field); records.push(record); record = []; field = ''; i += 2; continue }
    if (c === '\r' || c === '\n') throw new Error(`bare line break at ${i}`)
    field += c; i++
  }
  if (field !== '' || record.length > 0) throw new Error('last record not ended by CRLF')
  return records
}

const NUMBER_COLUMNS = new Set<keyof HitRow>(['segment', 'winding', 't', 's', 'x', 'y', 'tEnd', 'sEnd'])

function rowFromCsv(fields: string[]): HitRow {
  const entries = HIT_ROW_COLUMNS.map((column, i) => {
    const text = fields[i]
    if (text === '' && (column === 'probe' || column === 'sweep' || column === 'tEnd' || column === 'sEnd')) return [column, null]
    return [column, NUMBER_COLUMNS.has(column) ? Number(text) : text]
  })
  return Object.fromEntries(entries) as HitRow
}

function expectSameRow(actual: HitRow, expected: HitRow): void {
  for (const column of HIT_ROW_COLUMNS) {
    expect(Object.is(actual[column], expected[column]), `${column}: ${String(actual[column])} vs ${String(expected[column])}`).toBe(true)
  }
}

const square = pathOf('M0 0 H10 V10 H0 Z')
const probes: CanvasProbe[] = [
  { id: 'ray-1', type: 'ray', a: [5, 5], b: [1, 0] },
  { id: 'seg-1', type: 'segment', a: [-2, 3], b: [12, 3] },
]
const sweeps: CanvasSweep[] = [{ id: 'rows', angle: 0, spacing: 5, count: 2, origin: [0, 2.5] }]

describe('hitRows', () => {
  it('flattens a live result line by line and names the paths', () => {
    const result = computeLiveHits([{ key: 'path-7', path: square }, { key: 'new-1', path: pathOf('M20 0 H30 V10 H20 Z') }], probes, sweeps)
    const rows = hitRows(result, { 'path-7': 'Lift, sign "B"' })
    // ray: 1 + 1 crossing; segment: 2 + 1 (the segment ends at x = 12, short of the second square); rows: 2 × (2 + 2).
    expect(rows.map((row) => [row.line, row.path, row.x])).toStrictEqual([
      ['ray-1', 'path-7', 10], ['ray-1', 'new-1', 20], ['ray-1', 'new-1', 30],
      ['seg-1', 'path-7', 0], ['seg-1', 'path-7', 10],
      ['rows#0', 'path-7', 0], ['rows#0', 'path-7', 10], ['rows#0', 'new-1', 20], ['rows#0', 'new-1', 30],
      ['rows#1', 'path-7', 0], ['rows#1', 'path-7', 10], ['rows#1', 'new-1', 20], ['rows#1', 'new-1', 30],
    ])
    expect(rows[0]).toStrictEqual({
      line: 'ray-1', probe: 'ray-1', sweep: null, path: 'path-7', pathName: 'Lift, sign "B"', segment: 1, kind: 'crossing',
      winding: 1, t: 0.5, s: 5, x: 10, y: 5, tEnd: null, sEnd: null,
    })
    expect(rows[1].pathName).toBe('new-1')
    expect(rows[5]).toMatchObject({ probe: null, sweep: 'rows' })
  })

  it('carries tEnd and sEnd of an overlap', () => {
    const result = computeLiveHits([{ key: 'sq', path: square }], [{ id: 'top', type: 'line', a: [-4, 0], b: [2, 0] }], [])
    const rows = hitRows(result, {})
    expect(rows).toHaveLength(1)
    // Along the top side (0, 0) → (10, 0), segment 0: x = −4 + 2s, so s runs 2 … 7.
    expect(rows[0]).toMatchObject({ kind: 'overlap', segment: 0, t: 0, s: 2, tEnd: 1, sEnd: 7 })
  })
})

describe('hitsToCsv', () => {
  const tricky: HitRow[] = [
    {
      line: 'ray-1', probe: 'ray-1', sweep: null, path: 'path-1', pathName: 'Pin, "large"\r\nsecond line', segment: 3, kind: 'crossing',
      winding: -1, t: 0.1 + 0.2, s: 1e-300, x: -0, y: 5e-324, tEnd: null, sEnd: null,
    },
    {
      line: 'rows#4', probe: null, sweep: 'rows', path: 'new-2', pathName: 'plain', segment: 0, kind: 'overlap',
      winding: 0, t: 1 / 3, s: -1.7976931348623157e308, x: 123456789.12345679, y: 2 ** -1022, tEnd: 2 / 3, sEnd: 4.35,
    },
  ]

  it('writes a header and CRLF-ended records that read back to the same strings and doubles', () => {
    const text = hitsToCsv(tricky)
    expect(text.startsWith('line,probe,sweep,path,pathName,segment,kind,winding,t,s,x,y,tEnd,sEnd\r\n')).toBe(true)
    expect(text.endsWith('\r\n')).toBe(true)
    const records = readCsv(text)
    expect(records).toHaveLength(3)
    expect(records[0]).toStrictEqual([...HIT_ROW_COLUMNS])
    records.slice(1).forEach((fields, i) => {
      expect(fields).toHaveLength(HIT_ROW_COLUMNS.length)
      expectSameRow(rowFromCsv(fields), tricky[i])
    })
    expect(records[1][8]).toBe('0.30000000000000004')
    expect(records[1][9]).toBe('1e-300')
  })

  it('quotes only the fields that need it', () => {
    const lines = hitsToCsv(tricky).split('\r\n')
    expect(lines[1].startsWith('ray-1,ray-1,,path-1,"Pin, ""large""')).toBe(true)
    expect(lines[3]).toBe('rows#4,,rows,new-2,plain,0,overlap,0,0.3333333333333333,-1.7976931348623157e+308,123456789.12345679,2.2250738585072014e-308,0.6666666666666666,4.35')
  })

  it('is the header alone for no rows', () => {
    expect(hitsToCsv([])).toBe(`${HIT_ROW_COLUMNS.join(',')}\r\n`)
  })
})

describe('hitsToJson', () => {
  it('round-trips paths, probes in the contract shape, sweeps and rows', () => {
    const result = computeLiveHits([{ key: 'path-7', path: square }], probes, sweeps)
    const rows = hitRows(result, { 'path-7': 'Square' })
    const paths = [{ key: 'path-7', name: 'Square', pathId: 7, revision: 3, data: 'M0 0 H10 V10 H0 Z', fillRule: 'evenodd' as const }]
    const parsed = JSON.parse(hitsToJson({ paths, probes, sweeps, rows, exportedAt: '2026-05-17T09:30:00.000Z' }))
    expect(parsed).toStrictEqual({
      format: 'rootcast-hits',
      version: 1,
      exportedAt: '2026-05-17T09:30:00.000Z',
      paths,
      probes: [
        { id: 'ray-1', type: 'ray', origin: [5, 5], direction: [1, 0] },
        { id: 'seg-1', type: 'segment', from: [-2, 3], to: [12, 3] },
      ],
      sweeps,
      rows,
    })
    const awkward = { ...rows[0], t: 0.1 + 0.2, s: 1e-300 }
    const again = JSON.parse(hitsToJson({ paths, probes, sweeps, rows: [awkward], exportedAt: 'x' }))
    expectSameRow(again.rows[0], awkward)
  })
})

describe('buildViewSvg', () => {
  // Screen = world·2 + (10, 20) on a 100 × 80 view: world x from −5 to 45, y from −10 to 30.
  const view = { scale: 2, offsetX: 10, offsetY: 20 }
  // A square and a diamond whose right tip (35, 5) touches the line x = 35.
  const data = ['M0 0 H10 V10 H0 Z', 'M25 0 L35 5 L25 10 L15 5 Z']
  const svgProbes: CanvasProbe[] = [
    { id: 'centre-ray', type: 'ray', a: [5, 5], b: [1, 0] },
    { id: 'touch', type: 'line', a: [35, -3], b: [0, 1] },
    { id: 'along-top', type: 'segment', a: [-2, 0], b: [8, 0] },
  ]

  function render(dark = false, grid: number | null = 1) {
    const keyed = data.map((d, i) => ({ key: `p${i}`, path: pathOf(d) }))
    const live = computeLiveHits(keyed, svgProbes, [{ id: 'w', angle: 90, spacing: 1, count: 1, origin: [40, 0] }])
    const hits: { hit: Hit; direction: Point }[] = live.lines.flatMap((line) =>
      line.perPath.flatMap((p) => p.hits.map((hit) => ({ hit, direction: describeProbe(line.probe).direction }))))
    const svg = buildViewSvg({
      width: 100, height: 80, view, dark, grid,
      paths: data.map((d) => ({ data: d, fillRule: 'nonzero' as const })),
      lines: live.lines.map((line) => ({ probe: line.probe, sweep: line.sweepId !== null })),
      hits,
    })
    const document = new DOMParser().parseFromString(svg, 'image/svg+xml')
    return { svg, document, hits, count: (className: string) => document.getElementsByClassName(className).length }
  }

  it('parses, and draws one marker per hit of each kind', () => {
    const { document, hits, count } = render()
    expect(document.documentElement.tagName.toLowerCase()).toBe('svg')
    const kinds = hits.map(({ hit }) => hit.kind)
    // By hand: the ray y = 5 crosses the square's right side and passes through the diamond's two
    // tips, joins where the path goes from one side to the other (a crossing each); the line x = 35
    // touches the diamond's right tip; the segment lies along the square's top from x = 0 to 8.
    expect(kinds.filter((k) => k === 'crossing')).toHaveLength(3)
    expect(kinds.filter((k) => k === 'tangent')).toHaveLength(1)
    expect(kinds.filter((k) => k === 'overlap')).toHaveLength(1)
    expect(count(VIEW_SVG_CLASS.crossing)).toBe(3)
    expect(count(VIEW_SVG_CLASS.chevron)).toBe(3)
    expect(count(VIEW_SVG_CLASS.tangent)).toBe(1)
    expect(count(VIEW_SVG_CLASS.overlap)).toBe(1)
    expect(count(VIEW_SVG_CLASS.path)).toBe(2)
    expect(count(VIEW_SVG_CLASS.probe)).toBe(3)
    expect(count(VIEW_SVG_CLASS.sweepLine)).toBe(1)
    expect(count(VIEW_SVG_CLASS.rayArrow)).toBe(1)
    // The segment's start (−2, 0) → screen (6, 20) and end (8, 0) → (26, 20) are both in view.
    expect(count(VIEW_SVG_CLASS.segmentTick)).toBe(2)
  })

  it('places the ray in screen pixels, clipped at the view edge, and the overlap bar along the probe', () => {
    const { document } = render()
    const [ray] = Array.from(document.getElementsByClassName(VIEW_SVG_CLASS.probe))
    expect(['x1', 'y1', 'x2', 'y2'].map((a) => ray.getAttribute(a))).toStrictEqual(['20', '30', '100', '30'])
    const [bar] = Array.from(document.getElementsByClassName(VIEW_SVG_CLASS.overlap))
    // Top side (0, 0) … (8, 0) → screen (10, 20) … (26, 20).
    expect(['x1', 'y1', 'x2', 'y2'].map((a) => bar.getAttribute(a))).toStrictEqual(['10', '20', '26', '20'])
  })

  it('points the chevron the way the path crosses the probe (the winding sign)', () => {
    const { document } = render()
    const chevrons = Array.from(document.getElementsByClassName(VIEW_SVG_CLASS.chevron)).map((element) =>
      element.getAttribute('points')!.split(' ').map((pair) => pair.split(',').map(Number)))
    // The ray runs +x, so winding = sign(ty). At the square's right side (x = 10) the path runs
    // down: +1, the tip (the middle point) below the arms. Through the diamond's left tip (15, 5)
    // it comes up from (25, 10) and goes on up to (25, 0): −1, tip above. Through the right tip
    // (35, 5) it goes from (25, 0) down to (25, 10): +1, tip below.
    const tipBelow = chevrons.map(([a, tip, b]) => tip[1] > a[1] && tip[1] > b[1])
    const tipAbove = chevrons.map(([a, tip, b]) => tip[1] < a[1] && tip[1] < b[1])
    expect(tipBelow).toStrictEqual([true, false, true])
    expect(tipAbove).toStrictEqual([false, true, false])
  })

  it('keeps path data as given under the view matrix with non-scaling strokes, escaped', () => {
    const nasty = 'M0 0 H10 V10 Z" onload="alert(1)" x="<&>'
    const svg = buildViewSvg({ width: 50, height: 40, view, dark: false, paths: [{ data: nasty, fillRule: 'evenodd' }], lines: [], hits: [] })
    const document = new DOMParser().parseFromString(svg, 'image/svg+xml')
    const [path] = Array.from(document.getElementsByClassName(VIEW_SVG_CLASS.path))
    expect(path.getAttribute('d')).toBe(nasty)
    expect(path.getAttribute('onload')).toBeNull()
    expect(path.getAttribute('transform')).toBe('matrix(2,0,0,2,10,20)')
    expect(path.getAttribute('vector-effect')).toBe('non-scaling-stroke')
    expect(path.getAttribute('fill-rule')).toBe('evenodd')
    expect(svg).not.toContain('<&>')
  })

  it('draws the grid by the zoom, and the theme\'s background', () => {
    // Step 1 at scale 2 is 2 px apart: minor lines left out, majors every 10 units (20 px) stay.
    expect(render(false, 1).count(VIEW_SVG_CLASS.gridMinor)).toBe(0)
    expect(render(false, 1).count(VIEW_SVG_CLASS.gridMajor)).toBe(1)
    expect(render(false, 5).count(VIEW_SVG_CLASS.gridMinor)).toBe(1)
    expect(render(false, null).count(VIEW_SVG_CLASS.gridMajor)).toBe(0)
    const major = render(false, 5).document.getElementsByClassName(VIEW_SVG_CLASS.gridMajor)[0]
    // Majors at world x = 0 (screen 10) and y = 0 (screen 20); x = 50 and y = 50 are out of view.
    expect(major.getAttribute('d')).toBe('M10 0V80M0 20H100')
    const background = (dark: boolean) => render(dark).document.getElementsByClassName(VIEW_SVG_CLASS.background)[0].getAttribute('fill')
    expect(background(false)).toBe(LIGHT_CANVAS_PALETTE.background)
    expect(background(true)).toBe(DARK_CANVAS_PALETTE.background)
  })

  it('refuses a zero scale or size', () => {
    const base = { width: 50, height: 40, view, dark: false, paths: [], lines: [], hits: [] }
    expect(() => buildViewSvg({ ...base, view: { ...view, scale: 0 } })).toThrow(RangeError)
    expect(() => buildViewSvg({ ...base, width: 0 })).toThrow(RangeError)
    expect(() => buildViewSvg({ ...base, grid: -1 })).toThrow(RangeError)
  })
})
