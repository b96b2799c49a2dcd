import { defineStore } from 'pinia'
import { readonly, ref, shallowRef, type Ref } from 'vue'
import type { FontPreview, SvgPreview } from '../../shared/api'
import { previewFontFile, previewSvgFiles } from '../api/library'
import { toApiRequestError, type ApiRequestError } from '../api/http'

/** One preview request's answer, with a newer request replacing an older one still on its way. */
function createPreview<A extends unknown[], R>(fetch: (...args: A) => Promise<R>) {
  const result = ref(null) as Ref<R | null>
  const isLoading = ref(false)
  const error = shallowRef<ApiRequestError | null>(null)
  let latest = 0

  async function run(...args: A): Promise<void> {
    const ticket = ++latest
    result.value = null
    error.value = null
    isLoading.value = true
    try {
      const answer = await fetch(...args)
      if (ticket === latest) result.value = answer
    } catch (cause) {
      if (ticket === latest) error.value = toApiRequestError(cause)
    } finally {
      if (ticket === latest) isLoading.value = false
    }
  }

  function clear(): void {
    latest++
    result.value = null
    error.value = null
    isLoading.value = false
  }

  return { result: readonly(result), isLoading: readonly(isLoading), error: readonly(error), run, clear }
}

/**
 * What the server found in uploaded SVG and font files, before anything is stored. The
 * previews hold parsed path data only: the uploaded files themselves are never shown.
 */
export const useLibraryImportStore = defineStore('library-import', () => {
  const svg = createPreview<Parameters<typeof previewSvgFiles>, SvgPreview>(previewSvgFiles)
  const font = createPreview<Parameters<typeof previewFontFile>, FontPreview>(previewFontFile)

  return {
    svgPreview: svg.result,
    isPreviewingSvg: svg.isLoading,
    svgError: svg.error,
    fontPreview: font.result,
    isPreviewingFont: font.isLoading,
    fontError: font.error,
    previewSvg: svg.run,
    previewFont: font.run,
    clearSvg: svg.clear,
    clearFont: font.clear,
  }
})
