import { auditListSchema, auditSchema, type Audit, type AuditSummary, type NewAudit } from '../../shared/api'
import { download, request } from './http'

export async function listAudits(projectId: number, signal?: AbortSignal): Promise<AuditSummary[]> {
  return (await request(`/projects/${projectId}/audits`, { schema: auditListSchema, signal })).items
}
/** Queues an audit (editor); it runs on the workers, off the request path. */
export function createAudit(projectId: number, input: NewAudit): Promise<Audit> {
  return request(`/projects/${projectId}/audits`, { method: 'POST', body: input, schema: auditSchema })
}
export function getAudit(auditId: number, signal?: AbortSignal): Promise<Audit> {
  return request(`/audits/${auditId}`, { schema: auditSchema, signal })
}
export function cancelAudit(auditId: number): Promise<Audit> {
  return request(`/audits/${auditId}/cancel`, { method: 'POST', schema: auditSchema })
}
export function downloadAuditReport(auditId: number, format: 'csv' | 'json'): Promise<string> {
  return download(`/audits/${auditId}/report.${format}`, { fallbackName: `rootcast-audit-${auditId}.${format}` })
}
