import type { Role } from '../../shared/api/common'

/**
 * Who may do what: the one place where team roles are mapped to actions. Every API route
 * names one of these permissions (or is public); the route layer checks it.
 * Viewers read and run computations, editors also create and change work, owners also
 * manage the team and delete projects.
 */
export const permissions = {
  /** Any signed-in person; not tied to a team (e.g. the computation routes). */
  signedIn: ['owner', 'editor', 'viewer'],
  'team.read': ['owner', 'editor', 'viewer'],
  'team.manage': ['owner'],
  'project.read': ['owner', 'editor', 'viewer'],
  'project.create': ['owner', 'editor'],
  'project.update': ['owner', 'editor'],
  'project.delete': ['owner'],
  /** Browse and export the library. */
  'library.read': ['owner', 'editor', 'viewer'],
  /** Import, draw, change, tag, trash and restore paths. */
  'library.write': ['owner', 'editor'],
  /** Empty the trash for good. */
  'library.purge': ['owner'],
  /** Create, change and delete probe sets (reading them is library.read). */
  'probeSet.write': ['owner', 'editor'],
  /** Create, change and delete suites and their checks (reading them and watching a suite is library.read). */
  'suite.write': ['owner', 'editor'],
  /** Run a suite, from the screen or with an API token. */
  'suite.run': ['owner', 'editor'],
  /** Start and cancel audits (reading them and their reports is library.read). */
  'audit.run': ['owner', 'editor'],
} as const satisfies Record<string, readonly Role[]>

export type Permission = keyof typeof permissions

export function roleAllows(role: Role, permission: Permission): boolean {
  return (permissions[permission] as readonly Role[]).includes(role)
}
