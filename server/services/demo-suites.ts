import type { EntityManager } from 'typeorm'
import { ProbeSetEntity } from '../entities/probe-set.entity'
import { SuiteWatcherEntity } from '../entities/suite-watcher.entity'
import { insertCheckIn, insertSuiteIn } from './suites.service'

/**
 * Point tolerance of the demo checks: a millionth of a path unit. Glyph coordinates are
 * whole font units below 2^12, where doubles are 2^-41 ≈ 5e-13 apart, so this leaves room
 * for millions of roundings, yet it is two million times finer than a 1/64 px step at
 * 16 ppem on a 2048-unit em (2 units). Icons sit on a 24-unit grid: finer still, relatively.
 */
export const DEMO_POINT_TOLERANCE = 1e-6
/**
 * t tolerance of the demo checks: on a segment a few thousand units long, an error of 1e-9
 * in t moves the point by a few millionths of a unit, about the point tolerance.
 */
export const DEMO_T_TOLERANCE = 1e-9

/**
 * The demo's suites, made from probe sets seeded just before in the same transaction:
 * "Glyph rows" with one check per glyph set whose name ends with `glyphSetSuffix` (the
 * 16 ppem rows) and "Icon rays" with the "Pin rays" set. Every check follows the latest
 * revision and matches kinds and winding. The watcher (the owner) watches both.
 */
export async function seedDemoSuites(
  m: EntityManager,
  opts: { watcherId: number; iconsProjectId: number; glyphsProjectId: number; glyphSetSuffix: string },
): Promise<void> {
  const sets = m.getRepository(ProbeSetEntity)
  const glyphSets = (await sets.find({ where: { projectId: opts.glyphsProjectId }, order: { id: 'ASC' } })).filter((s) => s.name.endsWith(opts.glyphSetSuffix))
  const pinRays = await sets.find({ where: { projectId: opts.iconsProjectId, name: 'Pin rays' } })
  const suites = [
    {
      projectId: opts.glyphsProjectId,
      name: 'Glyph rows',
      description: 'The rows a rasterizer samples at 16 ppem across each headline glyph: crossings, kinds and winding must stay put.',
      sets: glyphSets,
    },
    {
      projectId: opts.iconsProjectId,
      name: 'Icon rays',
      description: 'The map pin’s inside-or-outside rays: their crossing counts decide the evenodd fill.',
      sets: pinRays,
    },
  ]
  for (const suite of suites) {
    const suiteId = await insertSuiteIn(m, suite.projectId, { name: suite.name, description: suite.description })
    for (const set of suite.sets) {
      await insertCheckIn(m, suiteId, {
        name: set.name,
        pathId: set.pathId,
        revision: set.revision,
        probes: JSON.parse(set.probes),
        sweeps: JSON.parse(set.sweeps),
        follow: 'latest',
        tolerance: { point: DEMO_POINT_TOLERANCE, t: DEMO_T_TOLERANCE },
        matchKinds: true,
        matchWinding: true,
      })
    }
    await m.getRepository(SuiteWatcherEntity).insert({ suiteId, userId: opts.watcherId })
  }
}
