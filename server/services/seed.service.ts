import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import type { DataSource, EntityManager } from 'typeorm'
import type { Role } from '../../shared/api/common'
import type { ProbeSetSweep } from '../../shared/api/probe-sets'
import { MembershipEntity } from '../entities/membership.entity'
import type { FillRule } from '../entities/path.entity'
import { ProjectEntity } from '../entities/project.entity'
import { RevisionEntity } from '../entities/revision.entity'
import { TeamEntity } from '../entities/team.entity'
import { UserEntity } from '../entities/user.entity'
import { hashPassword } from './auth.service'
import { importGlyphs } from './import/font-import'
import { createPathsIn, type PathInput } from './library.service'
import { insertProbeSetIn, type ProbeSetInput } from './probe-sets.service'
import { seedDemoSuites } from './demo-suites'

/** The invented demo studio; the three addresses are fixed by the computation API contract. */
export const DEMO_TEAM = 'Harbour Type Workshop'
export const DEMO_ACCOUNTS: ReadonlyArray<{ email: string; displayName: string; role: Role }> = [
  { email: 'owner@example.com', displayName: 'Morwenna Quay', role: 'owner' },
  { email: 'editor@example.com', displayName: 'Tobias Slipway', role: 'editor' },
  { email: 'viewer@example.com', displayName: 'Ines Lighthouse', role: 'viewer' },
]

/**
 * Wayfinding icons drawn for the demo on a 24-unit grid: lines, cubics, quadratics, arcs,
 * rounded rectangles and a self-crossing knot.
 */
export const DEMO_PATHS: ReadonlyArray<{ name: string; fillRule: FillRule; data: string; tags: string[] }> = [
  { name: 'Arrow east', fillRule: 'nonzero', data: 'M4 11H14V6L22 12L14 18V13H4Z', tags: ['arrow'] },
  { name: 'Arrow north-west', fillRule: 'nonzero', data: 'M5 5H14L11 8L19 16L16 19L8 11L5 14Z', tags: ['arrow'] },
  { name: 'U-turn arrow', fillRule: 'nonzero', data: 'M6 20V10A5 5 0 0 1 16 10V14H19L14.5 19L10 14H13V10A2 2 0 0 0 9 10V20Z', tags: ['arrow', 'arc'] },
  {
    name: 'Map pin',
    fillRule: 'evenodd',
    data: 'M12 2C8.13 2 5 5.13 5 9C5 14.25 12 22 12 22S19 14.25 19 9C19 5.13 15.87 2 12 2Z M12 6.5A2.5 2.5 0 1 1 12 11.5A2.5 2.5 0 1 1 12 6.5Z',
    tags: ['arc'],
  },
  { name: 'Lift sign', fillRule: 'nonzero', data: 'M5 3H19A2 2 0 0 1 21 5V19A2 2 0 0 1 19 21H5A2 2 0 0 1 3 19V5A2 2 0 0 1 5 3Z', tags: ['rounded rect', 'arc'] },
  { name: 'Lift arrows', fillRule: 'nonzero', data: 'M8 4L12 9H4Z M8 20L4 15H12Z M14 6H20V18H14Z', tags: ['arrow'] },
  { name: 'Stair', fillRule: 'nonzero', data: 'M3 20V16H8V12H13V8H18V4H21V20Z', tags: [] },
  { name: 'Ferry', fillRule: 'nonzero', data: 'M2 15H22L19.5 20Q12 21.5 4.5 20Z M6 14V10H17L19 14Z M9 9V6H13V9Z', tags: ['quadratic'] },
  { name: 'Wave line', fillRule: 'nonzero', data: 'M2 18Q4.5 16 7 18T12 18T17 18T22 18V21H2Z', tags: ['quadratic'] },
  { name: 'Info disc', fillRule: 'evenodd', data: 'M12 2A10 10 0 1 0 12 22A10 10 0 1 0 12 2Z M11 10H13V17H11Z M12 5.5A1.5 1.5 0 1 1 12 8.5A1.5 1.5 0 1 1 12 5.5Z', tags: ['arc'] },
  { name: 'Anchor', fillRule: 'nonzero', data: 'M11 3H13V7H16V9H13V18.9C15.8 18.5 18 16.5 18.5 14H16.5L19.5 11L22 14H20.5C20 18 16.5 21 12 21S4 18 3.5 14H2L4.5 11L7.5 14H5.5C6 16.5 8.2 18.5 11 18.9V9H8V7H11Z', tags: [] },
  { name: 'Crossing knot', fillRule: 'nonzero', data: 'M12 12C4 2 4 22 12 12C20 2 20 22 12 12Z', tags: ['self-intersecting'] },
]

/** Glyphs of Roboto Bold (Apache License 2.0, from the npm package @fontsource/roboto) for the glyph review. */
export const DEMO_GLYPH_TEXT = 'Rag&8'

function demoGlyphs(): PathInput[] {
  const file = createRequire(import.meta.url).resolve('@fontsource/roboto/files/roboto-latin-700-normal.woff2')
  const r = importGlyphs(readFileSync(file), { text: DEMO_GLYPH_TEXT }, 50)
  if (!r.ok) return []
  return r.glyphs.map((g) => ({
    name: g.name,
    data: g.data,
    fillRule: 'nonzero',
    tags: ['Roboto Bold'],
    units: 'font units',
    sourceFile: 'roboto-latin-700-normal.woff2',
    metadata: { family: r.font.family, unitsPerEm: r.font.unitsPerEm, ascender: r.font.ascender, descender: r.font.descender, advanceWidth: g.advanceWidth, codePoint: g.codePoint, glyphName: g.glyphName },
  }))
}

/** Sizes of the glyph review's rows, in pixels per em. */
const REVIEW_PPEM = 16
const CLOSE_LOOK_PPEM = 12
const CLOSE_LOOK_GLYPH = 'a'

/**
 * One horizontal sweep along the pixel-centre rows of a raster with `spacing` path units per
 * pixel, covering [minY, maxY]. With pixel edges on y = 0 (the baseline of a glyph, the top
 * edge of an icon's grid), centres sit at y = (j + 0.5)·spacing for whole j (common practice:
 * a rasterizer samples each pixel row at its centre). For a glyph stored with y flipped
 * (y_path = −y_font) these are the same rows, y_path = −(k + 0.5)·spacing with k = −j − 1.
 * Lines start at x = 0, so a hit's s is its x. Null when no centre lies in the range.
 */
function pixelCentreSweep(minY: number, maxY: number, spacing: number): ProbeSetSweep | null {
  const first = Math.ceil(minY / spacing - 0.5)
  const last = Math.floor(maxY / spacing - 0.5)
  return last < first ? null : { angle: 0, spacing, count: last - first + 1, origin: [0, (first + 0.5) * spacing] }
}

/**
 * The demo's probe sets, made on revision 1 of paths seeded just before. Wayfinding icons:
 * three rays on the map pin (evenodd) whose crossing counts decide inside or outside, and
 * the knot's pixel rows on the icons' 24-unit grid at 24 px. Glyphs: each glyph's rows at
 * 16 ppem, and 'a' again at 12 ppem.
 */
async function seedProbeSets(
  m: EntityManager,
  authorId: number,
  icons: { projectId: number; pathIds: number[] },
  glyphs: { projectId: number; pathIds: number[]; inputs: PathInput[] },
): Promise<void> {
  const iconId = (name: string) => icons.pathIds[DEMO_PATHS.findIndex((p) => p.name === name)]
  const sets: Array<{ projectId: number } & ProbeSetInput> = [
    {
      projectId: icons.projectId,
      name: 'Pin rays',
      // Crossings found by the closed-form engine when the set was written (odd = filled, evenodd):
      description: 'From the hole: 2 crossings, hole edge (14.5, 9) and the body at the join (19, 9). From the body: 3, up through the hole and the join at the top (12, 2). From outside: 2, across the taper at y = 20.',
      pathId: iconId('Map pin'),
      revision: 1,
      probes: [
        { type: 'ray', origin: [12, 9], direction: [1, 0] },
        { type: 'ray', origin: [12, 15], direction: [0, -1] },
        { type: 'ray', origin: [0, 20], direction: [1, 0] },
      ],
      sweeps: [],
    },
  ]
  const knotRows = pixelCentreSweep(...(await storedYRange(m, iconId('Crossing knot'))), 1)
  if (knotRows) {
    sets.push({
      projectId: icons.projectId,
      name: 'Knot scanlines',
      description: 'The pixel-centre rows of a 24 px rendering (one unit per pixel) across the knot.',
      pathId: iconId('Crossing knot'),
      revision: 1,
      probes: [],
      sweeps: [knotRows],
    })
  }
  for (let i = 0; i < glyphs.inputs.length; i++) {
    const meta = glyphs.inputs[i].metadata as { unitsPerEm: number; codePoint: number }
    const char = String.fromCodePoint(meta.codePoint)
    const range = await storedYRange(m, glyphs.pathIds[i])
    for (const ppem of char === CLOSE_LOOK_GLYPH ? [REVIEW_PPEM, CLOSE_LOOK_PPEM] : [REVIEW_PPEM]) {
      const rows = pixelCentreSweep(...range, meta.unitsPerEm / ppem)
      if (!rows) continue
      sets.push({
        projectId: glyphs.projectId,
        name: `${char} · rows at ${ppem} ppem`,
        description: `The rows a rasterizer samples at ${ppem} pixels per em: ${rows.count} pixel centres across the glyph's bounds.`,
        pathId: glyphs.pathIds[i],
        revision: 1,
        probes: [],
        sweeps: [rows],
      })
    }
  }
  for (const { projectId, ...input } of sets) await insertProbeSetIn(m, projectId, authorId, input)
}

/** The y range of the bounds stored with revision 1 of a path. */
async function storedYRange(m: EntityManager, pathId: number): Promise<[number, number]> {
  const r = await m.getRepository(RevisionEntity).findOneByOrFail({ pathId, number: 1 })
  return [Number(r.bboxMinY), Number(r.bboxMaxY)]
}

/**
 * Seeds the demo team when the database has no users at all. Returns false when there was
 * something already. Everything goes in one transaction: all of it or none.
 */
export async function seedDemo(ds: DataSource, password: string): Promise<boolean> {
  if ((await ds.getRepository(UserEntity).count()) > 0) return false
  const passwordHash = await hashPassword(password)
  const glyphPaths = demoGlyphs()
  await ds.transaction(async (m: EntityManager) => {
    const team = await m.getRepository(TeamEntity).save({ name: DEMO_TEAM })
    const ids: number[] = []
    for (const a of DEMO_ACCOUNTS) {
      const user = await m.getRepository(UserEntity).save({ email: a.email, displayName: a.displayName, passwordHash })
      await m.getRepository(MembershipEntity).save({ teamId: team.id, userId: user.id, role: a.role })
      ids.push(user.id)
    }
    const editorId = ids[1]
    const project = (name: string, description: string) => m.getRepository(ProjectEntity).save({ teamId: team.id, name, description, createdById: editorId })
    const icons = await project('Wayfinding icons', 'Signage icons for the harbour ferry terminal: arrows, a map pin, a lift, a stair, the ferry itself.')
    const iconIds = await createPathsIn(m, icons.id, editorId, 'drawn', DEMO_PATHS.map((p) => ({ ...p, units: 'px', sourceFile: null, metadata: null })), 'Drawn for the terminal signage')
    const glyphs = await project('Headline glyph review', 'Roboto Bold glyphs for the terminal headlines, swept at the rows a rasterizer samples.')
    const glyphIds = glyphPaths.length ? await createPathsIn(m, glyphs.id, editorId, 'font', glyphPaths, 'Imported from Roboto Bold') : []
    await seedProbeSets(m, editorId, { projectId: icons.id, pathIds: iconIds }, { projectId: glyphs.id, pathIds: glyphIds, inputs: glyphPaths })
    await seedDemoSuites(m, { watcherId: ids[0], iconsProjectId: icons.id, glyphsProjectId: glyphs.id, glyphSetSuffix: ` · rows at ${REVIEW_PPEM} ppem` })
  })
  return true
}
