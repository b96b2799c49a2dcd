import {
  checkListSchema,
  checkRunPageSchema,
  checkSchema,
  runDetailSchema,
  runPageSchema,
  suiteListSchema,
  suiteSchema,
  type Check,
  type CheckRunPage,
  type NewCheck,
  type NewSuite,
  type RunDetail,
  type RunPage,
  type Suite,
  type UpdateCheck,
  type UpdateSuite,
} from '../../shared/api'
import { download, request } from './http'

export async function listSuites(projectId: number, signal?: AbortSignal): Promise<Suite[]> {
  return (await request(`/projects/${projectId}/suites`, { schema: suiteListSchema, signal })).items
}
export function createSuite(projectId: number, input: NewSuite): Promise<Suite> {
  return request(`/projects/${projectId}/suites`, { method: 'POST', body: input, schema: suiteSchema })
}
export function updateSuite(suiteId: number, patch: UpdateSuite): Promise<Suite> {
  return request(`/suites/${suiteId}`, { method: 'PATCH', body: patch, schema: suiteSchema })
}
export function deleteSuite(suiteId: number): Promise<void> {
  return request(`/suites/${suiteId}`, { method: 'DELETE' })
}
export function watchSuite(suiteId: number, watching: boolean): Promise<Suite> {
  return request(`/suites/${suiteId}/watch`, { method: 'PUT', body: { watching }, schema: suiteSchema })
}
export async function listChecks(suiteId: number, signal?: AbortSignal): Promise<Check[]> {
  return (await request(`/suites/${suiteId}/checks`, { schema: checkListSchema, signal })).items
}
/** Keeps the hits of a saved path revision as a check; the server computes the expected hits. */
export function createCheck(suiteId: number, input: NewCheck): Promise<Check> {
  return request(`/suites/${suiteId}/checks`, { method: 'POST', body: input, schema: checkSchema })
}
export function getCheck(checkId: number, signal?: AbortSignal): Promise<Check> {
  return request(`/checks/${checkId}`, { schema: checkSchema, signal })
}
export function updateCheck(checkId: number, patch: UpdateCheck): Promise<Check> {
  return request(`/checks/${checkId}`, { method: 'PATCH', body: patch, schema: checkSchema })
}
export function deleteCheck(checkId: number): Promise<void> {
  return request(`/checks/${checkId}`, { method: 'DELETE' })
}
export function runSuite(suiteId: number): Promise<RunDetail> {
  return request(`/suites/${suiteId}/runs`, { method: 'POST', schema: runDetailSchema })
}
export function listRuns(suiteId: number, page = 1, pageSize = 50, signal?: AbortSignal): Promise<RunPage> {
  return request(`/suites/${suiteId}/runs`, { query: { page, pageSize }, schema: runPageSchema, signal })
}
export function getRun(runId: number, signal?: AbortSignal): Promise<RunDetail> {
  return request(`/runs/${runId}`, { schema: runDetailSchema, signal })
}
export function listCheckRuns(checkId: number, signal?: AbortSignal): Promise<CheckRunPage> {
  return request(`/checks/${checkId}/runs`, { query: { page: 1, pageSize: 50 }, schema: checkRunPageSchema, signal })
}
/** Downloads a run as JUnit XML (one test case per check). */
export function downloadJunit(runId: number): Promise<string> {
  return download(`/runs/${runId}/junit.xml`, { fallbackName: `rootcast-run-${runId}.xml` })
}
