import { ref, shallowRef } from 'vue'
import { toApiRequestError, type ApiRequestError } from '../api/http'

/**
 * A list that a store loads whole from the server: the items, whether a load runs, and its
 * failure as an ApiRequestError (the items stay as they were when a load fails).
 */
export function useLoadedList<T>(fetchList: () => Promise<readonly T[]>) {
  const items = shallowRef<readonly T[]>([])
  const isLoading = ref(false)
  const error = shallowRef<ApiRequestError | null>(null)

  async function load(): Promise<void> {
    isLoading.value = true
    error.value = null
    try {
      items.value = await fetchList()
    } catch (cause) {
      error.value = toApiRequestError(cause)
    } finally {
      isLoading.value = false
    }
  }

  return { items, isLoading, error, load }
}
