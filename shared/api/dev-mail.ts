import { z } from 'zod'

/** One message as the local SMTP fake received and parsed it (development and tests only). */
export const devMailMessageSchema = z
  .object({
    id: z.string(),
    from: z.string().describe('The From header as text, or the envelope sender when there is none'),
    to: z.array(z.string()).describe('The envelope recipients'),
    subject: z.string(),
    text: z.string().describe('The plain-text body'),
    html: z.string().nullable().describe('The HTML body, when the message has one'),
    receivedAt: z.string().describe('ISO 8601 time'),
  })
  .meta({ id: 'DevMailMessage' })
export type DevMailMessage = z.infer<typeof devMailMessageSchema>

export const devMailListSchema = z.object({ items: z.array(devMailMessageSchema) }).meta({ id: 'DevMailList' })
export type DevMailList = z.infer<typeof devMailListSchema>
