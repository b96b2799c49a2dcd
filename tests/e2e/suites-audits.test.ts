import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { PathEntity } from '../../server/entities/path.entity'
import { seedTestData } from '../helpers/test-app'
import { createTestAuditJobs, type TestAuditJobs } from '../helpers/test-audits'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'
import { launchBrowser, screenshot, serveApp, signIn, type Browser, type RunningApp } from './browser'

let db: TestDatabase
let app: RunningApp
let browser: Browser
let page: Page
let projectId: number
let stairId: number
let jobs: TestAuditJobs

beforeAll(async () => {
  db = await createTestDatabase()
  await seedTestData(db.ds)
  // Chunks of two paths, so the twelve icons make six jobs and the progress bar moves.
  jobs = createTestAuditJobs({ chunkSize: 2 })
  jobs.startWorker(db.ds)
  app = await serveApp(db, { auditQueue: jobs.queue })
  browser = await launchBrowser()
  const ctx = await browser.newContext()
  page = await ctx.newPage()
  await signIn(page, app.baseUrl, 'editor@example.com')
  const [{ id }] = (await db.ds.query("SELECT id FROM projects WHERE name = 'Wayfinding icons'")) as Array<{ id: number }>
  projectId = Number(id)
  stairId = (await db.ds.getRepository(PathEntity).findOneByOrFail({ name: 'Stair', projectId })).id
})
afterAll(async () => {
  await browser?.close()
  await app?.close()
  await jobs?.close()
  await db?.drop()
})

describe('suites and audits in Chromium', () => {
  it('keeps the hits of a ray on the canvas as expected, runs the suite and sees it pass', async () => {
    // Stair (seed): M3 20V16H8V12H13V8H18V4H21V20Z — a horizontal ray at y = 18 from x = 0
    // crosses the left edge x = 3 and the right edge x = 21 (hand-worked).
    await page.goto(`${app.baseUrl}/projects/${projectId}/canvas?paths=${stairId}`)
    await page.locator('[data-testid="canvas-view"]').scrollIntoViewIfNeeded()
    await page.locator('[data-testid="canvas-compute"]').getByText('segments').waitFor()
    await page.locator('[data-testid="add-ray"]').click()
    const card = page.locator('[data-testid="probe-card-probe-1"]')
    for (const [label, value] of [['origin x', '0'], ['origin y', '18'], ['direction x', '1'], ['direction y', '0']] as const) {
      const field = card.getByLabel(label, { exact: true })
      await field.fill(value)
      await field.press('Enter')
    }
    await page.locator('[data-testid="hit-count"]').getByText('2 hits').waitFor()
    await page.locator('[data-testid="keep-expected"]').click()
    const dialog = page.locator('[data-testid="keep-dialog"]')
    await dialog.waitFor()
    await dialog.locator('[data-testid="keep-suite"]').click()
    await page.getByRole('option', { name: 'A new suite…' }).click()
    await dialog.locator('[data-testid="keep-new-suite"] input').fill('Stair rays')
    await dialog.locator('[data-testid="keep-name"] input').fill('Row 18 across the stair')
    await screenshot(page, '30-keep-expected')
    await dialog.locator('[data-testid="keep-confirm"]').click()
    await page.locator('[data-testid="canvas-notice"]').getByText('Kept as check').waitFor()

    await page.locator('[data-testid="project-tab-suites"]').click()
    await page.locator('[data-testid="suite-list"]').getByText('Stair rays').click()
    await page.locator('[data-testid="suite-title"]').getByText('Stair rays').waitFor()
    await page.locator('[data-testid="suite-run"]').click()
    const detail = page.locator('[data-testid="run-detail"]')
    await detail.getByText('Run 1 · passed · 1 passed, 0 failed').waitFor()
    const [row] = (await db.ds.query("SELECT verdict FROM runs r JOIN suites s ON s.id = r.suite_id WHERE s.name = 'Stair rays'")) as Array<{ verdict: string }>
    expect(row.verdict).toBe('passed')
    await screenshot(page, '31-suite-passed')
  })

  it('shows the diff once a new revision moves the stair’s left edge, and opens the case on the canvas', async () => {
    const status = await page.evaluate(async (id) => {
      const me = await (await fetch('/api/v1/auth/me')).json()
      const res = await fetch(`/api/v1/paths/${id}/revisions`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': me.csrfToken },
        // The left edge moves from x = 3 to x = 2: the crossing at (3, 18) moves to (2, 18).
        body: JSON.stringify({ data: 'M2 20V16H8V12H13V8H18V4H21V20Z', message: 'Wider bottom step' }),
      })
      return res.status
    }, stairId)
    expect(status).toBe(201)
    await page.locator('[data-testid="suite-run"]').click()
    const detail = page.locator('[data-testid="run-detail"]')
    await detail.getByText('Run 2 · failed · 0 passed, 1 failed').waitFor()
    const diffs = detail.locator('[data-testid="result-differences"]')
    await diffs.waitFor()
    expect(await diffs.innerText()).toMatch(/moved|missing/)
    await diffs.scrollIntoViewIfNeeded()
    await screenshot(page, '32-suite-failed-diff')
    await detail.locator('[data-testid="result-open-canvas"]').click()
    await page.waitForURL(/\/canvas\?/)
    await page.waitForTimeout(1500)
    await screenshot(page, '33-check-on-canvas')
    await page.locator('[data-testid^="probe-card-"]').first().waitFor()
    expect(new URL(page.url()).searchParams.get('paths')).toBe(String(stairId))
    expect(browser.problems).toEqual([])
  })

  it('starts an audit of the library and watches the progress bar reach the end', async () => {
    await page.goto(`${app.baseUrl}/projects/${projectId}/audits`)
    await page.locator('[data-testid="new-audit"]').click()
    const dialog = page.locator('[data-testid="audit-dialog"]')
    await dialog.waitFor()
    await dialog.locator('[data-testid="audit-random-rays"] input').fill('40')
    await dialog.locator('[data-testid="audit-engine-bezier-js"] input').uncheck()
    await dialog.locator('[data-testid="audit-start"]').click()
    const progress = page.locator('[data-testid="audit-progress"]')
    await progress.waitFor()
    await screenshot(page, '34-audit-running')
    await page.locator('[data-testid="audit-status"]').getByText('completed').waitFor({ timeout: 60_000 })
    expect(await progress.getAttribute('aria-valuenow')).toBe('100')
    const report = page.locator('[data-testid="audit-report"]')
    await report.locator('[data-testid="audit-engine-newton"]').waitFor()
    const [row] = (await db.ds.query('SELECT status, chunks_done AS done, chunk_count AS total FROM audits ORDER BY id DESC LIMIT 1')) as Array<{ status: string; done: number; total: number }>
    expect(row.status).toBe('completed')
    expect(Number(row.done)).toBe(Number(row.total))
    // Twelve icons in chunks of two.
    expect(Number(row.total)).toBe(6)
    const hits = Number((await report.locator('[data-testid="audit-engine-newton"] [data-testid="count-referenceHits"]').innerText()).replace(/[^0-9]/g, ''))
    expect(hits).toBeGreaterThan(0)
    await screenshot(page, '35-audit-report')
    await report.locator('[data-testid="audit-scatter"]').scrollIntoViewIfNeeded()
    await page.waitForTimeout(300)
    await screenshot(page, '36-audit-charts')
    expect(browser.problems).toEqual([])
  }, 90_000)
})
