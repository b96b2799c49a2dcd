import { devMailListSchema, type DevMailMessage } from '../../shared/api'
import { request } from './http'

/** The messages the local SMTP fake received, newest first (404 when the server mails for real). */
export async function listDevMail(signal?: AbortSignal): Promise<DevMailMessage[]> {
  const result = await request('/dev/mail', { schema: devMailListSchema, signal })
  return result.items
}
