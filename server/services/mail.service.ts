/**
 * Outgoing mail. The app receives a `Mailer`; in development and tests it delivers to the
 * local SMTP fake (server/scripts/smtp-fake.ts), in production to any SMTP server named by
 * one setting (ROOTCAST_SMTP_URL).
 */

/** One message to send; `text` is required, `html` optional. */
export interface MailMessage {
  readonly to: readonly string[]
  readonly subject: string
  readonly text: string
  readonly html?: string
}

export interface Mailer {
  send(message: MailMessage): Promise<void>
  close(): void
}
