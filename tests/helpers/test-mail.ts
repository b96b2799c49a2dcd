import type { DevMailMessage } from '../../shared/api/dev-mail'
import { startSmtpFake, type SmtpFake } from '../../server/scripts/smtp-fake'
import { createSmtpMailer, type Mailer } from '../../server/services/mail.service'

/** Not the product's default From address, so a test cannot pass on the default by accident. */
export const TEST_MAIL_FROM = 'Rootcast Tests <rootcast-tests@harbour.test>'

export interface TestMailbox {
  fake: SmtpFake
  /** Sends through SMTP to `fake`, as the server's mailer does. */
  mailer: Mailer
  /** The first message, already received or still to come, that `predicate` accepts; rejects after `timeoutMs`. */
  waitForMessage(predicate: (message: DevMailMessage) => boolean, timeoutMs?: number): Promise<DevMailMessage>
  stop(): Promise<void>
}

/** How long waitForMessage waits by default: a loopback delivery takes milliseconds. */
const DEFAULT_WAIT_MS = 10_000

/** The local SMTP fake on a free loopback port, with a mailer pointing at it. */
export async function startTestMailbox(): Promise<TestMailbox> {
  const fake = await startSmtpFake()
  const mailer = createSmtpMailer({ url: fake.url, from: TEST_MAIL_FROM })
  return {
    fake,
    mailer,
    waitForMessage(predicate, timeoutMs = DEFAULT_WAIT_MS) {
      const already = fake.messages().find(predicate)
      if (already) return Promise.resolve(already)
      return new Promise((resolve, reject) => {
        const timer = setTimeout(() => {
          unsubscribe()
          const seen = fake.messages().map((m) => `“${m.subject}” to ${m.to.join(', ')}`)
          reject(new Error(`No matching message arrived within ${timeoutMs} ms; received: ${seen.join('; ') || 'none'}`))
        }, timeoutMs)
        const unsubscribe = fake.onMessage((message) => {
          if (!predicate(message)) return
          clearTimeout(timer)
          unsubscribe()
          resolve(message)
        })
      })
    },
    stop: async () => {
      mailer.close()
      await fake.stop()
    },
  }
}
