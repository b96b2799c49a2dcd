import {
  createRouter,
  createWebHistory,
  type RouteComponent,
  type RouteLocationRaw,
  type RouterHistory,
} from 'vue-router'
import { useAuthStore } from '../stores/auth'
import { projectTabs } from './project-tabs'

declare module 'vue-router' {
  interface RouteMeta {
    /** Reachable without signing in. */
    public?: boolean
    /** Shown without the app bar and navigation drawer. */
    bare?: boolean
    /** Page title, before " · Rootcast". */
    title?: string
  }
}

const PRODUCT_NAME = 'Rootcast'

const tabViews: Record<string, () => Promise<RouteComponent>> = {
  'project-library': () => import('../views/LibraryView.vue'),
  'project-canvas': () => import('../views/CanvasView.vue'),
  'project-suites': () => import('../views/SuitesView.vue'),
  'project-audits': () => import('../views/AuditsView.vue'),
  'project-activity': () => import('../views/ActivityView.vue'),
}

/** A `redirect` query value that is safe to follow: a path inside this site only. */
export function safeRedirect(value: unknown): string | null {
  if (typeof value !== 'string' || !value.startsWith('/') || value.startsWith('//')) return null
  if (value.includes('\\')) return null
  return value
}

/** The app's router; tests pass a memory history. */
export function createAppRouter(history: RouterHistory = createWebHistory()) {
  const router = createRouter({
    history,
    routes: [
      { path: '/', redirect: { name: 'projects' } },
      {
        path: '/sign-in',
        name: 'sign-in',
        component: () => import('../views/SignInView.vue'),
        meta: { public: true, bare: true, title: 'Sign in' },
      },
      {
        path: '/forgot-password',
        name: 'forgot-password',
        component: () => import('../views/ForgotPasswordView.vue'),
        meta: { public: true, bare: true, title: 'Forgot password' },
      },
      {
        path: '/reset-password',
        name: 'reset-password',
        component: () => import('../views/ResetPasswordView.vue'),
        meta: { public: true, bare: true, title: 'Set a new password' },
      },
      {
        path: '/invitations/accept',
        name: 'accept-invitation',
        component: () => import('../views/AcceptInvitationView.vue'),
        meta: { public: true, bare: true, title: 'Accept an invitation' },
      },
      {
        path: '/projects',
        name: 'projects',
        component: () => import('../views/ProjectsView.vue'),
        meta: { title: 'Projects' },
      },
      {
        path: '/projects/:id(\\d+)',
        component: () => import('../views/ProjectView.vue'),
        children: [
          { path: '', name: 'project', redirect: (to) => ({ name: 'project-library', params: to.params }) },
          ...projectTabs.map((tab) => ({
            path: tab.path,
            name: tab.routeName,
            component: tabViews[tab.routeName],
            meta: { title: tab.title },
          })),
        ],
      },
      { path: '/team', name: 'team', component: () => import('../views/TeamView.vue'), meta: { title: 'Team' } },
      {
        path: '/account',
        name: 'account',
        component: () => import('../views/AccountView.vue'),
        meta: { title: 'Account' },
      },
      {
        path: '/dev/mail',
        name: 'dev-mail',
        component: () => import('../views/DevMailView.vue'),
        meta: { title: 'Mail (development)' },
      },
      {
        path: '/:pathMatch(.*)*',
        name: 'not-found',
        component: () => import('../views/NotFoundView.vue'),
        meta: { public: true, title: 'Page not found' },
      },
    ],
  })

  router.beforeEach(async (to): Promise<RouteLocationRaw | true> => {
    const auth = useAuthStore()
    if (!auth.hasCheckedSession) await auth.loadSession()
    if (to.name === 'sign-in' && auth.isSignedIn) return { name: 'projects' }
    if (!to.meta.public && !auth.isSignedIn) return { name: 'sign-in', query: { redirect: to.fullPath } }
    return true
  })

  router.afterEach((to) => {
    document.title = to.meta.title ? `${to.meta.title} · ${PRODUCT_NAME}` : PRODUCT_NAME
  })

  return router
}
