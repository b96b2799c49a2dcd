import { mdiBookshelf, mdiHistory, mdiPlaylistCheck, mdiScaleBalance, mdiVectorBezier } from '@mdi/js'

/** One tab of the project screen; `routeName` is its child route under /projects/:id. */
export interface ProjectTab {
  routeName: string
  path: string
  title: string
  icon: string
}

/** The project screen's tabs, in product.md's order: Library, Canvas, Suites, Audits, Activity. */
export const projectTabs: readonly ProjectTab[] = [
  { routeName: 'project-library', path: 'library', title: 'Library', icon: `svg:${mdiBookshelf}` },
  { routeName: 'project-canvas', path: 'canvas', title: 'Canvas', icon: `svg:${mdiVectorBezier}` },
  { routeName: 'project-suites', path: 'suites', title: 'Suites', icon: `svg:${mdiPlaylistCheck}` },
  { routeName: 'project-audits', path: 'audits', title: 'Audits', icon: `svg:${mdiScaleBalance}` },
  { routeName: 'project-activity', path: 'activity', title: 'Activity', icon: `svg:${mdiHistory}` },
]
