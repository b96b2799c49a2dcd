import '@fontsource/roboto/400.css'
import '@fontsource/roboto/500.css'
import '@fontsource/roboto/700.css'
import '@fontsource/roboto-mono/400.css'
import 'vuetify/styles'
import { createVuetify, type ThemeDefinition } from 'vuetify'
import { aliases, mdi } from 'vuetify/iconsets/mdi-svg'
import { readThemePreference } from '../composables/useThemePreference'

// Surfaces use the slate scale and the accent the teal scale of Tailwind CSS's published
// default palette (tailwindcss.com/docs/colors); Rootcast's visual language asks for neutral
// slate surfaces and one deep teal accent for actions. Status colours are muted so that the
// accent stays the only strong colour. `path-ink` and `probe` are the canvas colours of the
// product's visual language, kept here so that every screen draws with the same ones.
const light: ThemeDefinition = {
  dark: false,
  colors: {
    background: '#F8FAFC',
    surface: '#FFFFFF',
    'surface-bright': '#FFFFFF',
    'surface-light': '#F1F5F9',
    'surface-variant': '#334155',
    'on-surface-variant': '#F1F5F9',
    'on-background': '#0F172A',
    'on-surface': '#0F172A',
    primary: '#0F766E',
    'on-primary': '#FFFFFF',
    secondary: '#475569',
    'on-secondary': '#FFFFFF',
    error: '#B91C1C',
    warning: '#B45309',
    info: '#334155',
    success: '#15803D',
    'path-ink': '#1E293B',
    probe: '#E0603F',
  },
}

const dark: ThemeDefinition = {
  dark: true,
  colors: {
    background: '#0F172A',
    surface: '#1E293B',
    'surface-bright': '#334155',
    'surface-light': '#273449',
    'surface-variant': '#CBD5E1',
    'on-surface-variant': '#0F172A',
    'on-background': '#E2E8F0',
    'on-surface': '#E2E8F0',
    primary: '#2DD4BF',
    'on-primary': '#042F2E',
    secondary: '#94A3B8',
    'on-secondary': '#0F172A',
    error: '#F87171',
    warning: '#FBBF24',
    info: '#CBD5E1',
    success: '#4ADE80',
    'path-ink': '#CBD5E1',
    probe: '#FB8A6E',
  },
}

/** A fresh Vuetify instance with Rootcast's themes, icons (SVG paths from @mdi/js) and defaults. */
export function createAppVuetify() {
  return createVuetify({
    theme: { defaultTheme: readThemePreference(), themes: { light, dark } },
    icons: { defaultSet: 'mdi', aliases, sets: { mdi } },
    defaults: {
      VTextField: { variant: 'outlined', density: 'comfortable', color: 'primary' },
      VTextarea: { variant: 'outlined', density: 'comfortable', color: 'primary' },
      VSelect: { variant: 'outlined', density: 'comfortable', color: 'primary' },
      VBtn: { rounded: 'md' },
      VCard: { rounded: 'lg' },
      VDataTableServer: { hover: true },
      VDataTable: { hover: true },
    },
  })
}
