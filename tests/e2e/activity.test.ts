import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { seedTestData } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'
import { launchBrowser, screenshot, serveApp, signIn, type Browser, type RunningApp } from './browser'

let db: TestDatabase
let app: RunningApp
let browser: Browser
let page: Page
let projectId: number
let runId: number

/** A check's stored tolerance (not an assertion): the suites tests' value, far above double rounding on a 12-unit square. */
const CHECK_TOLERANCE = { point: 1e-6, t: 1e-9 }

/** A write through the signed-in browser's own session, with its CSRF token. */
async function write(method: 'post' | 'patch' | 'delete', url: string, data?: object): Promise<Record<string, unknown>> {
  const me = await page.request.get(`${app.baseUrl}/api/v1/auth/me`)
  const csrf = ((await me.json()) as { csrfToken: string }).csrfToken
  const res = await page.request.fetch(`${app.baseUrl}/api/v1${url}`, { method, data, headers: { 'X-CSRF-Token': csrf } })
  expect(res.status(), `${method} ${url}: ${await res.text()}`).toBeLessThan(300)
  return res.status() === 204 ? {} : ((await res.json()) as Record<string, unknown>)
}

beforeAll(async () => {
  db = await createTestDatabase()
  await seedTestData(db.ds)
  app = await serveApp(db)
  browser = await launchBrowser()
  page = await (await browser.newContext()).newPage()
  await signIn(page, app.baseUrl, 'editor@example.com')
  const [{ id }] = (await db.ds.query("SELECT id FROM projects WHERE name = 'Wayfinding icons'")) as Array<{ id: number }>
  projectId = Number(id)
  // Invented steps of one afternoon: a path drawn, saved again, a suite with a check run, a path trashed.
  const path = await write('post', `/projects/${projectId}/paths`, { name: 'Berth 4 arrow', data: 'M0 0H10V10H0Z' })
  await write('post', `/paths/${path.id}/revisions`, { data: 'M0 0H12V10H0Z', message: 'wider' })
  await write('patch', `/paths/${path.id}`, { name: 'Berth 4 arrow, wide' })
  const suite = await write('post', `/projects/${projectId}/suites`, { name: 'Berth rows' })
  await write('post', `/suites/${suite.id}/checks`, {
    name: 'Row 5', pathId: path.id, revision: 2, follow: 'latest', probes: [{ type: 'ray', origin: [-5, 5], direction: [1, 0] }], sweeps: [],
    tolerance: CHECK_TOLERANCE,
  })
  runId = Number((await write('post', `/suites/${suite.id}/runs`)).id)
  await write('delete', `/paths/${path.id}`)
})
afterAll(async () => {
  await browser?.close()
  await app?.close()
  await db?.drop()
})

describe('the Activity screen in Chromium', () => {
  it('lists who did what, filters by action and opens a run from its entry', async () => {
    await page.goto(`${app.baseUrl}/projects/${projectId}/activity`)
    const table = page.locator('[data-testid="activity-table"]')
    await table.getByText('Moved path “Berth 4 arrow, wide” to the trash.').waitFor()
    const rows = table.locator('tbody tr')
    expect(await rows.count()).toBe(7)
    await expect.poll(() => rows.first().innerText()).toContain('Tobias Slipway')
    expect(await rows.nth(2).innerText()).toContain('Kept check “Row 5” in suite “Berth rows”.')
    await screenshot(page, 'activity-log')

    await page.locator('[data-testid="activity-action-filter"]').click()
    await page.getByRole('option', { name: 'Ran', exact: true }).click()
    await expect.poll(() => rows.count()).toBe(1)
    await page.getByRole('listbox').waitFor({ state: 'hidden' })
    await screenshot(page, 'activity-filtered')

    await table.locator('.rc-target-link').first().click()
    await page.waitForURL(`**/projects/${projectId}/suites?run=${runId}`)
    expect(browser.problems).toEqual([])
  })
})
