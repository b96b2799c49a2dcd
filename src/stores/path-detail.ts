import { defineStore } from 'pinia'
import { readonly, ref, shallowRef } from 'vue'
import type { PathDetail, PathListItem, RevisionDetail, RevisionSummary } from '../../shared/api'
import { getPath, getRevision, listRevisions, restoreRevision, updatePath } from '../api/library'
import { toApiRequestError, type ApiRequestError } from '../api/http'
import { useLibraryStore } from './library'

/**
 * The one path open in the detail drawer: its current state, its revision history and the
 * revisions fetched for a comparison (kept while the path stays open). Changes reload the
 * library page too, so the table shows the new name, tags or revision.
 */
export const usePathDetailStore = defineStore('path-detail', () => {
  const pathId = ref<number | null>(null)
  const detail = ref<PathDetail | null>(null)
  const isLoading = ref(false)
  const error = shallowRef<ApiRequestError | null>(null)
  const revisions = ref<RevisionSummary[]>([])
  const isLoadingRevisions = ref(false)
  const revisionsError = shallowRef<ApiRequestError | null>(null)
  /** Revisions with their data, by number, for the comparison. */
  const revisionData = ref<Record<number, RevisionDetail>>({})

  let latestOpen = 0

  async function loadDetail(id: number, ticket: number): Promise<void> {
    isLoading.value = true
    error.value = null
    try {
      const result = await getPath(id)
      if (ticket === latestOpen) detail.value = result
    } catch (cause) {
      if (ticket === latestOpen) error.value = toApiRequestError(cause)
    } finally {
      if (ticket === latestOpen) isLoading.value = false
    }
  }

  async function loadRevisions(id: number, ticket: number): Promise<void> {
    isLoadingRevisions.value = true
    revisionsError.value = null
    try {
      const result = await listRevisions(id)
      if (ticket === latestOpen) revisions.value = [...result].sort((a, b) => b.number - a.number)
    } catch (cause) {
      if (ticket === latestOpen) revisionsError.value = toApiRequestError(cause)
    } finally {
      if (ticket === latestOpen) isLoadingRevisions.value = false
    }
  }

  /** Opens a path (a row of the table): its detail and its history, side by side. */
  async function open(id: number): Promise<void> {
    const ticket = ++latestOpen
    if (pathId.value !== id) {
      detail.value = null
      revisions.value = []
      revisionData.value = {}
    }
    pathId.value = id
    await Promise.all([loadDetail(id, ticket), loadRevisions(id, ticket)])
  }

  function close(): void {
    latestOpen++
    pathId.value = null
    detail.value = null
    revisions.value = []
    revisionData.value = {}
    error.value = null
    revisionsError.value = null
    isLoading.value = false
    isLoadingRevisions.value = false
  }

  /** One revision with its data; asked once per open path, then kept. */
  async function loadRevision(number: number): Promise<RevisionDetail> {
    const id = pathId.value
    if (id === null) throw toApiRequestError(new Error('Open a path first.'))
    const known = revisionData.value[number]
    if (known) return known
    const result = await getRevision(id, number)
    if (pathId.value === id) revisionData.value = { ...revisionData.value, [number]: result }
    return result
  }

  /** The history and the table after a change; the detail itself comes with the change's answer. */
  async function reloadAfterChange(id: number): Promise<void> {
    await Promise.all([loadRevisions(id, latestOpen), useLibraryStore().load()])
  }

  /** Renames the open path, replaces its tags or changes its fill rule (editor). */
  async function update(patch: { name?: string; tags?: string[]; fillRule?: PathListItem['fillRule'] }): Promise<void> {
    const id = pathId.value
    if (id === null) throw toApiRequestError(new Error('Open a path first.'))
    const result = await updatePath(id, patch)
    if (pathId.value === id) detail.value = result
    await reloadAfterChange(id)
  }

  /** Adds a new revision copying revision `number` (editor): the history only grows. */
  async function restore(number: number): Promise<PathDetail> {
    const id = pathId.value
    if (id === null) throw toApiRequestError(new Error('Open a path first.'))
    const result = await restoreRevision(id, number)
    if (pathId.value === id) detail.value = result
    await reloadAfterChange(id)
    return result
  }

  return {
    pathId: readonly(pathId),
    detail: readonly(detail),
    isLoading: readonly(isLoading),
    error: readonly(error),
    revisions: readonly(revisions),
    isLoadingRevisions: readonly(isLoadingRevisions),
    revisionsError: readonly(revisionsError),
    revisionData: readonly(revisionData),
    open,
    close,
    loadRevision,
    update,
    restore,
  }
})
