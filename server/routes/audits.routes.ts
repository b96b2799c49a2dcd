import type { DataSource } from 'typeorm'
import { z } from 'zod'
import { auditListSchema, auditSchema, newAuditSchema } from '../../shared/api/audits'
import { idParam } from '../../shared/api/common'
import { formatAuditReportCsv } from '../../shared/audit'
import { HttpError } from '../errors/http-error'
import type { AuditQueue } from '../jobs/audit-queue'
import * as audits from '../services/audits.service'
import type { ApiRegistry } from './api-route'
import { attachmentName } from './library.routes'
import { countOf, quoted } from './activity-text'

const projectParams = z.object({ projectId: idParam })
const auditParams = z.object({ auditId: idParam })

const read = (scope: 'project' | 'audit') => ({ permission: 'library.read', scope }) as const
const run = (scope: 'project' | 'audit') => ({ permission: 'audit.run', scope }) as const

const queueUnavailable = () =>
  new HttpError(503, 'queue_unavailable', 'Audits cannot be started right now: the job queue is not available. Try again later.')

export function auditRoutes(api: ApiRegistry, ds: DataSource, queue: AuditQueue | undefined): void {
  api.add({
    method: 'get', path: '/projects/:projectId/audits', tag: 'audits', summary: "The project's audits, newest first, without their reports",
    access: read('project'), params: projectParams, response: auditListSchema,
    handler: async ({ params }) => ({ items: await audits.listAudits(ds, params.projectId) }),
  })

  api.add({
    method: 'post', path: '/projects/:projectId/audits', tag: 'audits',
    summary: 'Start an audit: closed-form hits compared with numeric engines over a selection of paths',
    description:
      'The selection is resolved now (the current revisions of its live paths) and cut into chunks that the workers take up; the answer is the queued audit. ' +
      'A selection with no live path is 400 `empty_selection`; ids that are not live paths of the project are 400 `unknown_paths`; without a job queue the answer is 503 `queue_unavailable`.',
    access: run('project'), params: projectParams, body: newAuditSchema, status: 201, response: auditSchema, errors: [503],
    handler: async ({ params, body, user }) => {
      if (!queue) throw queueUnavailable()
      const { id, chunkCount } = await audits.createAudit(ds, params.projectId, user.id, body, queue.chunkSize)
      try {
        await queue.enqueue(id, chunkCount)
      } catch {
        await audits.discardAudit(ds, id)
        throw queueUnavailable()
      }
      return audits.getAudit(ds.manager, id)
    },
    activity: ({ result }) => ({
      action: 'ran', targetType: 'audit', targetId: result.id, targetName: result.name,
      summary: `Started audit ${quoted(result.name)} over ${countOf(result.pathCount, 'path')} against ${result.engines.join(', ')}.`,
    }),
  })

  api.add({
    method: 'get', path: '/audits/:auditId', tag: 'audits', summary: 'One audit: its status, progress in chunks and, once completed, its report',
    access: read('audit'), params: auditParams, response: auditSchema,
    handler: async ({ params }) => audits.getAudit(ds.manager, params.auditId),
  })

  api.add({
    method: 'post', path: '/audits/:auditId/cancel', tag: 'audits',
    summary: 'Cancel a queued or running audit; chunks not yet stored are dropped',
    description: 'A completed, cancelled or failed audit answers 409 `audit_finished`.',
    access: run('audit'), params: auditParams, response: auditSchema, errors: [409],
    handler: async ({ params }) => audits.cancelAudit(ds, params.auditId, async (chunkCount) => queue?.remove(params.auditId, chunkCount)),
    activity: ({ result }) => ({ action: 'cancelled', targetType: 'audit', targetId: result.id, targetName: result.name, summary: `Cancelled audit ${quoted(result.name)}.` }),
  })

  api.add({
    method: 'get', path: '/audits/:auditId/report.csv', tag: 'audits',
    summary: 'The report as CSV: the counts per engine and probe category',
    description: 'Before the audit has completed the answer is 409 `audit_not_completed`.',
    access: read('audit'), params: auditParams, produces: 'text/csv', errors: [409],
    handler: async ({ params, res }) => {
      const { name, report } = await audits.auditReport(ds, params.auditId)
      res.type('text/csv; charset=utf-8').attachment(attachmentName(`${name}.audit`, 'csv')).send(formatAuditReportCsv(report))
    },
  })

  api.add({
    method: 'get', path: '/audits/:auditId/report.json', tag: 'audits', summary: 'The report as a JSON download (the merged aggregate)',
    description: 'Before the audit has completed the answer is 409 `audit_not_completed`.',
    access: read('audit'), params: auditParams, produces: 'application/json', errors: [409],
    handler: async ({ params, res }) => {
      const { name, report } = await audits.auditReport(ds, params.auditId)
      res.type('application/json').attachment(attachmentName(`${name}.audit`, 'json')).send(JSON.stringify(report, null, 2))
    },
  })
}
