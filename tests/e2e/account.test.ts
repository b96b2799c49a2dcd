import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { seedTestData, TEST_PASSWORD } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'
import { startTestMailbox, type TestMailbox } from '../helpers/test-mail'
import { launchBrowser, screenshot, serveApp, type Browser, type RunningApp } from './browser'

let db: TestDatabase
let app: RunningApp
let browser: Browser
let mailbox: TestMailbox
let page: Page

const EMAIL = 'viewer@example.com'
/** An invented new password of at least ten characters. */
const NEW_PASSWORD = 'ferry-slip-beacon-27'

/** Screenshots once the field labels and ripples have finished moving, so none is caught mid-way. */
async function still(page: Page, name: string): Promise<void> {
  await page.waitForFunction(() =>
    document.getAnimations().every((a) => a.playState !== 'running' || a.effect?.getTiming().iterations === Infinity),
  )
  await screenshot(page, name)
}

beforeAll(async () => {
  db = await createTestDatabase()
  await seedTestData(db.ds)
  mailbox = await startTestMailbox()
  app = await serveApp(db, { mailer: mailbox.mailer })
  browser = await launchBrowser()
  page = await (await browser.newContext()).newPage()
})
afterAll(async () => {
  await browser?.close()
  await app?.close()
  await mailbox?.stop()
  await db?.drop()
})

describe('password reset and the account screen in Chromium', () => {
  it('asks for a link, follows it from the mail, sets a new password and signs in with it', async () => {
    await page.goto(`${app.baseUrl}/sign-in`)
    await page.locator('[data-testid="sign-in-forgot"]').click()
    await page.waitForURL(/\/forgot-password$/)
    await page.locator('[data-testid="forgot-email"] input').fill(EMAIL)
    await still(page, '50-forgot-password')
    await page.locator('[data-testid="forgot-submit"]').click()
    await page.locator('[data-testid="forgot-answer"]').getByText('If an account uses that address').waitFor()
    await still(page, '51-forgot-password-sent')

    const mail = await mailbox.waitForMessage((m) => m.to.includes(EMAIL))
    const link = /\S+\/reset-password\?token=[A-Za-z0-9_-]+/.exec(mail.text)?.[0]
    expect(link, mail.text).toBeDefined()
    // The mail carries the configured public URL; the test server listens on a port of its own.
    const url = new URL(link!)
    await page.goto(`${app.baseUrl}${url.pathname}${url.search}`)
    await page.locator('[data-testid="reset-password"] input').fill(NEW_PASSWORD)
    await page.locator('[data-testid="reset-repeat"] input').fill(NEW_PASSWORD)
    await still(page, '52-reset-password')
    await page.locator('[data-testid="reset-submit"]').click()
    await page.locator('[data-testid="reset-done"]').waitFor()
    await still(page, '53-reset-password-done')

    await page.locator('[data-testid="reset-sign-in"]').click()
    await page.waitForURL(/\/sign-in/)
    await page.locator('[data-testid="sign-in-email"] input').fill(EMAIL)
    await page.locator('[data-testid="sign-in-password"] input').fill(TEST_PASSWORD)
    await page.locator('[data-testid="sign-in-submit"]').click()
    await page.locator('[data-testid="sign-in-error"]').waitFor()
    await page.locator('[data-testid="sign-in-password"] input').fill(NEW_PASSWORD)
    await page.locator('[data-testid="sign-in-submit"]').click()
    await page.waitForURL(/\/projects$/)
    expect(browser.problems).toEqual([])
  })

  it('changes the display name and signs out other sessions from the Account screen', async () => {
    await page.goto(`${app.baseUrl}/account`)
    await page.locator('[data-testid="account-email"]').getByText(EMAIL).waitFor()
    await page.locator('[data-testid="account-display-name"] input').fill('Vera the Viewer')
    await page.locator('[data-testid="account-name-save"]').click()
    await page.locator('[data-testid="account-name-notice"]').waitFor()
    await still(page, '54-account')
    const [row] = (await db.ds.query('SELECT display_name AS name FROM users WHERE email = ?', [EMAIL])) as Array<{ name: string }>
    expect(row.name).toBe('Vera the Viewer')
    await page.locator('[data-testid="account-revoke-others"]').click()
    await page.locator('[data-testid="account-sessions-notice"]').getByText('No other sessions were signed in.').waitFor()
    await still(page, '55-account-sessions')
    expect(browser.problems).toEqual([])
  })
})
