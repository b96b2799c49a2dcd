import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { MembershipEntity } from '../../server/entities/membership.entity'
import { UserEntity } from '../../server/entities/user.entity'
import { seedTestData } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'
import { startTestMailbox, type TestMailbox } from '../helpers/test-mail'
import { launchBrowser, screenshot, serveApp, signIn, type Browser, type RunningApp } from './browser'

let db: TestDatabase
let app: RunningApp
let browser: Browser
let mailbox: TestMailbox
let owner: Page
let demoTeamId: number

/** An invented address and person for the scenario. */
const INVITEE = { email: 'nell.capstan@harbour.test', name: 'Nell Capstan' }
/** Meets the 10-character minimum of the Account rules. */
const INVITEE_PASSWORD = 'bollard-lamp-42'

beforeAll(async () => {
  db = await createTestDatabase()
  ;({ demoTeamId } = await seedTestData(db.ds))
  mailbox = await startTestMailbox()
  app = await serveApp(db, { mailer: mailbox.mailer })
  browser = await launchBrowser()
  owner = await (await browser.newContext()).newPage()
  await signIn(owner, app.baseUrl, 'owner@example.com')
})
afterAll(async () => {
  await browser?.close()
  await app?.close()
  await mailbox?.stop()
  await db?.drop()
})

describe('inviting someone to the team in Chromium', () => {
  it('invites an address, follows the mailed link in a second browser, creates the account and finds the team’s projects', async () => {
    await owner.goto(`${app.baseUrl}/team?tab=invitations`)
    await owner.locator('[data-testid="invite-button"]').click()
    const dialog = owner.locator('[data-testid="invite-dialog"]')
    await dialog.locator('[data-testid="invite-email"] input').fill(INVITEE.email)
    await dialog.locator('[data-testid="invite-role"]').click()
    await owner.getByRole('option', { name: /^Viewer/ }).click()
    await dialog.locator('[data-testid="invite-confirm"]').click()
    await dialog.waitFor({ state: 'hidden' })
    const table = owner.locator('[data-testid="invitations-table"]')
    await table.getByText(INVITEE.email).waitFor()
    await table.getByText('Pending').waitFor()
    await owner.locator('[data-testid="invitations-notice"]').getByText(`Invitation mailed to ${INVITEE.email}.`).waitFor()
    await screenshot(owner, '40-team-invitations')

    // The test reads the mail from the local SMTP fake; the server's public address is its own here.
    const mail = await mailbox.waitForMessage((m) => m.to.includes(INVITEE.email))
    expect(mail.subject).toBe('Morwenna Quay invites you to Harbour Type Workshop on Rootcast')
    const link = /(http:\/\/\S+\/invitations\/accept\?token=[A-Za-z0-9_-]{43})(?:\s|$)/.exec(mail.text)?.[1]
    expect(link, mail.text).toBeDefined()

    const invitee = await (await browser.newContext()).newPage()
    // The mail's link names the configured public address; the test server listens elsewhere.
    const url = new URL(link!)
    await invitee.goto(`${app.baseUrl}${url.pathname}${url.search}`)
    await invitee.locator('[data-testid="accept-team"]').getByText('Join Harbour Type Workshop').waitFor()
    expect(await invitee.locator('[data-testid="accept-role"]').textContent()).toBe('viewer')
    await invitee.locator('[data-testid="accept-display-name"] input').fill(INVITEE.name)
    await invitee.locator('[data-testid="accept-password"] input').fill(INVITEE_PASSWORD)
    await invitee.locator('[data-testid="accept-create"]:not(.v-btn--disabled)').waitFor()
    await invitee.locator('[data-testid="accept-password"] input').blur()
    await invitee.waitForTimeout(400) // let the field's label and the button's colour transitions finish before the picture
    await screenshot(invitee, '41-accept-invitation')
    await invitee.locator('[data-testid="accept-create"]').click()
    await invitee.waitForURL(/\/projects$/)
    await invitee.locator('[data-testid="projects-table"]').getByText('Wayfinding icons').waitFor()

    const user = await db.ds.getRepository(UserEntity).findOneByOrFail({ email: INVITEE.email })
    expect(user.displayName).toBe(INVITEE.name)
    const membership = await db.ds.getRepository(MembershipEntity).findOneByOrFail({ userId: user.id, teamId: demoTeamId })
    expect(membership.role).toBe('viewer')

    // The owner sees the new member, and the invitation is no longer open.
    await owner.goto(`${app.baseUrl}/team`)
    const members = owner.locator('[data-testid="members-table"]')
    await members.getByText(INVITEE.name).waitFor()
    await members.locator('[data-testid="member-you"]').waitFor()
    await screenshot(owner, '42-team-members')
    await owner.goto(`${app.baseUrl}/team?tab=invitations`)
    await owner.locator('[data-testid="invitations-table"]').getByText('No open invitations').waitFor()
    expect(browser.problems).toEqual([])
  })
})
