import { defineStore } from 'pinia'
import { readonly, ref, shallowRef } from 'vue'
import type { PathSummary } from '../../shared/api'
import { listProjectPaths } from '../api/projects'
import { toApiRequestError, type ApiRequestError } from '../api/http'

/** The paths of the open project's library. */
export const useLibraryStore = defineStore('library', () => {
  const projectId = ref<number | null>(null)
  const paths = ref<PathSummary[]>([])
  const isLoading = ref(false)
  const error = shallowRef<ApiRequestError | null>(null)
  let latestRequest = 0

  async function load(id: number): Promise<void> {
    const ticket = ++latestRequest
    if (projectId.value !== id) paths.value = []
    projectId.value = id
    isLoading.value = true
    error.value = null
    try {
      const result = await listProjectPaths(id)
      if (ticket === latestRequest) paths.value = result
    } catch (cause) {
      if (ticket === latestRequest) error.value = toApiRequestError(cause)
    } finally {
      if (ticket === latestRequest) isLoading.value = false
    }
  }

  return {
    projectId: readonly(projectId),
    paths: readonly(paths),
    isLoading: readonly(isLoading),
    error: readonly(error),
    load,
  }
})
