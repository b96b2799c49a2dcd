import { createPinia } from 'pinia'
import { createApp } from 'vue'
import App from './App.vue'
import { setUnauthenticatedHandler } from './api/http'
import { createAppVuetify } from './plugins/vuetify'
import { createAppRouter } from './router'
import { useAuthStore } from './stores/auth'

const app = createApp(App)
const pinia = createPinia()
const router = createAppRouter()
app.use(pinia).use(router).use(createAppVuetify())

// A session that ends while a page is open (expired, signed out elsewhere): back to sign-in.
setUnauthenticatedHandler(() => {
  useAuthStore(pinia).clearSession()
  const here = router.currentRoute.value
  if (!here.meta.public) void router.replace({ name: 'sign-in', query: { redirect: here.fullPath } })
})

void router.isReady().then(() => app.mount('#app'))
