import { mkdirSync } from 'node:fs'
import { mkdtemp, rm } from 'node:fs/promises'
import type { Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'
import type { RootcastApp } from '../../server/app'
import { ROOT_DIR } from '../../server/app'
import { buildTestApp, seedTestData, TEST_PASSWORD } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'

export const SCREENSHOT_DIR = join(ROOT_DIR, 'test-output', 'screenshots')

/** Launch flags proven on this kind of machine: no sandbox as root, no background traffic. */
const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
]

export interface RunningApp {
  rc: RootcastApp
  baseUrl: string
  close(): Promise<void>
}

/** The real app (API and the built client) listening on an ephemeral port of 127.0.0.1. */
export async function serveApp(db: TestDatabase, opts: Omit<NonNullable<Parameters<typeof buildTestApp>[1]>, 'clientDir'> = {}): Promise<RunningApp> {
  const clientDir = process.env.ROOTCAST_TEST_CLIENT_DIR ?? join(ROOT_DIR, 'dist')
  const rc = buildTestApp(db.ds, { ...opts, clientDir })
  const server: Server = await new Promise((resolve) => {
    const s = rc.app.listen(0, '127.0.0.1', () => resolve(s))
  })
  const { port } = server.address() as AddressInfo
  return {
    rc,
    baseUrl: `http://127.0.0.1:${port}`,
    close: async () => {
      server.closeAllConnections()
      await new Promise((r) => server.close(r))
      await rc.close()
    },
  }
}

export interface Browser {
  newContext(): Promise<BrowserContext>
  /** Problems seen on any page: console errors, page errors, requests off 127.0.0.1. */
  problems: string[]
  close(): Promise<void>
}

export async function launchBrowser(): Promise<Browser> {
  const problems: string[] = []
  const contexts: BrowserContext[] = []
  const dirs: string[] = []
  mkdirSync(SCREENSHOT_DIR, { recursive: true })
  return {
    problems,
    async newContext() {
      const dir = await mkdtemp(join(tmpdir(), 'rootcast-chromium-'))
      dirs.push(dir)
      const ctx = await chromium.launchPersistentContext(dir, {
        executablePath: process.env.ROOTCAST_CHROMIUM ?? '/usr/bin/chromium',
        headless: true,
        args: CHROMIUM_ARGS,
        viewport: { width: 1280, height: 800 },
      })
      ctx.on('request', (r) => {
        const u = new URL(r.url())
        if (!['127.0.0.1', 'localhost'].includes(u.hostname) && !['data:', 'blob:'].includes(u.protocol)) problems.push(`request off the machine: ${r.url()}`)
      })
      const watch = (page: Page) => {
        page.on('pageerror', (e) => problems.push(`page error: ${e.message}`))
        page.on('console', (m) => {
          // A refused request (401 before sign-in, 403 in the role test) logs a resource error; the tests check those answers themselves.
          if (m.type() === 'error' && !/status of (401|403)/.test(m.text())) problems.push(`console error: ${m.text()}`)
        })
      }
      ctx.setDefaultTimeout(10_000)
      ctx.pages().forEach(watch)
      ctx.on('page', watch)
      contexts.push(ctx)
      return ctx
    },
    async close() {
      for (const c of contexts) await c.close()
      for (const d of dirs) await rm(d, { recursive: true, force: true })
    },
  }
}

export async function screenshot(page: Page, name: string): Promise<string> {
  const file = join(SCREENSHOT_DIR, `${name}.png`)
  await page.screenshot({ path: file })
  return file
}

/** Signs in through the sign-in form with the test password and waits for the projects screen. */
export async function signIn(page: Page, baseUrl: string, email: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`)
  await page.locator('[data-testid="sign-in-email"] input').fill(email)
  await page.locator('[data-testid="sign-in-password"] input').fill(TEST_PASSWORD)
  await page.locator('[data-testid="sign-in-submit"]').click()
  await page.waitForURL(/\/projects$/)
}

/** A seeded throwaway database, the app on it, Chromium, and a page signed in on the demo team. */
export interface SignedInSession {
  db: TestDatabase
  app: RunningApp
  browser: Browser
  page: Page
  /** The seeded "Wayfinding icons" project. */
  projectId: number
}

export async function openSignedInSession(email = 'editor@example.com'): Promise<SignedInSession> {
  const db = await createTestDatabase()
  await seedTestData(db.ds)
  const app = await serveApp(db)
  const browser = await launchBrowser()
  const page = await (await browser.newContext()).newPage()
  await signIn(page, app.baseUrl, email)
  const [{ id }] = (await db.ds.query("SELECT id FROM projects WHERE name = 'Wayfinding icons'")) as Array<{ id: number }>
  return { db, app, browser, page, projectId: Number(id) }
}

/** Closes what openSignedInSession opened (whatever part of it got open). */
export async function closeSignedInSession(session: Partial<SignedInSession> | undefined): Promise<void> {
  await session?.browser?.close()
  await session?.app?.close()
  await session?.db?.drop()
}
