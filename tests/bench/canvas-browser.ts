/**
 * Browser benchmark of the canvas: the real app (throwaway MariaDB, API and built client on
 * 127.0.0.1) in Debian's Chromium, a seeded 5,000-segment closed outline on the canvas, and
 * a ray whose direction handle is dragged round its origin in DRAG_STEPS pointer moves. It
 * prints the hit computation's milliseconds per animation frame (what useCanvasScene pushes
 * into window.__rootcastHitTimings), the frames per second requestAnimationFrame saw during
 * the drag and the verdict against the per-frame budget; then, in this Node process, the
 * same kind of rays on the same path through intersectProbes, through the canvas's own
 * computeLiveHits, and cubic by cubic through the closed-form and bezier-js engines, so the
 * figures come as ratios. Not part of `npm test`. Run with `npm run bench:canvas`.
 * Long output (raw per-frame figures, browser problems) goes to LOG_FILE.
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Page } from 'playwright-core'
import { ROOT_DIR } from '../../server/app'
import { createDataSource } from '../../server/data-source'
import { buildClientIfStale } from '../../server/scripts/client-build'
import { startMariadb } from '../../server/scripts/mariadb'
import { bezierJsEngine, closedFormEngine, intersectProbes, parsePathData } from '../../shared/geometry/index'
import type { IntersectionEngine, NormalisedPath, Point, Probe } from '../../shared/geometry/index'
import { launchBrowser, serveApp } from '../e2e/browser'
import { createRandom } from '../geometry/support/seeded-random'
import { freePort } from '../helpers/free-port'
import { seedTestData, TEST_PASSWORD } from '../helpers/test-app'
import type { TestDatabase } from '../helpers/test-db'

const SEED = 20_260_214
const SEGMENTS = 5_000
/** The outline: a wavy circle about (CENTRE, CENTRE) of mean radius RADIUS, in px units. */
const CENTRE = 500
const RADIUS = 400
/** Every KIND_PERIOD-th segment is a line, a quadratic or an arc (at these phases); the rest are cubics. */
const KIND_PERIOD = 100
const LINE_PHASE = 0
const QUADRATIC_PHASE = 33
const ARC_PHASE = 66
/** Pointer moves of the timed drag, one full turn of the handle round the ray's origin. */
const DRAG_STEPS = 300
/** Pointer moves of the drag that draws the ray with the Ray tool. */
const DRAW_STEPS = 5
/** The per-frame budget of the hit computation (the lead's target for this canvas); judged on the p95 frame. */
const BUDGET_MS = 4
/** Quantile of the frames judged against the budget. */
const BUDGET_QUANTILE = 0.95
const WARM_UP_RUNS = 2
const TIMED_RUNS = 7
/** bezier-js builds a curve per call (about 0.2 M pairs/s), so its rays are every ENGINE_RAY_STRIDE-th direction. */
const ENGINE_RAY_STRIDE = 10
const OVERALL_TIMEOUT_MS = 5 * 60_000
/** Longest wait for the 5,000-segment path to load and appear on the canvas. */
const LOAD_TIMEOUT_MS = 60_000
const LOG_FILE = '/tmp/rootcast-bench-canvas.log'
/** DIRECTION_HANDLE_PX of src/canvas/draw-scene.ts: a ray's direction handle sits this far along it, in screen px. */
const DIRECTION_HANDLE_PX = 72
const CLIENT_DIR = join(ROOT_DIR, 'node_modules', '.tmp', 'bench-client')

const fixed = (x: number): string => x.toFixed(3)

/** A point of the outline at angle (radians) with a radial offset. */
function outlinePoint(angle: number, radius: number): Point {
  return [CENTRE + radius * Math.cos(angle), CENTRE + radius * Math.sin(angle)]
}

/**
 * SVG path data of a seeded wavy closed outline of exactly SEGMENTS segments: cubics with a
 * line, a quadratic and an arc in every KIND_PERIOD, the last ending on the first point so
 * that Z adds no closing line. Radii stay within RADIUS ± 43, and each segment spans one
 * SEGMENTS-th of the turn, so the outline is star-shaped about the centre.
 */
function createOutlineData(seed: number): string {
  const random = createRandom(seed)
  const radiusAt = (angle: number): number => RADIUS + 30 * Math.sin(37 * angle) + 12 * Math.sin(113 * angle)
  const anchors = Array.from({ length: SEGMENTS }, (_, k) => {
    const angle = (2 * Math.PI * k) / SEGMENTS
    return outlinePoint(angle, radiusAt(angle) + (random() - 0.5))
  })
  const step = (2 * Math.PI) / SEGMENTS
  const commands = [`M ${fixed(anchors[0][0])} ${fixed(anchors[0][1])}`]
  for (let k = 0; k < SEGMENTS; k++) {
    const [x, y] = anchors[(k + 1) % SEGMENTS]
    const to = `${fixed(x)} ${fixed(y)}`
    const angle = k * step
    const control = (share: number): string => {
      const a = angle + share * step
      const [cx, cy] = outlinePoint(a, radiusAt(a) + 0.4 * (random() - 0.5))
      return `${fixed(cx)} ${fixed(cy)}`
    }
    const phase = k % KIND_PERIOD
    if (phase === LINE_PHASE) commands.push(`L ${to}`)
    else if (phase === QUADRATIC_PHASE) commands.push(`Q ${control(0.5)} ${to}`)
    // Angles grow clockwise on the y-down screen, the SVG arc's positive sweep: a slight outward bulge.
    else if (phase === ARC_PHASE) commands.push(`A ${fixed(RADIUS)} ${fixed(RADIUS)} 0 0 1 ${to}`)
    else commands.push(`C ${control(1 / 3)} ${control(2 / 3)} ${to}`)
  }
  return `${commands.join(' ')} Z`
}

/** Ray directions of the drag: one full turn in DRAG_STEPS steps, starting along +x. */
function dragAngle(step: number): number {
  return (2 * Math.PI * step) / DRAG_STEPS
}

interface Stats { readonly median: number; readonly quantile: number; readonly max: number }

function summarise(values: readonly number[], quantile: number): Stats {
  const sorted = [...values].sort((a, b) => a - b)
  const rank = Math.max(0, Math.ceil(quantile * sorted.length) - 1)
  return { median: sorted[sorted.length >> 1], quantile: sorted[rank], max: sorted[sorted.length - 1] }
}

// ---- the browser part ----------------------------------------------------------------------

/** What the page collected during the timed drag. */
interface PageFigures {
  readonly timings: number[]
  /** Index of the animation frame each timing fell in (frame k: from the k-th rAF callback to the next). */
  readonly frameOfTiming: number[]
  readonly frameStamps: number[]
  readonly start: number
  readonly end: number
}

/**
 * Collects the hit timings by frame and counts frames. Page scripts are text: tsx wraps named
 * functions of this file in a __name helper, which the page does not have.
 */
const INSTALL_COUNTERS = `(() => {
  const bench = { frameIndex: 0, frameStamps: [], frameOfTiming: [], running: true, start: 0, end: 0 }
  const timings = []
  Object.defineProperty(timings, 'push', {
    value(ms) { bench.frameOfTiming.push(bench.frameIndex); return Array.prototype.push.call(this, ms) },
  })
  window.__rootcastHitTimings = timings
  window.__rootcastBench = bench
  const tick = (now) => { bench.frameIndex++; bench.frameStamps.push(now); if (bench.running) requestAnimationFrame(tick) }
  requestAnimationFrame(tick)
})()`
const MARK_START = 'window.__rootcastBench.start = performance.now()'
const MARK_END = 'window.__rootcastBench.end = performance.now()'
/** Two frames after the drag, so the last move's computation is in; then the counters stop. */
const READ_COUNTERS = `new Promise((resolve) => requestAnimationFrame(() => requestAnimationFrame(() => {
  const bench = window.__rootcastBench
  bench.running = false
  resolve({ timings: [...window.__rootcastHitTimings], frameOfTiming: bench.frameOfTiming, frameStamps: bench.frameStamps, start: bench.start, end: bench.end })
})))`

async function signIn(page: Page, baseUrl: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`)
  await page.locator('[data-testid="sign-in-email"] input').fill('editor@example.com')
  await page.locator('[data-testid="sign-in-password"] input').fill(TEST_PASSWORD)
  await page.locator('[data-testid="sign-in-submit"]').click()
  await page.waitForURL(/\/projects$/)
}

/** POST /projects/:id/paths from inside the page, with the session's CSRF token. */
async function createPath(page: Page, projectId: number, data: string): Promise<{ id: number; segments: number }> {
  const answer = await page.evaluate(async ({ projectId, data }) => {
    const me = await (await fetch('/api/v1/auth/me')).json()
    const res = await fetch(`/api/v1/projects/${projectId}/paths`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': me.csrfToken },
      body: JSON.stringify({ name: 'Bench outline 5000', data, message: 'Canvas benchmark outline' }),
    })
    return { status: res.status, body: await res.json() }
  }, { projectId, data })
  if (answer.status !== 201) throw new Error(`creating the path failed: ${answer.status} ${JSON.stringify(answer.body).slice(0, 300)}`)
  return { id: answer.body.id as number, segments: answer.body.segments as number }
}

async function readNumber(page: Page, testId: string, pattern: RegExp): Promise<number> {
  const text = await page.locator(`[data-testid="${testId}"]`).innerText()
  const match = pattern.exec(text)
  if (!match) throw new Error(`${testId} reads "${text}", which has no figure`)
  return Number(match[1])
}

interface BrowserFigures {
  readonly segmentsOnCanvas: number
  readonly hitsAfterDrawing: number
  readonly page: PageFigures
  readonly problems: readonly string[]
}

async function measureInBrowser(page: Page, baseUrl: string, projectId: number, data: string): Promise<Omit<BrowserFigures, 'problems'>> {
  await signIn(page, baseUrl)
  const created = await createPath(page, projectId, data)
  await page.goto(`${baseUrl}/projects/${projectId}/canvas?paths=${created.id}`)
  await page.locator('[data-testid="canvas-compute"]', { hasText: `${created.segments} segments` }).waitFor({ timeout: LOAD_TIMEOUT_MS })
  const segmentsOnCanvas = await readNumber(page, 'canvas-compute', /(\d+) segments/)

  // Snapping would move the pointer to the grid and leave some moves without a change of direction.
  const snap = page.locator('button[aria-label="Snap"]')
  if ((await snap.getAttribute('aria-pressed')) === 'true') await snap.click()

  const box = await page.locator('[data-testid="canvas-stage"]').boundingBox()
  if (!box) throw new Error('the canvas stage is not on the page')
  // The view is fitted to the outline, so the stage's centre lies inside it, far from its points.
  const cx = box.x + box.width / 2
  const cy = box.y + box.height / 2
  await page.locator('[data-testid="tool-ray"]').click()
  await page.mouse.move(cx, cy)
  await page.mouse.down()
  for (let i = 1; i <= DRAW_STEPS; i++) await page.mouse.move(cx + (2 * DIRECTION_HANDLE_PX * i) / DRAW_STEPS, cy)
  await page.mouse.up()
  await page.locator('[data-testid="tool-select"]').click()
  const hitsAfterDrawing = await readNumber(page, 'hit-count', /(\d+) hits?\b/)
  if (hitsAfterDrawing === 0) throw new Error('the ray drawn from the centre has no hits: it was not drawn')

  // The handle sits DIRECTION_HANDLE_PX along the ray; the drag turns it round the origin once.
  const turn = Math.min(1.4 * DIRECTION_HANDLE_PX, 0.4 * Math.min(box.width, box.height))
  await page.mouse.move(cx + DIRECTION_HANDLE_PX, cy)
  await page.evaluate(INSTALL_COUNTERS)
  await page.evaluate(MARK_START)
  await page.mouse.down()
  for (let i = 1; i <= DRAG_STEPS; i++) await page.mouse.move(cx + turn * Math.cos(dragAngle(i)), cy + turn * Math.sin(dragAngle(i)))
  await page.mouse.up()
  await page.evaluate(MARK_END)
  const figures = (await page.evaluate(READ_COUNTERS)) as PageFigures
  if (figures.timings.length === 0) throw new Error('no hit computation during the drag: the direction handle was not grabbed')
  return { segmentsOnCanvas, hitsAfterDrawing, page: figures }
}

// ---- the Node part -------------------------------------------------------------------------

/** Results land here so that no timed loop can be optimised away. */
let sink = 0

interface Timing { readonly name: string; readonly median: number; readonly low: number; readonly high: number }

/** Milliseconds per ray of body (which runs `rays` rays): median and range of TIMED_RUNS after WARM_UP_RUNS. */
function timePerRay(name: string, rays: number, body: () => number): Timing {
  for (let i = 0; i < WARM_UP_RUNS; i++) sink += body()
  const perRay: number[] = []
  for (let i = 0; i < TIMED_RUNS; i++) {
    const start = process.hrtime.bigint()
    sink += body()
    perRay.push(Number(process.hrtime.bigint() - start) / 1e6 / rays)
  }
  perRay.sort((a, b) => a - b)
  return { name, median: perRay[perRay.length >> 1], low: perRay[0], high: perRay[perRay.length - 1] }
}

/**
 * Lines and quadratics raised to cubics (exact degree elevation, up to rounding) and the
 * cubics themselves, packed 8 values each for the engines; arcs have no cubic form and are left out.
 */
function packAsCubics(path: NormalisedPath): Float64Array {
  const cubics: number[] = []
  for (const s of path.segments) {
    if (s.length === 8) cubics.push(...s)
    else if (s.length === 6) {
      const [x0, y0, x1, y1, x2, y2] = s
      cubics.push(x0, y0, x0 + (2 / 3) * (x1 - x0), y0 + (2 / 3) * (y1 - y0), x2 + (2 / 3) * (x1 - x2), y2 + (2 / 3) * (y1 - y2), x2, y2)
    } else if (s.length === 4) {
      const [x0, y0, x1, y1] = s
      cubics.push(x0, y0, x0 + (x1 - x0) / 3, y0 + (y1 - y0) / 3, x0 + (2 * (x1 - x0)) / 3, y0 + (2 * (y1 - y0)) / 3, x1, y1)
    }
  }
  return Float64Array.from(cubics)
}

/** The part of src/canvas/live-hits.ts that the bench calls: the canvas's own per-frame computation. */
interface CanvasProbe { readonly id: string; readonly type: 'ray'; readonly a: Point; readonly b: Point }
type ComputeLiveHits = (
  paths: readonly { key: string; path: NormalisedPath }[], probes: readonly CanvasProbe[], sweeps: readonly never[],
) => { lines: { perPath: { hits: unknown[] }[] }[] }

/**
 * The canvas's module, loaded by its path: the tests' tsconfig leaves src/ out (it is the
 * client's project), so a static import would not type-check there.
 */
async function loadComputeLiveHits(): Promise<ComputeLiveHits> {
  const module = (await import(join(ROOT_DIR, 'src', 'canvas', 'live-hits.ts'))) as { computeLiveHits: ComputeLiveHits }
  return module.computeLiveHits
}

interface NodeFigures {
  readonly publicApi: Timing
  readonly liveHits: Timing
  readonly closedEngine: Timing
  readonly bezierEngine: Timing
  readonly engineCubics: number
  readonly engineRays: number
  readonly checksums: string
}

function measureInNode(path: NormalisedPath, computeLiveHits: ComputeLiveHits): NodeFigures {
  const origin: Point = [CENTRE, CENTRE]
  const directions = Array.from({ length: DRAG_STEPS }, (_, i): Point => [Math.cos(dragAngle(i + 1)), Math.sin(dragAngle(i + 1))])
  const rays: Probe[] = directions.map((direction) => ({ type: 'ray', origin, direction }))
  const canvasProbes: CanvasProbe[] = directions.map((b) => ({ id: 'probe-1', type: 'ray', a: origin, b }))
  const sheet = [{ key: 'path-1', path }]
  const cubics = packAsCubics(path)
  const engineCubics = cubics.length / 8
  const engineDirections = directions.filter((_, i) => i % ENGINE_RAY_STRIDE === 0)
  const out = new Float64Array(8)

  const publicApiRun = (): number => rays.reduce((n, ray) => n + intersectProbes(path, [ray])[0].length, 0)
  const liveHitsRun = (): number =>
    canvasProbes.reduce((n, probe) => n + computeLiveHits(sheet, [probe], []).lines[0].perPath[0].hits.length, 0)
  const engineRun = (engine: IntersectionEngine) => (): number => {
    let total = 0
    for (const [dx, dy] of engineDirections) {
      for (let j = 0; j < engineCubics; j++) total += engine.intersectCubic(cubics, 8 * j, origin[0], origin[1], dx, dy, 0, Infinity, out)
    }
    return total
  }

  // Checksums outside the timed loops: hits (roots for the engines) summed over the rays each is timed on.
  const checksums = [
    `intersectProbes ${publicApiRun()}`,
    `computeLiveHits ${liveHitsRun()}`,
    `closed-form engine ${engineRun(closedFormEngine)()}`,
    `bezier-js engine ${engineRun(bezierJsEngine)()}`,
  ].join(', ')
  return {
    publicApi: timePerRay('intersectProbes', rays.length, publicApiRun),
    liveHits: timePerRay('computeLiveHits', canvasProbes.length, liveHitsRun),
    closedEngine: timePerRay('closed-form engine', engineDirections.length, engineRun(closedFormEngine)),
    bezierEngine: timePerRay('bezier-js engine', engineDirections.length, engineRun(bezierJsEngine)),
    engineCubics,
    engineRays: engineDirections.length,
    checksums,
  }
}

// ---- the run -------------------------------------------------------------------------------

/** Stops what was started, last first. */
const cleanups: Array<{ name: string; run: () => Promise<unknown> }> = []
let cleaning: Promise<void> | null = null
/** One clean-up for the run, the watchdog and a signal alike: every caller waits for the same, whole one. */
function cleanUp(): Promise<void> {
  cleaning ??= (async () => {
    for (let step = cleanups.pop(); step; step = cleanups.pop()) {
      try {
        await step.run()
      } catch (error) {
        console.error(`stopping ${step.name} failed: ${(error as Error).message}`)
      }
    }
  })()
  return cleaning
}

let aborting = false
function abort(reason: string, code: number): void {
  if (aborting) return
  aborting = true
  console.error(`canvas bench: ${reason}; stopping what it started`)
  void cleanUp().finally(() => process.exit(code))
}
const onInterrupt = (): void => abort('interrupted', 130)
const onTerminate = (): void => abort('terminated', 143)

/**
 * Playwright's own Ctrl-C handler closes its browsers and exits the process at once, which
 * would leave the detached MariaDB running; the bench's handler stops everything instead.
 * (Under tsx a signal that finds the process busy in a long synchronous stretch kills it
 * outright after 30 ms, so the Node timing runs before anything is started.)
 */
function dropSignalHandlersAddedSince(before: ReadonlyMap<NodeJS.Signals, readonly unknown[]>): void {
  for (const [signal, listeners] of before) {
    for (const listener of process.listeners(signal)) if (!listeners.includes(listener)) process.off(signal, listener)
  }
}

/**
 * Gaps between timings below this are rounding, not clock steps: a timing is a difference of
 * two readings near 1e4 ms, whose doubles differ by ~1e-12 ms, while a browser's finest
 * clock step is 5 µs (Chromium's high-resolution mode, from memory).
 */
const CLOCK_GAP_FLOOR_MS = 1e-3

/** The smallest gap between distinct timings: the page clock's resolution, or a multiple of it. */
function clockStep(timings: readonly number[]): number {
  const sorted = [...timings].sort((a, b) => a - b)
  return sorted.slice(1).reduce((step, x, i) => (x - sorted[i] > CLOCK_GAP_FLOOR_MS ? Math.min(step, x - sorted[i]) : step), Infinity)
}

const formatMs = (ms: number): string => (ms >= 1 ? ms.toFixed(2) : ms.toFixed(3))
const formatTiming = (t: Timing): string => `${formatMs(t.median)} ms (${formatMs(t.low)}–${formatMs(t.high)})`

async function main(): Promise<void> {
  const watchdog = setTimeout(() => abort(`no result after ${OVERALL_TIMEOUT_MS / 60_000} minutes`, 1), OVERALL_TIMEOUT_MS)
  process.on('SIGINT', onInterrupt)
  process.on('SIGTERM', onTerminate)
  const log: string[] = []
  try {
    const data = createOutlineData(SEED)
    const parsed = parsePathData(data)
    if (!parsed.ok) throw new Error(`the seeded outline does not parse: ${parsed.error.message}`)
    const node = measureInNode(parsed.path, await loadComputeLiveHits())

    let clientDir = process.env.ROOTCAST_TEST_CLIENT_DIR
    if (clientDir === undefined) {
      clientDir = CLIENT_DIR
      buildClientIfStale(ROOT_DIR, clientDir, (line) => console.log(line))
      // serveApp serves the client from this folder.
      process.env.ROOTCAST_TEST_CLIENT_DIR = clientDir
    }

    const dir = await mkdtemp(join(tmpdir(), 'rootcast-bench-'))
    cleanups.push({ name: 'the temporary folder', run: () => rm(dir, { recursive: true, force: true }) })
    const mariadb = await startMariadb({ dataDir: join(dir, 'mariadb'), port: await freePort(), database: 'rcbench' })
    cleanups.push({ name: 'MariaDB', run: () => mariadb.stop() })

    // As tests/helpers/test-db.ts does, on the instance's own database (its createTestDatabase
    // reads the URL through vitest's inject, which only works inside a vitest run).
    const ds = createDataSource(mariadb.url)
    await ds.initialize()
    cleanups.push({ name: 'the data source', run: async () => ds.isInitialized && ds.destroy() })
    await ds.runMigrations({ transaction: 'each' })
    await seedTestData(ds)
    const db: TestDatabase = { url: mariadb.url, ds, drop: async () => undefined }
    const [{ id: projectId }] = (await ds.query("SELECT id FROM projects WHERE name = 'Wayfinding icons'")) as Array<{ id: number }>

    const app = await serveApp(db)
    cleanups.push({ name: 'the server', run: () => app.close() })
    const browser = await launchBrowser()
    cleanups.push({ name: 'Chromium', run: () => browser.close() })
    const signals: NodeJS.Signals[] = ['SIGINT', 'SIGTERM']
    const handlersBefore = new Map(signals.map((signal) => [signal, process.listeners(signal)] as const))
    const page = await (await browser.newContext()).newPage()
    dropSignalHandlersAddedSince(handlersBefore)

    const measured = await measureInBrowser(page, app.baseUrl, Number(projectId), data)
    const browserFigures: BrowserFigures = { ...measured, problems: [...browser.problems] }
    report(browserFigures, node, parsed.path.segments.length, log)
  } finally {
    clearTimeout(watchdog)
    await cleanUp()
    process.off('SIGINT', onInterrupt)
    process.off('SIGTERM', onTerminate)
    await writeFile(LOG_FILE, log.join('\n') + '\n')
  }
}

function report(browser: BrowserFigures, node: NodeFigures, segmentsParsed: number, log: string[]): void {
  const { timings, frameOfTiming, frameStamps, start, end } = browser.page
  const perFrame = new Map<number, number>()
  const callsPerFrame = new Map<number, number>()
  timings.forEach((ms, i) => {
    perFrame.set(frameOfTiming[i], (perFrame.get(frameOfTiming[i]) ?? 0) + ms)
    callsPerFrame.set(frameOfTiming[i], (callsPerFrame.get(frameOfTiming[i]) ?? 0) + 1)
  })
  const frames = summarise([...perFrame.values()], BUDGET_QUANTILE)
  const calls = summarise(timings, BUDGET_QUANTILE)
  const framesSeen = frameStamps.filter((t) => t >= start && t <= end).length
  const seconds = (end - start) / 1000
  const within = frames.quantile <= BUDGET_MS
  const p = `p${Math.round(BUDGET_QUANTILE * 100)}`

  console.log(`Canvas in Chromium (seed ${SEED}): ${browser.segmentsOnCanvas} segments on the canvas (${segmentsParsed} parsed in Node);`,
    `ray drag of ${DRAG_STEPS} moves in ${seconds.toFixed(2)} s, ${browser.hitsAfterDrawing} hit(s) when drawn`)
  console.log(`frames with a hit computation: ${perFrame.size} (${timings.length} computations, at most ${Math.max(...callsPerFrame.values())} in a frame)`)
  console.log(`hit computation per frame: median ${formatMs(frames.median)} ms, ${p} ${formatMs(frames.quantile)} ms, max ${formatMs(frames.max)} ms`,
    `(per computation: median ${formatMs(calls.median)} ms; the page's clock steps ${formatMs(clockStep(timings))} ms)`)
  console.log(`requestAnimationFrame during the drag: ${(framesSeen / seconds).toFixed(1)} frames/s (${framesSeen} frames)`)
  console.log(`verdict: ${p} ${formatMs(frames.quantile)} ms per frame against the ${BUDGET_MS} ms budget: ${within ? 'within budget' : 'over budget'}`)
  console.log(`Node, per ray (median of ${TIMED_RUNS} runs after ${WARM_UP_RUNS} warm-ups; range): intersectProbes ${formatTiming(node.publicApi)},`,
    `computeLiveHits (the canvas's code) ${formatTiming(node.liveHits)}`)
  console.log(`engines on the ${node.engineCubics} cubics (lines and quadratics raised; arcs left out), ${node.engineRays} rays:`,
    `closed form ${formatTiming(node.closedEngine)}, bezier-js ${formatTiming(node.bezierEngine)}`)
  console.log(`ratios: browser/Node ${(calls.median / node.liveHits.median).toFixed(2)}× (same computeLiveHits per computation),`,
    `${(calls.median / node.publicApi.median).toFixed(2)}× (against intersectProbes);`,
    `bezier-js/closed form ${(node.bezierEngine.median / node.publicApi.median).toFixed(1)}× (against intersectProbes),`,
    `${(node.bezierEngine.median / node.closedEngine.median).toFixed(1)}× (engine against engine)`)
  console.log(`checksums: ${node.checksums}; browser problems: ${browser.problems.length}; sink ${sink}; details in ${LOG_FILE}`)
  log.push(`browser problems:\n${browser.problems.join('\n') || '(none)'}`)
  log.push(`per-frame ms (frame index: ms):\n${[...perFrame].map(([frame, ms]) => `${frame}: ${ms.toFixed(3)}`).join('\n')}`)
  log.push(`computations (ms, frame):\n${timings.map((ms, i) => `${ms.toFixed(3)} ${frameOfTiming[i]}`).join('\n')}`)
}

// Once a signal or the watchdog has begun stopping everything, the run's own errors are its echo.
await main().catch((error: unknown) => {
  if (aborting) return
  console.error(error)
  process.exitCode = 1
})
