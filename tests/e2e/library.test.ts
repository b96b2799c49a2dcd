import { createRequire } from 'node:module'
import { join } from 'node:path'
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { PathEntity } from '../../server/entities/path.entity'
import { RevisionEntity } from '../../server/entities/revision.entity'
import type { TestDatabase } from '../helpers/test-db'
import { closeSignedInSession, openSignedInSession, screenshot, type Browser, type RunningApp, type SignedInSession } from './browser'

let db: TestDatabase
let app: RunningApp
let browser: Browser
let page: Page
let projectId: number

let session: SignedInSession | undefined
beforeAll(async () => {
  session = await openSignedInSession('editor@example.com')
  ;({ db, app, browser, page, projectId } = session)
})
afterAll(() => closeSignedInSession(session))

describe('the library in Chromium', () => {
  it('shows the seeded icons with thumbnails drawn from their segments', async () => {
    await page.goto(`${app.baseUrl}/projects/${projectId}/library`)
    const table = page.locator('[data-testid="library-table"]')
    await table.getByText('Crossing knot').waitFor()
    expect(await table.locator('svg path').count()).toBeGreaterThanOrEqual(10)
    await screenshot(page, '10-library')
  })

  it('uploads an SVG, previews what it found, imports it and lists the new paths', async () => {
    await page.locator('[data-testid="library-upload-svg"]').click()
    await page.locator('[data-testid="svg-file-input"]').setInputFiles(join(__dirname, '..', 'server', 'fixtures', 'harbour-signs.svg'))
    const preview = page.locator('[data-testid="svg-preview-list"]')
    await preview.getByText('quay-plate').waitFor()
    expect(await preview.innerText()).toContain('bollard')
    await page.waitForTimeout(300) // let the dialog settle before the picture
    await screenshot(page, '11-svg-preview')
    // The uploaded file itself is never put on the page: no script text, no <img> or object of it.
    expect(await page.evaluate(() => document.documentElement.innerHTML.includes('harbour-secret-marker'))).toBe(false)
    await page.locator('[data-testid="svg-import-confirm"]').click()
    await page.locator('[data-testid="library-table"]').getByText('quay-plate').waitFor()
    const rows = await db.ds.getRepository(PathEntity).findBy({ sourceFile: 'harbour-signs.svg' })
    expect(rows.map((r) => r.name).sort()).toEqual(['bollard', 'jetty', 'quay-plate'])
    expect(rows.every((r) => r.origin === 'svg')).toBe(true)
    await page.locator('[data-testid="svg-import-dialog"]').waitFor({ state: 'hidden' })
    await screenshot(page, '12-library-after-import')
  })

  it('opens the history after an edit and restores the first revision as a new one', async () => {
    const jetty = await db.ds.getRepository(PathEntity).findOneByOrFail({ name: 'jetty', sourceFile: 'harbour-signs.svg' })
    const first = await db.ds.getRepository(RevisionEntity).findOneByOrFail({ pathId: jetty.id, number: 1 })
    const edit = await page.evaluate(async (id) => {
      const me = await (await fetch('/api/v1/auth/me')).json()
      const res = await fetch(`/api/v1/paths/${id}/revisions`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': me.csrfToken },
        body: JSON.stringify({ data: 'M4 40 L20 8 L36 40 L20 30 Z', message: 'Notched jetty' }),
      })
      return res.status
    }, jetty.id)
    expect(edit).toBe(201)
    await page.reload()
    await page.locator(`[data-testid="library-open-${jetty.id}"]`).click()
    const history = page.locator('[data-testid="path-history"]')
    await history.getByText('Notched jetty').waitFor()
    await page.waitForTimeout(300)
    await screenshot(page, '13-path-history')
    await page.locator('[data-testid="revision-restore-1"]').click()
    await history.getByText('Restored revision 1').waitFor()
    const latest = await db.ds.getRepository(RevisionEntity).findOneByOrFail({ pathId: jetty.id, number: 3 })
    expect(latest.data).toBe(first.data)
    expect(await db.ds.getRepository(RevisionEntity).countBy({ pathId: jetty.id })).toBe(3)
    await screenshot(page, '14-path-restored')
  })

  it('imports glyphs from a WOFF2 font (Roboto Regular, npm package @fontsource/roboto) after a preview', async () => {
    const woff2 = createRequire(import.meta.url).resolve('@fontsource/roboto/files/roboto-latin-400-normal.woff2')
    await page.locator('[data-testid="path-drawer-close"]').click()
    await page.locator('[data-testid="library-import-font"]').click()
    await page.locator('[data-testid="font-file-input"]').setInputFiles(woff2)
    await page.locator('[data-testid="font-text-input"] input').fill('Qe')
    await page.locator('[data-testid="font-preview-button"]').click()
    const glyphs = page.locator('[data-testid="font-preview-list"]')
    await page.locator('[data-testid="font-glyph-81"]').waitFor()
    expect(await glyphs.locator('svg path').count()).toBeGreaterThanOrEqual(2)
    await page.waitForTimeout(300)
    await screenshot(page, '15-font-preview')
    await page.locator('[data-testid="font-import-confirm"]').click()
    await page.locator('[data-testid="library-table"]').getByText(/^Q/).first().waitFor()
    const q = await db.ds.getRepository(PathEntity).findOneByOrFail({ projectId, origin: 'font', sourceFile: 'roboto-latin-400-normal.woff2', name: 'Q (U+0051)' })
    expect(q.units).toBe('font units')
    expect(q.metadata).toMatchObject({ unitsPerEm: 2048, codePoint: 0x51 })
  })

  it('opens one path’s details from a link (?path=, as the activity log links it)', async () => {
    const knot = await db.ds.getRepository(PathEntity).findOneByOrFail({ projectId, name: 'Crossing knot' })
    await page.goto(`${app.baseUrl}/projects/${projectId}/library?path=${knot.id}`)
    const drawer = page.locator('[data-testid="path-drawer"]')
    await drawer.getByText('Crossing knot').first().waitFor()
    expect(await drawer.locator('[data-testid="path-open-canvas"]').getAttribute('href')).toBe(`/projects/${projectId}/canvas?paths=${knot.id}`)
  })

  it('loaded nothing from outside 127.0.0.1 and logged no errors', () => {
    expect(browser.problems).toEqual([])
  })
})
