import type { DataSource } from 'typeorm'
import { z } from 'zod'
import { idParam } from '../../shared/api/common'
import {
  checkListSchema,
  checkRunPageSchema,
  checkSchema,
  newCheckSchema,
  newSuiteSchema,
  runDetailSchema,
  runPageQuerySchema,
  runPageSchema,
  SUITE_LIMITS,
  suiteListSchema,
  suiteSchema,
  updateCheckSchema,
  updateSuiteSchema,
  watchSchema,
} from '../../shared/api/suites'
import type { Mailer } from '../services/mail.service'
import * as runs from '../services/runs.service'
import * as suites from '../services/suites.service'
import type { ApiRegistry, Scope } from './api-route'
import { attachmentName } from './library.routes'
import { changedDraft, createdDraft, deletedDraft, quoted } from './activity-text'

const projectParams = z.object({ projectId: idParam })
const suiteParams = z.object({ suiteId: idParam })
const checkParams = z.object({ checkId: idParam })
const runParams = z.object({ runId: idParam })

type SuiteScope = Extract<Scope, 'project' | 'suite' | 'check' | 'run'>
const read = (scope: SuiteScope) => ({ permission: 'library.read', scope }) as const
const write = (scope: SuiteScope) => ({ permission: 'suite.write', scope }) as const

export interface SuiteRouteDeps {
  ds: DataSource
  /** Base of the links in runs, mail and JUnit XML (config.publicUrl). */
  publicUrl: string
  mailer?: Mailer
}

export function suiteRoutes(api: ApiRegistry, deps: SuiteRouteDeps): void {
  const { ds, publicUrl } = deps

  // ---- Suites ----
  api.add({
    method: 'get', path: '/projects/:projectId/suites', tag: 'suites',
    summary: "The project's suites by name, each with its last run and whether you watch it",
    access: read('project'), params: projectParams, response: suiteListSchema,
    handler: async ({ params, user }) => ({ items: await suites.listSuites(ds, params.projectId, user.id, publicUrl) }),
  })

  api.add({
    method: 'post', path: '/projects/:projectId/suites', tag: 'suites',
    summary: 'Make a suite: a named group of checks',
    description: 'The name is unique in the project (409 `suite_name_taken`).',
    access: write('project'), params: projectParams, body: newSuiteSchema, status: 201, response: suiteSchema, errors: [409],
    handler: async ({ params, body, user }) => suites.createSuite(ds, params.projectId, body, user.id, publicUrl),
    activity: ({ result }) => createdDraft('suite', 'suite', result),
  })

  api.add({
    method: 'get', path: '/suites/:suiteId', tag: 'suites', summary: 'One suite with its last run',
    access: read('suite'), params: suiteParams, response: suiteSchema,
    handler: async ({ params, user }) => suites.getSuite(ds.manager, params.suiteId, user.id, publicUrl),
  })

  api.add({
    method: 'patch', path: '/suites/:suiteId', tag: 'suites', summary: 'Rename a suite or change its description',
    access: write('suite'), params: suiteParams, body: updateSuiteSchema, response: suiteSchema, errors: [409],
    handler: async ({ params, body, user }) => suites.updateSuite(ds, params.suiteId, body, user.id, publicUrl),
    activity: ({ result, scoped }) => changedDraft('suite', 'suite', result, scoped),
  })

  api.add({
    method: 'delete', path: '/suites/:suiteId', tag: 'suites', summary: 'Delete a suite with its checks and runs',
    access: write('suite'), params: suiteParams, status: 204,
    handler: async ({ params }) => suites.deleteSuite(ds, params.suiteId),
    activity: ({ params, scoped }) => deletedDraft('suite', 'suite', params.suiteId, scoped, ' with its checks and runs'),
  })

  api.add({
    method: 'put', path: '/suites/:suiteId/watch', tag: 'suites',
    summary: 'Watch a suite (mail when one of its runs fails) or stop watching it',
    description: 'Every member of the team may watch; the answer is the suite as you see it afterwards.',
    access: read('suite'), params: suiteParams, body: watchSchema, response: suiteSchema,
    handler: async ({ params, body, user }) => suites.setWatching(ds, params.suiteId, user.id, body.watching, publicUrl),
    activity: { none: 'A personal mail preference of the caller; the suite and the team’s work do not change.' },
  })

  // ---- Checks ----
  api.add({
    method: 'get', path: '/suites/:suiteId/checks', tag: 'suites', summary: "The suite's checks with their expected hits, in the order runs take them",
    access: read('suite'), params: suiteParams, response: checkListSchema,
    handler: async ({ params }) => ({ items: await suites.listChecks(ds, params.suiteId) }),
  })

  api.add({
    method: 'post', path: '/suites/:suiteId/checks', tag: 'suites',
    summary: 'Keep the hits of probes and sweeps on a path revision as a check',
    description: `The server computes the expected hits from the stored path data of that revision. The path must be a live path of the suite's project (404 \`path_not_found\`) with that revision (400 \`unknown_revision\`); the name is unique in the suite (409 \`check_name_taken\`); at most ${SUITE_LIMITS.lines} probe lines per check and ${SUITE_LIMITS.checksPerSuite} checks per suite (413 \`limit\`).`,
    access: write('suite'), params: suiteParams, body: newCheckSchema, status: 201, response: checkSchema, errors: [409, 413],
    handler: async ({ params, body }) => suites.createCheck(ds, params.suiteId, body),
    activity: ({ result, scoped }) => ({ ...createdDraft('check', 'check', result), summary: `Kept check ${quoted(result.name)} in suite ${quoted(scoped?.name ?? '')}.` }),
  })

  api.add({
    method: 'get', path: '/checks/:checkId', tag: 'suites', summary: 'One check with its expected hits',
    access: read('check'), params: checkParams, response: checkSchema,
    handler: async ({ params }) => suites.getCheck(ds.manager, params.checkId),
  })

  api.add({
    method: 'patch', path: '/checks/:checkId', tag: 'suites',
    summary: 'Change a check’s name, tolerance, match rules or what it follows; a revision keeps that revision’s hits as expected',
    access: write('check'), params: checkParams, body: updateCheckSchema, response: checkSchema, errors: [409, 413],
    handler: async ({ params, body }) => suites.updateCheck(ds, params.checkId, body),
    activity: ({ result, scoped }) => changedDraft('check', 'check', result, scoped),
  })

  api.add({
    method: 'delete', path: '/checks/:checkId', tag: 'suites', summary: 'Delete a check; its results in past runs stay',
    access: write('check'), params: checkParams, status: 204,
    handler: async ({ params }) => suites.deleteCheck(ds, params.checkId),
    activity: ({ params, scoped }) => deletedDraft('check', 'check', params.checkId, scoped),
  })

  api.add({
    method: 'get', path: '/checks/:checkId/runs', tag: 'suites', summary: "The check's results across runs, newest first (its trend)",
    access: read('check'), params: checkParams, query: runPageQuerySchema, response: checkRunPageSchema,
    handler: async ({ params, query }) => runs.listCheckRuns(ds, params.checkId, query, publicUrl),
  })

  // ---- Runs ----
  api.add({
    method: 'post', path: '/suites/:suiteId/runs', tag: 'suites',
    summary: 'Run the suite now and answer with the verdict per check',
    description: 'Each check runs on the path’s current revision (follow latest) or on its pinned one. With an API token (`Authorization: Bearer …`) the run is recorded as triggered by the API. `url` opens the run on the Suites screen; the JUnit XML is at /runs/{runId}/junit.xml. A suite without checks is 409 `suite_empty`. When the run fails, the suite’s watchers get mail.',
    access: { permission: 'suite.run', scope: 'suite' }, params: suiteParams, status: 201, response: runDetailSchema, errors: [409],
    handler: async ({ params, user, req }) =>
      runs.runSuite(deps, params.suiteId, user, req.auth?.via === 'token' ? 'api' : 'screen'),
    activity: ({ result, scoped }) => {
      const suite = scoped?.name ?? `#${result.suiteId}`
      return {
        action: 'ran', targetType: 'run', targetId: result.id, targetName: `${suite} #${result.number}`,
        summary: `Ran suite ${quoted(suite)}: run ${result.number} ${result.verdict} (${result.passed} passed, ${result.failed} failed).`,
      }
    },
  })

  api.add({
    method: 'get', path: '/suites/:suiteId/runs', tag: 'suites', summary: "The suite's runs, newest first, paged",
    access: read('suite'), params: suiteParams, query: runPageQuerySchema, response: runPageSchema,
    handler: async ({ params, query }) => runs.listRuns(ds, params.suiteId, query, publicUrl),
  })

  api.add({
    method: 'get', path: '/runs/:runId', tag: 'suites', summary: 'One run with every check’s verdict and differences (the run as JSON)',
    access: read('run'), params: runParams, response: runDetailSchema,
    handler: async ({ params }) => runs.getRun(ds.manager, params.runId, publicUrl),
  })

  api.add({
    method: 'get', path: '/runs/:runId/junit.xml', tag: 'suites',
    summary: 'One run as JUnit XML: a testcase per check, a failure per failed check',
    access: read('run'), params: runParams, produces: 'application/xml',
    handler: async ({ params, res }) => {
      const { xml, baseName } = await runs.getRunJunitXml(ds, params.runId, publicUrl)
      res.type('application/xml; charset=utf-8').attachment(attachmentName(baseName, 'xml')).send(xml)
    },
  })
}
