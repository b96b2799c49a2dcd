import { devMailListSchema } from '../../shared/api/dev-mail'
import type { Mailbox } from '../services/mail.service'
import type { ApiRegistry } from './api-route'

/** The developer mail page's data: mounted only when the app runs with the local SMTP fake. */
export function devMailRoutes(api: ApiRegistry, mailbox: Mailbox): void {
  api.add({
    method: 'get', path: '/dev/mail', tag: 'dev',
    summary: 'The messages the local SMTP fake received, newest first (development and tests only)',
    access: { permission: 'signedIn', scope: 'none' }, response: devMailListSchema,
    handler: async () => ({ items: [...mailbox.messages()].reverse() }),
  })
}
