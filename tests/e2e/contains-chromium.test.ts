import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { computeSegmentBounds, containsPoints, parsePathData } from '../../shared/geometry/index'
import { DEMO_PATHS } from '../../server/services/seed.service'
import { createSeededRandom } from '../helpers/seeded-random'
import { launchBrowser, type Browser } from './browser'

/**
 * Containment against Chromium's own CanvasRenderingContext2D.isPointInPath (HTML canvas
 * fill rules "nonzero" and "evenodd"), on the demo icons and a few harder shapes.
 * Points within NEAR_BOUNDARY of an edge are left out: there either answer is defensible.
 */
const NEAR_BOUNDARY = 1e-2

const EXTRA_PATHS = [
  { name: 'three-lobed cubic loop', data: 'M20 50 C 120 -30 120 130 20 50 C 80 0 60 110 100 80 Z' },
  { name: 'pie of arcs', data: 'M50 50 L90 50 A40 40 0 0 1 50 90 Z M50 50 L10 50 A40 25 30 1 0 50 10 Z' },
  { name: 'quadratic star', data: 'M50 5 Q60 40 95 50 Q60 60 50 95 Q40 60 5 50 Q40 40 50 5 Z M30 30 H70 V70 H30 Z' },
  { name: 'font-unit glyph bowl', data: 'M 250 0 Q 450 0 450 350 Q 450 700 250 700 Q 50 700 50 350 Q 50 0 250 0 Z M 250 100 Q 150 100 150 350 Q 150 600 250 600 Q 350 600 350 350 Q 350 100 250 100 Z' },
]

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => browser?.close())

describe('containment agrees with Chromium isPointInPath', () => {
  it('on seeded random points for every path and both fill rules', async () => {
    const ctx = await browser.newContext()
    const page = await ctx.newPage()
    await page.setContent('<canvas id="c" width="10" height="10"></canvas>')
    const rnd = createSeededRandom(20261201)
    let compared = 0
    for (const p of [...DEMO_PATHS, ...EXTRA_PATHS]) {
      const parsed = parsePathData(p.data)
      if (!parsed.ok) throw new Error(`${p.name}: ${parsed.error.message}`)
      const boxes = parsed.path.segments.map((s) => computeSegmentBounds(s))
      const [x0, x1] = [Math.min(...boxes.map((b) => b[0])), Math.max(...boxes.map((b) => b[2]))]
      const [y0, y1] = [Math.min(...boxes.map((b) => b[1])), Math.max(...boxes.map((b) => b[3]))]
      const pad = 0.1 * Math.max(x1 - x0, y1 - y0)
      const points: [number, number][] = Array.from({ length: 400 }, () => [rnd.uniform(x0 - pad, x1 + pad), rnd.uniform(y0 - pad, y1 + pad)])
      for (const rule of ['nonzero', 'evenodd'] as const) {
        const ours = containsPoints(parsed.path, points, rule)
        const near = (pt: [number, number]) => {
          const e = NEAR_BOUNDARY * Math.max(1, x1 - x0, y1 - y0) / 24
          const around = containsPoints(parsed.path, [[pt[0] + e, pt[1]], [pt[0] - e, pt[1]], [pt[0], pt[1] + e], [pt[0], pt[1] - e]], rule)
          return around.some((r) => r.inside !== around[0].inside || r.onBoundary)
        }
        const theirs = await page.evaluate(
          ({ d, pts, rule }) => {
            const c = (document.getElementById('c') as HTMLCanvasElement).getContext('2d')!
            const path = new Path2D(d)
            return pts.map(([x, y]) => c.isPointInPath(path, x, y, rule))
          },
          { d: p.data, pts: points, rule },
        )
        const disagreements: string[] = []
        points.forEach((pt, i) => {
          if (ours[i].onBoundary || near(pt)) return
          compared++
          if (ours[i].inside !== theirs[i]) disagreements.push(`${p.name} ${rule} (${pt[0]}, ${pt[1]}): ours ${ours[i].inside} (winding ${ours[i].winding}), Chromium ${theirs[i]}`)
        })
        expect(disagreements, `seed ${rnd.seed}`).toEqual([])
      }
    }
    expect(compared).toBeGreaterThan(6000)
    await ctx.close()
  })
})
