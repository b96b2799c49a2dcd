import type { DataSource } from 'typeorm'
import { z } from 'zod'
import { idParam } from '../../shared/api/common'
import {
  bulkActionSchema,
  bundleSchema,
  createdPathsSchema,
  fontPreviewFieldsSchema,
  fontPreviewSchema,
  importPathsSchema,
  newPathSchema,
  newRevisionSchema,
  pathDetailSchema,
  pathListQuerySchema,
  pathPageSchema,
  restoreRevisionSchema,
  revisionDetailSchema,
  revisionSummarySchema,
  svgPreviewSchema,
  updatePathSchema,
  UPLOAD_LIMITS,
} from '../../shared/api/library'
import { roleInTeam } from '../services/auth.service'
import { previewFont, previewSvgFiles } from '../services/import-preview.service'
import * as library from '../services/library.service'
import { roleAllows } from '../services/policy'
import { projectTeamId } from '../services/projects.service'
import type { ApiRegistry } from './api-route'
import { countOf, quoted, scopedName, singleId } from './activity-text'

const projectParams = z.object({ projectId: idParam })
const pathParams = z.object({ pathId: idParam })
const revisionParams = z.object({ pathId: idParam, number: idParam })
const idsQuery = z.object({
  ids: z
    .string()
    .regex(/^\d+(,\d+)*$/, 'Give ids as a comma-separated list of numbers.')
    .transform((s) => s.split(',').map(Number))
    .optional()
    .describe('Comma-separated path ids; all live paths of the project when absent'),
})

const read = (scope: 'project' | 'path') => ({ permission: 'library.read', scope }) as const
const write = (scope: 'project' | 'path') => ({ permission: 'library.write', scope }) as const

/** A download name made of safe characters only. */
export function attachmentName(base: string, ext: string): string {
  return `${base.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '') || 'rootcast'}.${ext}`
}

export function libraryRoutes(api: ApiRegistry, ds: DataSource): void {
  api.add({
    method: 'get', path: '/projects/:projectId/paths', tag: 'library',
    summary: "The project's library (or its trash), paged, sorted and filtered on the server",
    access: read('project'), params: projectParams, query: pathListQuerySchema, response: pathPageSchema,
    handler: async ({ params, query }) => library.listPaths(ds, params.projectId, query),
  })

  api.add({
    method: 'post', path: '/projects/:projectId/paths', tag: 'library',
    summary: 'Add a path (drawn on the canvas or typed) with its first revision',
    access: write('project'), params: projectParams, body: newPathSchema, status: 201, response: pathDetailSchema, errors: [413],
    handler: async ({ params, body, user }) => {
      const [created] = await library.createPaths(ds, params.projectId, user.id, 'drawn', [body], body.message)
      return library.getPathDetail(ds.manager, created.id)
    },
    activity: ({ result }) => ({ action: 'created', targetType: 'path', targetId: result.id, targetName: result.name, summary: `Added path ${quoted(result.name)}.` }),
  })

  api.add({
    method: 'post', path: '/projects/:projectId/paths/import', tag: 'library',
    summary: 'Import paths chosen from an SVG or font preview: all of them or none',
    access: write('project'), params: projectParams, body: importPathsSchema, status: 201, response: createdPathsSchema, errors: [413],
    handler: async ({ params, body, user }) => ({
      created: await library.createPaths(ds, params.projectId, user.id, body.origin, body.paths, body.message),
    }),
    activity: ({ body, result }) => ({
      action: 'imported', targetType: 'path', targetId: singleId(result.created.map((p) => p.id)), targetName: result.created.length === 1 ? result.created[0].name : countOf(result.created.length, 'path'),
      summary: `Imported ${countOf(result.created.length, 'path')} from ${body.origin === 'font' ? 'a font' : body.origin === 'svg' ? 'SVG' : 'a drawing'}.`,
    }),
  })

  api.add({
    method: 'post', path: '/projects/:projectId/imports/svg/preview', tag: 'library',
    summary: 'Parse SVG files into candidate paths (writes nothing)',
    description: `Up to ${UPLOAD_LIMITS.svgFiles} files of at most ${UPLOAD_LIMITS.svgBytes / 1048576} MB each. DOCTYPE and entity declarations and external references are refused; scripts and event attributes are ignored.`,
    access: write('project'), params: projectParams, status: 200, response: svgPreviewSchema, errors: [413],
    upload: { field: 'files', maxFiles: UPLOAD_LIMITS.svgFiles, maxBytes: UPLOAD_LIMITS.svgBytes, description: 'SVG files' },
    handler: async ({ req }) => previewSvgFiles((req.files as Express.Multer.File[] | undefined) ?? []),
    activity: { none: 'A preview: it reads the upload and stores nothing.' },
  })

  api.add({
    method: 'post', path: '/projects/:projectId/imports/font/preview', tag: 'library',
    summary: 'Read a font (TTF, OTF, WOFF, WOFF2) and the chosen glyphs as candidate paths (writes nothing)',
    access: write('project'), params: projectParams, body: fontPreviewFieldsSchema, response: fontPreviewSchema, errors: [413],
    upload: { field: 'file', maxFiles: 1, maxBytes: UPLOAD_LIMITS.fontBytes, description: 'One font file' },
    handler: async ({ req, body }) => previewFont((req.files as Express.Multer.File[] | undefined)?.[0], body),
    activity: { none: 'A preview: it reads the font and stores nothing.' },
  })

  api.add({
    method: 'post', path: '/projects/:projectId/paths/bulk', tag: 'library',
    summary: 'Tag, untag, trash or copy several paths at once',
    access: write('project'), params: projectParams, body: bulkActionSchema, response: z.object({ affected: z.number().int() }),
    handler: async ({ params, body, user }) => ({
      affected: await library.bulkAction(ds, params.projectId, user.id, body, async (target) => {
        const teamId = await projectTeamId(ds, target)
        const role = teamId === undefined ? undefined : await roleInTeam(ds, user.id, teamId)
        return role !== undefined && roleAllows(role, 'library.write')
      }),
    }),
    activity: ({ body, result }) => {
      const paths = countOf(result.affected, 'path')
      const tags = 'tags' in body ? body.tags.map(quoted).join(', ') : ''
      const bulk = {
        tag: { action: 'changed', summary: `Tagged ${paths} ${tags}.` },
        untag: { action: 'changed', summary: `Took the tags ${tags} off ${paths}.` },
        trash: { action: 'trashed', summary: `Moved ${paths} to the trash.` },
        copy: { action: 'created', summary: `Copied ${paths} to project #${'targetProjectId' in body ? body.targetProjectId : ''}.` },
      } as const
      return { ...bulk[body.action], targetType: 'path', targetId: singleId(body.ids), targetName: countOf(body.ids.length, 'path') }
    },
  })

  api.add({
    method: 'post', path: '/projects/:projectId/trash/empty', tag: 'library',
    summary: 'Delete every path in the trash for good (owner)',
    access: { permission: 'library.purge', scope: 'project' }, params: projectParams, response: z.object({ purged: z.number().int() }),
    handler: async ({ params }) => ({ purged: await library.emptyTrash(ds, params.projectId) }),
    activity: ({ result }) => ({ action: 'purged', targetType: 'path', targetId: null, targetName: countOf(result.purged, 'path'), summary: `Emptied the trash: ${countOf(result.purged, 'path')} deleted for good.` }),
  })

  api.add({
    method: 'get', path: '/projects/:projectId/export.svg', tag: 'library',
    summary: 'The chosen paths as one SVG file',
    access: read('project'), params: projectParams, query: idsQuery, produces: 'image/svg+xml',
    handler: async ({ params, query, res }) => {
      const svg = await library.exportSvg(ds, params.projectId, query.ids)
      res.type('image/svg+xml').attachment(attachmentName(`project-${params.projectId}-paths`, 'svg')).send(svg)
    },
  })

  api.add({
    method: 'get', path: '/projects/:projectId/bundle', tag: 'library',
    summary: 'The chosen paths with their whole history as a Rootcast bundle (JSON, versioned)',
    access: read('project'), params: projectParams, query: idsQuery, produces: 'application/json',
    handler: async ({ params, query, res }) => {
      const bundle = await library.exportBundle(ds, params.projectId, query.ids)
      res.type('application/json').attachment(attachmentName(`${bundle.project.name}.rootcast-bundle`, 'json')).send(JSON.stringify(bundle, null, 2))
    },
  })

  api.add({
    method: 'post', path: '/projects/:projectId/bundle', tag: 'library',
    summary: 'Import a Rootcast bundle into this project, with every revision',
    access: write('project'), params: projectParams, body: bundleSchema, status: 201, response: createdPathsSchema, errors: [413],
    handler: async ({ params, body, user }) => ({ created: await library.importBundle(ds, params.projectId, user.id, body) }),
    activity: ({ result }) => ({
      action: 'imported', targetType: 'path', targetId: singleId(result.created.map((p) => p.id)), targetName: countOf(result.created.length, 'path'),
      summary: `Imported a Rootcast bundle: ${countOf(result.created.length, 'path')} with their history.`,
    }),
  })

  api.add({
    method: 'get', path: '/paths/:pathId', tag: 'library', summary: 'One path with metadata, diagnostics and its current revision',
    access: read('path'), params: pathParams, response: pathDetailSchema,
    handler: async ({ params }) => library.getPathDetail(ds.manager, params.pathId),
  })

  api.add({
    method: 'patch', path: '/paths/:pathId', tag: 'library', summary: 'Rename a path, change its tags or fill rule',
    access: write('path'), params: pathParams, body: updatePathSchema, response: pathDetailSchema,
    handler: async ({ params, body }) => library.updatePath(ds, params.pathId, body),
    activity: ({ body, result, scoped }) => {
      const renamed = scoped && scoped.name !== result.name ? `Renamed path ${quoted(scoped.name)} to ${quoted(result.name)}` : ''
      const what = [body.tags !== undefined && 'tags', body.fillRule !== undefined && 'fill rule'].filter(Boolean).join(' and ')
      const summary = renamed ? `${renamed}${what ? ` and changed its ${what}` : ''}.` : `Changed the ${what || 'name'} of path ${quoted(result.name)}.`
      return { action: 'changed', targetType: 'path', targetId: result.id, targetName: result.name, summary }
    },
  })

  api.add({
    method: 'delete', path: '/paths/:pathId', tag: 'library', summary: `Move a path to the trash (kept for 30 days)`,
    access: write('path'), params: pathParams, status: 204, errors: [409],
    handler: async ({ params }) => library.trashPath(ds, params.pathId),
    activity: ({ params, scoped }) => ({ action: 'trashed', targetType: 'path', targetId: params.pathId, targetName: scopedName(scoped, params.pathId), summary: `Moved path ${quoted(scopedName(scoped, params.pathId))} to the trash.` }),
  })

  api.add({
    method: 'post', path: '/paths/:pathId/untrash', tag: 'library', summary: 'Restore a path from the trash',
    access: write('path'), params: pathParams, response: pathDetailSchema, errors: [409, 410],
    handler: async ({ params }) => library.untrashPath(ds, params.pathId),
    activity: ({ result }) => ({ action: 'restored', targetType: 'path', targetId: result.id, targetName: result.name, summary: `Restored path ${quoted(result.name)} from the trash.` }),
  })

  api.add({
    method: 'delete', path: '/paths/:pathId/purge', tag: 'library', summary: 'Delete a path in the trash for good (owner)',
    access: { permission: 'library.purge', scope: 'path' }, params: pathParams, status: 204, errors: [409],
    handler: async ({ params }) => library.purgePath(ds, params.pathId),
    activity: ({ params, scoped }) => ({ action: 'purged', targetType: 'path', targetId: params.pathId, targetName: scopedName(scoped, params.pathId), summary: `Deleted path ${quoted(scopedName(scoped, params.pathId))} for good.` }),
  })

  api.add({
    method: 'get', path: '/paths/:pathId/revisions', tag: 'library', summary: 'The history of a path, newest first',
    access: read('path'), params: pathParams, response: z.array(revisionSummarySchema),
    handler: async ({ params }) => library.listRevisions(ds, params.pathId),
  })

  api.add({
    method: 'post', path: '/paths/:pathId/revisions', tag: 'library', summary: 'Save new path data: adds a revision, never overwrites',
    access: write('path'), params: pathParams, body: newRevisionSchema, status: 201, response: pathDetailSchema, errors: [409, 413],
    handler: async ({ params, body, user }) => library.addRevision(ds, params.pathId, user.id, body.data, body.message),
    activity: ({ result }) => ({ action: 'created', targetType: 'revision', targetId: result.id, targetName: `${result.name} r${result.revision}`, summary: `Saved revision ${result.revision} of path ${quoted(result.name)}.` }),
  })

  api.add({
    method: 'get', path: '/paths/:pathId/revisions/:number', tag: 'library', summary: 'One revision with its data and diagnostics',
    access: read('path'), params: revisionParams, response: revisionDetailSchema,
    handler: async ({ params }) => library.getRevision(ds, params.pathId, params.number),
  })

  api.add({
    method: 'post', path: '/paths/:pathId/revisions/:number/restore', tag: 'library', summary: 'Restore a revision as a new revision',
    access: write('path'), params: revisionParams, body: restoreRevisionSchema, status: 201, response: pathDetailSchema, errors: [409],
    handler: async ({ params, body, user }) => library.restoreRevision(ds, params.pathId, params.number, user.id, body.message),
    activity: ({ params, result }) => ({
      action: 'restored', targetType: 'revision', targetId: result.id, targetName: `${result.name} r${result.revision}`,
      summary: `Restored revision ${params.number} of path ${quoted(result.name)} as revision ${result.revision}.`,
    }),
  })
}
