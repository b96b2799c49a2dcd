import { computed } from 'vue'
import { useTheme } from 'vuetify'
import { readStored, useStoredRef } from './useStoredRef'

export type ThemeName = 'light' | 'dark'

export const THEME_STORAGE_KEY = 'rootcast.theme'

function parseTheme(raw: string): ThemeName | undefined {
  return raw === 'light' || raw === 'dark' ? raw : undefined
}

/** The theme chosen earlier in this browser; light when none was chosen (light theme first). */
export function readThemePreference(): ThemeName {
  return readStored(THEME_STORAGE_KEY, parseTheme, 'light')
}

/** Light/dark switch that remembers the choice in this browser. */
export function useThemePreference() {
  const theme = useTheme()
  const stored = useStoredRef<ThemeName>(THEME_STORAGE_KEY, parseTheme, readThemePreference())
  const isDark = computed(() => theme.global.current.value.dark)

  function toggleTheme(): void {
    const next: ThemeName = isDark.value ? 'light' : 'dark'
    theme.change(next)
    stored.value = next
  }

  return { isDark, toggleTheme }
}
