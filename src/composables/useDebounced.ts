import { onScopeDispose, readonly, ref, watch, type Ref } from 'vue'

/** A copy of `source` that follows it once it has stayed unchanged for `delayMs`. */
export function useDebounced<T>(source: Ref<T>, delayMs: number): Readonly<Ref<T>> {
  const debounced = ref(source.value) as Ref<T>
  let timer: ReturnType<typeof setTimeout> | undefined

  watch(source, (next) => {
    clearTimeout(timer)
    timer = setTimeout(() => {
      debounced.value = next
    }, delayMs)
  })
  onScopeDispose(() => clearTimeout(timer))

  return readonly(debounced) as Readonly<Ref<T>>
}
