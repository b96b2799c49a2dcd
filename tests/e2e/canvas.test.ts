import { readFile } from 'node:fs/promises'
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { parsePathData } from '../../shared/geometry'
import { PathEntity } from '../../server/entities/path.entity'
import { RevisionEntity } from '../../server/entities/revision.entity'
import type { TestDatabase } from '../helpers/test-db'
import { closeSignedInSession, openSignedInSession, screenshot, signIn, type Browser, type RunningApp, type SignedInSession } from './browser'

let db: TestDatabase
let app: RunningApp
let browser: Browser
let page: Page
let projectId: number

async function pathId(name: string): Promise<number> {
  return (await db.ds.getRepository(PathEntity).findOneByOrFail({ name, projectId })).id
}

/** Opens the canvas on one path and waits until it is drawn (its segment count in the readout). */
async function openCanvas(p: Page, id: number, segments: number): Promise<{ x: number; y: number; width: number; height: number }> {
  await p.goto(`${app.baseUrl}/projects/${projectId}/canvas?paths=${id}`)
  const view = p.locator('[data-testid="canvas-view"]')
  await view.waitFor()
  await view.scrollIntoViewIfNeeded()
  await p.locator('[data-testid="canvas-compute"]').getByText(`${segments} segments`).waitFor()
  const box = await p.locator('[data-testid="canvas-stage"]').boundingBox()
  if (!box) throw new Error('the canvas stage has no box')
  return box
}

async function drag(p: Page, from: [number, number], to: [number, number], steps = 12): Promise<void> {
  await p.mouse.move(from[0], from[1])
  await p.mouse.down()
  for (let i = 1; i <= steps; i++) await p.mouse.move(from[0] + ((to[0] - from[0]) * i) / steps, from[1] + ((to[1] - from[1]) * i) / steps)
  await p.mouse.up()
}

async function fieldValue(p: Page, card: string, label: string): Promise<number> {
  const value = await p.locator(`[data-testid="${card}"]`).getByLabel(label, { exact: true }).inputValue()
  return Number(value)
}

let session: SignedInSession | undefined
beforeAll(async () => {
  session = await openSignedInSession('editor@example.com')
  ;({ db, app, browser, page, projectId } = session)
})
afterAll(() => closeSignedInSession(session))

describe('the canvas in Chromium', () => {
  it('casts a ray across a demo path with the mouse; hit count and winding agree with /intersect and /contains', async () => {
    const pin = await pathId('Map pin')
    const box = await openCanvas(page, pin, 6)
    await screenshot(page, '20-canvas-open')
    await page.locator('[data-testid="tool-ray"]').click()
    // From the middle of the fitted pin (inside its body, below the hole) out to the right.
    const start: [number, number] = [box.x + box.width / 2, box.y + box.height / 2 + 20]
    await drag(page, start, [start[0] + 160, start[1] + 10])
    const card = 'probe-card-probe-1'
    await page.locator(`[data-testid="${card}"]`).waitFor()
    const probe = {
      type: 'ray',
      origin: [await fieldValue(page, card, 'origin x'), await fieldValue(page, card, 'origin y')],
      direction: [await fieldValue(page, card, 'direction x'), await fieldValue(page, card, 'direction y')],
    }
    const shownHits = Number((await page.locator('[data-testid="probe-hits-probe-1"]').innerText()).match(/\d+/)![0])
    const shownWinding = Number(await page.locator(`[data-testid="probe-winding-probe-1"] [data-testid="winding-value"]`).innerText())
    const verdict = await page.locator(`[data-testid="probe-winding-probe-1"] [data-testid="verdict-nonzero"]`).innerText()

    const data = (await db.ds.getRepository(RevisionEntity).findOneByOrFail({ pathId: pin, number: 1 })).data
    const answers = await page.evaluate(async ({ data, probe }) => {
      const post = async (route: string, body: unknown) =>
        (await fetch(`/api/v1${route}`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify(body) })).json()
      return {
        intersect: await post('/intersect', { path: data, probes: [probe] }),
        contains: await post('/contains', { path: data, points: [probe.origin], fillRule: 'nonzero' }),
      }
    }, { data, probe })
    const apiHits = answers.intersect.results[0].hits as Array<{ winding: number; kind: string }>
    expect(apiHits.length).toBeGreaterThan(0)
    expect(shownHits).toBe(apiHits.length)
    // Winding at the ray's origin: the API's /contains, and (contract) the sum of the ray's hit windings.
    expect(shownWinding).toBe(answers.contains.results[0].winding)
    expect(shownWinding).toBe(apiHits.reduce((sum, h) => sum + h.winding, 0))
    expect(shownWinding).not.toBe(0)
    expect(verdict).toBe('inside')
    expect(await page.locator('[data-testid="hit-count"]').innerText()).toBe(apiHits.length === 1 ? '1 hit' : `${apiHits.length} hits`)
    await page.locator('[data-testid="server-check"]').getByText(apiHits.length === 1 ? 'Server agrees on the 1 hit' : `Server agrees on all ${apiHits.length} hits`).waitFor()
    expect(await page.locator('[data-testid="hit-row"]').count()).toBe(apiHits.length)
    await screenshot(page, '21-canvas-ray')
  })

  it('syncs the hit table and the markers both ways, with 17 significant digits on demand', async () => {
    await page.locator('[data-testid="tool-select"]').click()
    const rows = page.locator('[data-testid="hit-row"]')
    const first = rows.first()
    await first.click()
    await expect.poll(async () => first.getAttribute('class')).toContain('hit-table__row--selected')

    // Hover the first hit's marker (placed from the stage's view transform) and click it.
    const [scale, offsetX, offsetY] = (await page.locator('[data-testid="canvas-stage"]').getAttribute('data-view'))!.split(',').map(Number)
    const box = (await page.locator('[data-testid="canvas-stage"]').boundingBox())!
    await page.locator('[data-testid="toggle-precision"]').click()
    const cells = await rows.first().locator('td').allInnerTexts()
    // Columns: probe, segment, kind, winding, t, s, x, y.
    const [x, y] = [Number(cells[6]), Number(cells[7])]
    const t = cells[4].trim()
    // 17 significant digits: the digits after the leading zeros number 17.
    expect(t.replace('-', '').replace(/^0\.0*/, '').replace('.', '')).toHaveLength(17)
    const marker: [number, number] = [box.x + x * scale + offsetX, box.y + y * scale + offsetY]
    await page.mouse.move(marker[0], marker[1])
    const card = page.locator('[data-testid="canvas-hover-card"]')
    await card.waitFor()
    expect(await card.locator('[data-testid="hover-t"]').innerText()).toBe(t)
    // A click on empty sheet clears the selection; a click on the marker selects its row again.
    await page.mouse.click(box.x + 30, box.y + box.height - 30)
    await expect.poll(async () => first.getAttribute('class')).not.toContain('hit-table__row--selected')
    await page.mouse.click(marker[0], marker[1])
    await expect.poll(async () => first.getAttribute('class')).toContain('hit-table__row--selected')
    await screenshot(page, '21b-canvas-hover')
    await page.locator('[data-testid="toggle-precision"]').click()
    await page.mouse.move(box.x + 5, box.y + box.height - 5)
  })

  it('exports the hits as CSV whose rows carry the exact doubles of the API answer', async () => {
    const pin = await pathId('Map pin')
    const data = (await db.ds.getRepository(RevisionEntity).findOneByOrFail({ pathId: pin, number: 1 })).data
    const card = 'probe-card-probe-1'
    const probe = {
      type: 'ray',
      origin: [await fieldValue(page, card, 'origin x'), await fieldValue(page, card, 'origin y')],
      direction: [await fieldValue(page, card, 'direction x'), await fieldValue(page, card, 'direction y')],
    }
    await page.locator('[data-testid="canvas-export"]').click()
    const [download] = await Promise.all([page.waitForEvent('download'), page.locator('[data-testid="export-csv"]').click()])
    const csv = await readFile(await download.path(), 'utf8')
    const [header, ...rows] = csv.trim().split(/\r\n/)
    const columns = header.split(',')
    const api = await page.evaluate(async ({ data, probe }) => {
      const res = await fetch('/api/v1/intersect', { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ path: data, probes: [probe] }) })
      return (await res.json()).results[0].hits as Array<{ t: number; s: number; point: [number, number]; kind: string; winding: number; segment: number }>
    }, { data, probe })
    expect(rows).toHaveLength(api.length)
    rows.forEach((row, i) => {
      const cell = (name: string) => row.split(',')[columns.indexOf(name)]
      expect(cell('kind')).toBe(api[i].kind)
      expect(Number(cell('winding'))).toBe(api[i].winding)
      expect(Number(cell('segment'))).toBe(api[i].segment)
      // Shortest round-trip text: every double reads back bit for bit.
      expect(Number(cell('t'))).toBe(api[i].t)
      expect(Number(cell('s'))).toBe(api[i].s)
      expect(Number(cell('x'))).toBe(api[i].point[0])
      expect(Number(cell('y'))).toBe(api[i].point[1])
    })
  })

  it('saves the probes as a probe set and lists it in the project', async () => {
    await page.locator('[data-testid="side-tab-sheet"]').click()
    await page.locator('[data-testid="save-probe-set"]').click()
    await page.locator('[data-testid="probe-set-name"] input').waitFor()
    await expect.poll(() => page.evaluate(() => document.activeElement?.closest('[data-testid="probe-set-name"]') !== null)).toBe(true)
    await page.locator('[data-testid="probe-set-name"] input').fill('Pin body ray')
    await page.locator('[data-testid="probe-set-confirm"]').click()
    await page.locator('[data-testid="probe-set-list"]').getByText('Pin body ray').waitFor()
    const [row] = (await db.ds.query("SELECT probes, revision FROM probe_sets WHERE name = 'Pin body ray'")) as Array<{ probes: unknown; revision: number }>
    const probes = typeof row.probes === 'string' ? JSON.parse(row.probes) : row.probes
    expect(probes).toHaveLength(1)
    expect(probes[0].type).toBe('ray')
    expect(Number(row.revision)).toBe(1)
    await screenshot(page, '22-canvas-probe-set')
  })

  it('draws a triangle with the pen, undoes and redoes it, saves it and finds the new revision in the library', async () => {
    const lift = await pathId('Lift arrows')
    const before = (await db.ds.getRepository(RevisionEntity).findOneByOrFail({ pathId: lift, number: 1 })).data
    const parsedBefore = parsePathData(before)
    if (!parsedBefore.ok) throw new Error(parsedBefore.error.message)
    const segmentsBefore = parsedBefore.path.segments.length
    const box = await openCanvas(page, lift, segmentsBefore)
    await page.locator('[data-testid="tool-pen"]').click()
    // Three clicks right of the icon, then a click on the first point closes the contour.
    const a: [number, number] = [box.x + box.width - 150, box.y + box.height / 2 - 70]
    const b: [number, number] = [box.x + box.width - 60, box.y + box.height / 2 + 50]
    const c: [number, number] = [box.x + box.width - 220, box.y + box.height / 2 + 50]
    for (const p of [a, b, c, a]) await page.mouse.click(p[0], p[1])
    const readout = page.locator('[data-testid="canvas-compute"]')
    await readout.getByText(`${segmentsBefore + 3} segments`).waitFor()
    await screenshot(page, '23-canvas-pen-triangle')

    // Undo the closing click and one line, with the keyboard and with the button; then redo both.
    await page.keyboard.press('Control+z')
    await readout.getByText(`${segmentsBefore + 2} segments`).waitFor()
    await page.locator('[data-testid="canvas-undo"]').click()
    await readout.getByText(`${segmentsBefore + 1} segments`).waitFor()
    await screenshot(page, '24-canvas-after-undo')
    await page.keyboard.press('Control+Shift+z')
    await readout.getByText(`${segmentsBefore + 2} segments`).waitFor()
    await page.locator('[data-testid="canvas-redo"]').click()
    await readout.getByText(`${segmentsBefore + 3} segments`).waitFor()

    await page.locator('[data-testid="canvas-save"]').click()
    await page.locator('[data-testid="canvas-save-message"] input').waitFor()
    await expect.poll(() => page.evaluate(() => document.activeElement?.closest('[data-testid="canvas-save-message"]') !== null)).toBe(true)
    await page.locator('[data-testid="canvas-save-message"] input').fill('Pen triangle beside the arrows')
    await page.locator('[data-testid="canvas-save-confirm"]').click()
    await page.locator('[data-testid="canvas-notice"]').getByText('as revision 2').waitFor()

    const revision = await db.ds.getRepository(RevisionEntity).findOneByOrFail({ pathId: lift, number: 2 })
    expect(revision.message).toBe('Pen triangle beside the arrows')
    const parsed = parsePathData(revision.data)
    if (!parsed.ok) throw new Error(parsed.error.message)
    expect(parsed.path.segments).toHaveLength(segmentsBefore + 3)
    expect(parsed.path.subpaths.at(-1)).toMatchObject({ count: 3, closed: true })
    expect(parsed.path.segments.slice(-3).every((s) => s.length === 4)).toBe(true)
    // Revision 1 is untouched: saving adds, never overwrites.
    expect((await db.ds.getRepository(RevisionEntity).findOneByOrFail({ pathId: lift, number: 1 })).data).toBe(before)

    await page.goto(`${app.baseUrl}/projects/${projectId}/library`)
    await page.locator(`[data-testid="library-open-${lift}"]`).click()
    await page.getByText('Pen triangle beside the arrows').first().waitFor()
    await screenshot(page, '25-library-new-revision')
  })

  it('reopens a seeded probe set on a glyph: its sweep rows, y upwards, the containment view', async () => {
    const [set] = (await db.ds.query("SELECT s.id, s.project_id AS projectId, s.sweeps FROM probe_sets s WHERE s.name LIKE 'R %16 ppem'")) as Array<{ id: number; projectId: number; sweeps: unknown }>
    const sweeps = (typeof set.sweeps === 'string' ? JSON.parse(set.sweeps) : set.sweeps) as Array<{ count: number }>
    await page.goto(`${app.baseUrl}/projects/${set.projectId}/canvas?probeSet=${set.id}`)
    await page.locator('[data-testid="canvas-view"]').scrollIntoViewIfNeeded()
    await page.locator('[data-testid="sweep-card-sweep-1"]').waitFor()
    // Fonts show y upwards: the first row's y reads as a positive font-unit height.
    expect(await page.locator('[data-testid="toggle-y-up"]').getAttribute('aria-pressed')).toBe('true')
    const firstY = Number(await page.locator('[data-testid="sweep-card-sweep-1"]').getByLabel('first line y', { exact: true }).inputValue())
    expect(firstY).toBeGreaterThan(0)
    const hits = Number((await page.locator('[data-testid="hit-count"]').innerText()).match(/\d+/)![0])
    // Every row of a closed outline is crossed an even number of times; R has rows with 2 and 4.
    expect(hits % 2).toBe(0)
    expect(hits).toBeGreaterThanOrEqual(2 * sweeps[0].count)
    await page.locator('[data-testid="server-check"]').getByText(/Server agrees on all \d+ hits/).waitFor()
    await page.locator('[data-testid="toggle-containment"]').click()
    await page.waitForTimeout(400)
    await screenshot(page, '27-canvas-glyph-sweep-containment')
  })

  it('lets a viewer probe and export but not save edits or probe sets', async () => {
    const ctx = await browser.newContext()
    const viewer = await ctx.newPage()
    await signIn(viewer, app.baseUrl, 'viewer@example.com')
    const pin = await pathId('Map pin')
    const box = await openCanvas(viewer, pin, 6)
    expect(await viewer.locator('[data-testid="canvas-save"]').count()).toBe(0)
    expect(await viewer.locator('[data-testid="tool-pen"]').isDisabled()).toBe(true)
    await viewer.locator('[data-testid="tool-line"]').click()
    await drag(viewer, [box.x + 40, box.y + box.height / 2], [box.x + box.width - 40, box.y + box.height / 2 + 5])
    await viewer.locator('[data-testid="probe-card-probe-1"]').waitFor()
    expect(Number((await viewer.locator('[data-testid="hit-count"]').innerText()).match(/\d+/)![0])).toBeGreaterThan(0)
    await viewer.locator('[data-testid="side-tab-sheet"]').click()
    expect(await viewer.locator('[data-testid="save-probe-set"]').count()).toBe(0)
    // The server refuses what the screen does not offer.
    const status = await viewer.evaluate(async (id) => {
      const me = await (await fetch('/api/v1/auth/me')).json()
      const res = await fetch(`/api/v1/paths/${id}/revisions`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': me.csrfToken },
        body: JSON.stringify({ data: 'M0 0 L1 0 L0 1 Z', message: 'viewer edit' }),
      })
      return res.status
    }, pin)
    expect(status).toBe(403)
    await screenshot(viewer, '26-canvas-viewer')
    await ctx.close()
    expect(browser.problems).toEqual([])
  })
})
