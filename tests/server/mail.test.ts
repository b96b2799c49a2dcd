import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RootcastApp } from '../../server/app'
import { loadConfig } from '../../server/config'
import { SMTP_FAKE_CAPACITY, startServerMail, startSmtpFake } from '../../server/scripts/smtp-fake'
import { createSmtpMailer } from '../../server/services/mail.service'
import { freePort } from '../helpers/free-port'
import { buildTestApp, seedTestData, signIn } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'
import { startTestMailbox, TEST_MAIL_FROM, type TestMailbox } from '../helpers/test-mail'

let db: TestDatabase
let mailbox: TestMailbox
let withMail: RootcastApp
let withoutMail: RootcastApp

// An invented run link, longer than the 78-character line limit of RFC 5322 §2.1.1, so the
// encoder must wrap it (quoted-printable soft breaks) and the parser must join it again.
const RUN_URL = `http://127.0.0.1:5170/projects/42/suites/7/runs/1913?check=glyph-R-bowl-crossing&revision=12&probe=${'row-'.repeat(12)}end`

beforeAll(async () => {
  db = await createTestDatabase()
  await seedTestData(db.ds)
  mailbox = await startTestMailbox()
  withMail = buildTestApp(db.ds, { mailer: mailbox.mailer, mailbox: mailbox.fake })
  withoutMail = buildTestApp(db.ds)
})
afterAll(async () => {
  await withMail?.close()
  await withoutMail?.close()
  await mailbox?.stop()
  await db?.drop()
})

describe('the SMTP mailer and the local fake', () => {
  it('delivers a message that arrives parsed: sender, recipients, subject, and a long URL intact', async () => {
    expect(RUN_URL.length).toBeGreaterThan(78)
    await mailbox.mailer.send({
      to: ['ines.ortega@harbour.test', 'watch@harbour.test'],
      subject: 'Suite “Glyph bowls” failed on revision 12',
      text: `2 of 9 checks failed.\n\nOpen the run: ${RUN_URL}\n`,
    })
    const got = await mailbox.waitForMessage((m) => m.subject.includes('Glyph bowls'))
    expect(got.subject).toBe('Suite “Glyph bowls” failed on revision 12')
    expect(got.to).toEqual(['ines.ortega@harbour.test', 'watch@harbour.test'])
    // mailparser writes the display name quoted.
    expect(got.from).toBe('"Rootcast Tests" <rootcast-tests@harbour.test>')
    expect(got.text).toContain(`Open the run: ${RUN_URL}`)
    expect(got.html).toBeNull()
    expect(Number.isNaN(Date.parse(got.receivedAt))).toBe(false)
  })

  it('keeps an HTML part when one is sent', async () => {
    await mailbox.mailer.send({
      to: ['lead@harbour.test'],
      subject: 'HTML part kept',
      text: 'Plain body',
      html: '<p>Rich <a href="http://127.0.0.1:5170/">body</a></p>',
    })
    const got = await mailbox.waitForMessage((m) => m.subject === 'HTML part kept')
    expect(got.text.trim()).toBe('Plain body')
    expect(got.html).toContain('<a href="http://127.0.0.1:5170/">body</a>')
  })

  it('refuses a message without recipients (a malformed call)', async () => {
    await expect(mailbox.mailer.send({ to: [], subject: 'Nobody', text: 'x' })).rejects.toThrow(RangeError)
  })

  it(`keeps only the latest ${SMTP_FAKE_CAPACITY} messages`, async () => {
    // Real SMTP all the way: the mailer's pooled connections make 501 messages a few seconds.
    const fake = await startSmtpFake()
    const mailer = createSmtpMailer({ url: fake.url })
    try {
      for (let i = 0; i <= SMTP_FAKE_CAPACITY; i++) await mailer.send({ to: ['bulk@harbour.test'], subject: `Bulk ${i}`, text: `n=${i}` })
      const kept = fake.messages()
      expect(kept).toHaveLength(SMTP_FAKE_CAPACITY)
      expect(kept[0].subject).toBe('Bulk 1')
      expect(kept.at(-1)!.subject).toBe(`Bulk ${SMTP_FAKE_CAPACITY}`)
      expect(kept.at(-1)!.from).toBe('"Rootcast" <rootcast@localhost>')
      fake.clear()
      expect(fake.messages()).toEqual([])
    } finally {
      mailer.close()
      await fake.stop()
    }
  })

  it('falls back to a free port when the asked one is taken', async () => {
    const first = await startSmtpFake({ port: await freePort() })
    const lines: string[] = []
    const second = await startSmtpFake({ port: first.port, log: (l) => lines.push(l) })
    try {
      expect(second.port).not.toBe(first.port)
      expect(second.url).toBe(`smtp://127.0.0.1:${second.port}`)
      expect(lines.join('\n')).toContain(`port ${first.port} is taken`)
    } finally {
      await second.stop()
      await first.stop()
    }
  })
})

describe('mail for the start command', () => {
  it('refuses production without ROOTCAST_SMTP_URL, with a message naming it', async () => {
    const config = loadConfig({ NODE_ENV: 'production', SESSION_SECRET: 's'.repeat(40) })
    await expect(startServerMail(config, () => undefined)).rejects.toThrow(/ROOTCAST_SMTP_URL is required in production/)
  })

  it('starts the fake outside production and mails through it', async () => {
    const lines: string[] = []
    const config = loadConfig({ NODE_ENV: 'development', ROOTCAST_SMTP_PORT: String(await freePort()), ROOTCAST_MAIL_FROM: TEST_MAIL_FROM })
    const mail = await startServerMail(config, (l) => lines.push(l))
    try {
      expect(mail.fake?.port).toBe(config.mail.fakePort)
      expect(lines.join('\n')).toContain(mail.fake!.url)
      await mail.mailer.send({ to: ['dev@harbour.test'], subject: 'Through the start command', text: 'ok' })
      expect(mail.fake!.messages().map((m) => m.subject)).toEqual(['Through the start command'])
    } finally {
      await mail.stop()
    }
  })

  it('uses ROOTCAST_SMTP_URL when set, and starts no fake', async () => {
    const config = loadConfig({ NODE_ENV: 'production', SESSION_SECRET: 's'.repeat(40), ROOTCAST_SMTP_URL: mailbox.fake.url })
    const mail = await startServerMail(config, () => undefined)
    try {
      expect(mail.fake).toBeUndefined()
      await mail.mailer.send({ to: ['ops@harbour.test'], subject: 'Production relay', text: 'relayed' })
      const got = await mailbox.waitForMessage((m) => m.subject === 'Production relay')
      expect(got.from).toBe('"Rootcast" <rootcast@localhost>')
    } finally {
      await mail.stop()
    }
  })

  it('refuses a ROOTCAST_SMTP_URL that is not smtp:// or smtps://', () => {
    expect(() => loadConfig({ ROOTCAST_SMTP_URL: 'http://mail.example.com' })).toThrow(/ROOTCAST_SMTP_URL/)
  })
})

describe('GET /dev/mail', () => {
  it('lists the fake’s messages newest first, for a signed-in person', async () => {
    await mailbox.mailer.send({ to: ['order@harbour.test'], subject: 'Order check A', text: 'a' })
    await mailbox.waitForMessage((m) => m.subject === 'Order check A')
    await mailbox.mailer.send({ to: ['order@harbour.test'], subject: 'Order check B', text: 'b' })
    await mailbox.waitForMessage((m) => m.subject === 'Order check B')
    expect((await request(withMail.app).get('/api/v1/dev/mail')).status).toBe(401)
    const viewer = await signIn(withMail.app, 'viewer@example.com')
    const res = await viewer.agent.get('/api/v1/dev/mail')
    expect(res.status).toBe(200)
    const subjects = res.body.items.map((m: { subject: string }) => m.subject)
    expect(subjects.indexOf('Order check B')).toBeLessThan(subjects.indexOf('Order check A'))
    expect(subjects.indexOf('Order check A')).toBeLessThan(subjects.indexOf('Suite “Glyph bowls” failed on revision 12'))
    const glyph = res.body.items.find((m: { subject: string }) => m.subject.includes('Glyph bowls'))
    expect(glyph.text).toContain(RUN_URL)
    expect(glyph.to).toEqual(['ines.ortega@harbour.test', 'watch@harbour.test'])
  })

  it('is not mounted without a mailbox (404) and not in that app’s OpenAPI document', async () => {
    const viewer = await signIn(withoutMail.app, 'viewer@example.com')
    const res = await viewer.agent.get('/api/v1/dev/mail')
    expect(res.status).toBe(404)
    expect(res.body.error.code).toBe('not_found')
    const doc = (await request(withoutMail.app).get('/api/v1/openapi.json')).body
    expect(doc.paths['/api/v1/dev/mail']).toBeUndefined()
    const withDoc = (await request(withMail.app).get('/api/v1/openapi.json')).body
    expect(withDoc.paths['/api/v1/dev/mail'].get.tags).toEqual(['dev'])
  })
})
