import type { ActivityTargetType } from '../../shared/api/activity'
import type { ActivityDraft } from './api-route'

/** Wording helpers for the one-sentence summaries of activity entries, and the common drafts. */

/** `1 path`, `3 paths`. */
export function countOf(n: number, noun: string, plural = `${noun}s`): string {
  return `${n} ${n === 1 ? noun : plural}`
}

/** A name in typographic quotes. */
export function quoted(name: string): string {
  return `“${name}”`
}

/** The target of a write over several ids: the one id when there is one, else none. */
export function singleId(ids: readonly number[]): number | null {
  return ids.length === 1 ? ids[0] : null
}

/** The name read before the write, or `#id` when the row was already gone. */
export function scopedName(scoped: { name: string } | undefined, id: number): string {
  return scoped?.name ?? `#${id}`
}

interface Named {
  readonly id: number
  readonly name: string
}

/** `Created suite “Rows”.` */
export function createdDraft(targetType: ActivityTargetType, noun: string, made: Named): ActivityDraft {
  return { action: 'created', targetType, targetId: made.id, targetName: made.name, summary: `Created ${noun} ${quoted(made.name)}.` }
}

/** `Renamed suite “A” to “B”.` when the name changed, else `Changed suite “B”.` */
export function changedDraft(targetType: ActivityTargetType, noun: string, after: Named, before: { name: string } | undefined): ActivityDraft {
  const summary = before && before.name !== after.name ? `Renamed ${noun} ${quoted(before.name)} to ${quoted(after.name)}.` : `Changed ${noun} ${quoted(after.name)}.`
  return { action: 'changed', targetType, targetId: after.id, targetName: after.name, summary }
}

/** `Deleted suite “Rows”.`, naming what the scope lookup read before the delete. */
export function deletedDraft(targetType: ActivityTargetType, noun: string, id: number, before: { name: string } | undefined, tail = ''): ActivityDraft {
  const name = scopedName(before, id)
  return { action: 'deleted', targetType, targetId: id, targetName: name, summary: `Deleted ${noun} ${quoted(name)}${tail}.` }
}
