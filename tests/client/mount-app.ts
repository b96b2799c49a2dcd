import { enableAutoUnmount, flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { afterEach } from 'vitest'
import { h, type Component } from 'vue'
import { VApp } from 'vuetify/components'
import { createMemoryHistory } from 'vue-router'
import { createAppVuetify } from '../../src/plugins/vuetify'
import { createAppRouter } from '../../src/router'

// Every test file that mounts through this helper unmounts its wrappers after each test.
enableAutoUnmount(afterEach)

/** Lets chained promises (validation, stubbed fetch, navigation) finish; bounded count. */
export async function settle(rounds = 10): Promise<void> {
  for (let i = 0; i < rounds; i++) await flushPromises()
}

/** A fresh Pinia, the real Vuetify plugin and the app's router on a memory history. */
export function createTestApp() {
  const pinia = createPinia()
  setActivePinia(pinia)
  const router = createAppRouter(createMemoryHistory())
  const vuetify = createAppVuetify()
  return { pinia, router, vuetify }
}

/** Navigates to `path` and mounts `component` there with the app's plugins. */
export async function mountAt(component: Component, path: string) {
  const app = createTestApp()
  await app.router.push(path)
  await app.router.isReady()
  const wrapper = mount(component, { global: { plugins: [app.pinia, app.router, app.vuetify] } })
  await settle()
  return { ...app, wrapper }
}

/**
 * As `mountAt`, inside a `<v-app>`: for views with layout parts of their own (navigation
 * drawers need the app layout, as they have under App.vue).
 */
export async function mountInAppAt(component: Component, path: string) {
  const app = createTestApp()
  await app.router.push(path)
  await app.router.isReady()
  const wrapper = mount({ render: () => h(VApp, null, { default: () => h(component) }) }, {
    global: { plugins: [app.pinia, app.router, app.vuetify] },
    attachTo: document.body,
  })
  await settle()
  return { ...app, wrapper }
}
