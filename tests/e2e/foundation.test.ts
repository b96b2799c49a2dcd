import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ProjectEntity } from '../../server/entities/project.entity'
import { seedTestData, TEST_PASSWORD } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'
import { launchBrowser, screenshot, serveApp, type Browser, type RunningApp } from './browser'

let db: TestDatabase
let app: RunningApp
let browser: Browser

beforeAll(async () => {
  db = await createTestDatabase()
  await seedTestData(db.ds)
  app = await serveApp(db)
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  await app?.close()
  await db?.drop()
})

async function signInThroughForm(page: Page, email: string): Promise<void> {
  await page.goto(`${app.baseUrl}/projects`)
  await page.waitForURL(/\/sign-in/)
  await page.locator('[data-testid="sign-in-email"] input').fill(email)
  await page.locator('[data-testid="sign-in-password"] input').fill(TEST_PASSWORD)
  await page.locator('[data-testid="sign-in-submit"]').click()
  await page.waitForURL(/\/projects$/)
  await page.locator('[data-testid="projects-table"]').getByText('Wayfinding icons').waitFor()
}

describe('the foundation in Chromium', () => {
  it('refuses a wrong password on the sign-in screen with a readable message', async () => {
    const ctx = await browser.newContext()
    const page = await ctx.newPage()
    await page.goto(`${app.baseUrl}/`)
    await page.waitForURL(/\/sign-in/)
    await screenshot(page, '01-sign-in')
    await page.locator('[data-testid="sign-in-email"] input').fill('editor@example.com')
    await page.locator('[data-testid="sign-in-password"] input').fill('not-my-password')
    await page.locator('[data-testid="sign-in-submit"]').click()
    const error = page.locator('[data-testid="sign-in-error"]')
    await error.waitFor()
    expect(await error.innerText()).toMatch(/do not match/)
    await screenshot(page, '02-sign-in-error')
    expect(await page.evaluate(() => document.fonts.check('16px Roboto'))).toBe(true)
    await ctx.close()
  })

  it('lets an editor create a project and see it in the table', async () => {
    const ctx = await browser.newContext()
    const page = await ctx.newPage()
    await signInThroughForm(page, 'editor@example.com')
    await screenshot(page, '03-projects-editor')
    await page.locator('[data-testid="new-project-button"]').click()
    // The dialog focuses its name field when its entrance ends; typing before that could land in the wrong field.
    await page.waitForFunction(() => document.activeElement?.closest('[data-testid="project-name-input"]') != null)
    await page.locator('[data-testid="project-name-input"] input').fill('Ferry timetable numerals')
    await page.locator('[data-testid="project-description-input"] textarea').first().fill('Tabular figures for the departure board')
    await page.waitForTimeout(400) // let the dialog's entrance transition finish
    await screenshot(page, '04-new-project-dialog')
    await page.locator('[data-testid="create-project-confirm"]').click()
    await page.locator('[data-testid="projects-table"]').getByText('Ferry timetable numerals', { exact: true }).waitFor()
    await screenshot(page, '05-project-created')
    const row = await db.ds.getRepository(ProjectEntity).findOneBy({ name: 'Ferry timetable numerals' })
    expect(row?.description).toBe('Tabular figures for the departure board')

    await page.locator('[data-testid="projects-table"]').getByText('Wayfinding icons').click()
    await page.waitForURL(/\/projects\/\d+\/library/)
    await page.locator('[data-testid="library-table"]').getByText('Map pin').waitFor()
    for (const tab of ['library', 'canvas', 'suites', 'audits', 'activity']) {
      expect(await page.locator(`[data-testid="project-tab-${tab}"]`).count(), tab).toBe(1)
    }
    await screenshot(page, '06-project-library')
    await page.locator('[data-testid="project-tab-canvas"]').click()
    await page.waitForURL(/\/canvas$/)
    await screenshot(page, '07-project-canvas-empty')

    await page.locator('[data-testid="theme-toggle"]').click()
    await page.goto(`${app.baseUrl}/projects`)
    await page.locator('[data-testid="projects-table"]').getByText('Wayfinding icons').waitFor()
    await screenshot(page, '08-projects-dark')
    await ctx.close()
  })

  it('shows a viewer no create action, and the API refuses it', async () => {
    const ctx = await browser.newContext()
    const page = await ctx.newPage()
    await signInThroughForm(page, 'viewer@example.com')
    expect(await page.locator('[data-testid="new-project-button"]').count()).toBe(0)
    expect(await page.locator('[data-testid="delete-project-button"]').count()).toBe(0)
    await page.locator('[data-testid="account-menu-button"]').click()
    await page.locator('[data-testid="account-role"]').waitFor()
    expect(await page.locator('[data-testid="account-role"]').innerText()).toBe('viewer')
    await screenshot(page, '09-projects-viewer-menu')
    const answer = await page.evaluate(async () => {
      const me = await (await fetch('/api/v1/auth/me')).json()
      const res = await fetch(`/api/v1/teams/${me.teams[0].id}/projects`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': me.csrfToken },
        body: JSON.stringify({ name: 'Viewer attempt' }),
      })
      return { status: res.status, body: await res.json() }
    })
    expect(answer.status).toBe(403)
    expect(answer.body.error.code).toBe('forbidden')
    expect(await db.ds.getRepository(ProjectEntity).findOneBy({ name: 'Viewer attempt' })).toBeNull()

    await page.locator('[data-testid="sign-out"]').click()
    await page.waitForURL(/\/sign-in/)
    await ctx.close()
  })

  it('loaded nothing from outside 127.0.0.1 and logged no errors', () => {
    expect(browser.problems).toEqual([])
  })
})
