import { readonly, ref, shallowRef } from 'vue'
import { toApiRequestError, type ApiRequestError } from '../api/http'

/**
 * One action at a time (a dialog's confirm, a restore, a bulk action) with its failure kept
 * as an ApiRequestError for the page to show. `run` resolves to whether the work succeeded;
 * a second call while one runs is ignored and resolves to false.
 */
export function useBusyAction() {
  const isBusy = ref(false)
  const error = shallowRef<ApiRequestError | null>(null)

  async function run(work: () => Promise<void>): Promise<boolean> {
    if (isBusy.value) return false
    isBusy.value = true
    error.value = null
    try {
      await work()
      return true
    } catch (cause) {
      error.value = toApiRequestError(cause)
      return false
    } finally {
      isBusy.value = false
    }
  }

  function clearError(): void {
    error.value = null
  }

  return { isBusy: readonly(isBusy), error: readonly(error), run, clearError }
}
