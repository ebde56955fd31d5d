import { createRouter, createWebHistory, type RouteLocationNormalized, type RouteLocationRaw, type RouteRecordRaw } from 'vue-router'
import { Notify } from 'quasar'
import { useAuthStore } from '../features/auth/store'
import { useWorkspacesStore } from '../features/workspaces/store'

declare module 'vue-router' {
  interface RouteMeta {
    /** Only for signed-in people; others go to sign-in and come back afterwards. */
    requiresAuth?: boolean
    /** Sign-in style pages: a signed-in person is sent on to their workspace. */
    guestOnly?: boolean
    /** Shown in the browser tab before "· Sheetsmith". */
    title?: string
  }
}

const routes: RouteRecordRaw[] = [
  {
    path: '/',
    component: () => import('../layouts/AppShellLayout.vue'),
    meta: { requiresAuth: true },
    children: [
      {
        path: '',
        name: 'start',
        component: () => import('../features/workspaces/WorkspaceStartPage.vue'),
        meta: { title: 'Start' },
        beforeEnter: redirectToHomeWorkspace,
      },
      {
        path: 'w/:workspaceId',
        name: 'workspace-home',
        component: () => import('../features/workspaces/WorkspaceHomePage.vue'),
        meta: { title: 'Home' },
      },
      {
        path: 'w/:workspaceId/designs',
        children: [
          {
            path: '',
            name: 'designs',
            component: () => import('../features/designs/DesignLibraryPage.vue'),
            meta: { title: 'Designs' },
          },
          {
            path: ':designId',
            name: 'design-detail',
            component: () => import('../features/designs/DesignDetailPage.vue'),
            meta: { title: 'Design' },
          },
        ],
      },
      {
        // `?run=<id>` shows that run, so a layout can be shared by its address and survives a reload.
        path: 'w/:workspaceId/nest',
        name: 'nest-run',
        component: () => import('../features/nesting/NestRunPage.vue'),
        meta: { title: 'Nest run' },
      },
      {
        path: 'w/:workspaceId/stock',
        name: 'stock',
        component: () => import('../features/stock/StockPage.vue'),
        meta: { title: 'Stock' },
      },
      {
        path: 'w/:workspaceId/materials',
        children: [
          {
            path: '',
            name: 'materials',
            component: () => import('../features/materials/MaterialsPage.vue'),
            meta: { title: 'Materials' },
          },
          {
            path: ':materialId',
            name: 'material-detail',
            component: () => import('../features/materials/MaterialDetailPage.vue'),
            meta: { title: 'Material' },
          },
        ],
      },
      {
        path: 'w/:workspaceId/layouts',
        children: [
          {
            path: '',
            name: 'layouts',
            component: () => import('../features/layouts/LayoutListPage.vue'),
            meta: { title: 'Layouts' },
          },
          {
            path: ':layoutId',
            name: 'layout-editor',
            component: () => import('../features/layouts/LayoutEditorPage.vue'),
            meta: { title: 'Layout' },
          },
        ],
      },
      {
        path: 'w/:workspaceId/comparisons',
        children: [
          {
            path: '',
            name: 'comparisons',
            component: () => import('../features/comparisons/ComparisonListPage.vue'),
            meta: { title: 'Stock comparisons' },
          },
          {
            path: 'new',
            name: 'comparison-new',
            component: () => import('../features/comparisons/ComparisonNewPage.vue'),
            meta: { title: 'New stock comparison' },
          },
          {
            path: ':comparisonId',
            name: 'comparison-detail',
            component: () => import('../features/comparisons/ComparisonDetailPage.vue'),
            meta: { title: 'Stock comparison' },
          },
        ],
      },
      {
        path: 'w/:workspaceId/jobs',
        children: [
          {
            path: '',
            name: 'jobs',
            component: () => import('../features/jobs/JobsPage.vue'),
            meta: { title: 'Jobs' },
          },
          {
            path: ':jobId',
            name: 'job-detail',
            component: () => import('../features/jobs/JobDetailPage.vue'),
            meta: { title: 'Job' },
          },
        ],
      },
      {
        path: 'w/:workspaceId/cutters',
        children: [
          {
            path: '',
            name: 'cutters',
            component: () => import('../features/cutters/CuttersPage.vue'),
            meta: { title: 'Cutters' },
          },
          {
            path: ':cutterId',
            name: 'cutter-detail',
            component: () => import('../features/cutters/CutterDetailPage.vue'),
            meta: { title: 'Cutter' },
          },
        ],
      },
      {
        path: 'w/:workspaceId/cuts-not-through',
        name: 'cuts-not-through',
        component: () => import('../features/cutters/CutsNotThroughPage.vue'),
        meta: { title: 'Cuts not going through?' },
      },
      {
        path: 'w/:workspaceId/quotes',
        children: [
          {
            // `?job=<id>` opens the New quote dialog with that job picked (the job page's "Price this job").
            path: '',
            name: 'quotes',
            component: () => import('../features/quotes/QuotesPage.vue'),
            meta: { title: 'Quotes' },
          },
          {
            path: ':quoteId',
            name: 'quote-detail',
            component: () => import('../features/quotes/QuoteDetailPage.vue'),
            meta: { title: 'Quote' },
          },
        ],
      },
      {
        path: 'w/:workspaceId/pricing',
        name: 'pricing',
        component: () => import('../features/pricing/PricingPage.vue'),
        meta: { title: 'Pricing' },
      },
      {
        path: 'w/:workspaceId/members',
        name: 'members',
        component: () => import('../features/members/MembersPage.vue'),
        meta: { title: 'Members' },
      },
      {
        path: 'account',
        name: 'account',
        component: () => import('../features/account/AccountPage.vue'),
        meta: { title: 'Account' },
      },
      {
        // Public on purpose: reset and invite links must be reachable by people who can't sign in yet.
        path: 'outbox',
        name: 'outbox',
        component: () => import('../features/outbox/OutboxPage.vue'),
        meta: { title: 'Outbox', requiresAuth: false },
      },
    ],
  },
  {
    path: '/',
    component: () => import('../layouts/AuthLayout.vue'),
    children: [
      {
        path: 'signin',
        name: 'signin',
        component: () => import('../features/auth/SignInPage.vue'),
        meta: { title: 'Sign in', guestOnly: true },
      },
      {
        path: 'signup',
        name: 'signup',
        component: () => import('../features/auth/SignUpPage.vue'),
        meta: { title: 'Create an account', guestOnly: true },
      },
      {
        path: 'forgot-password',
        name: 'forgot-password',
        component: () => import('../features/auth/ForgotPasswordPage.vue'),
        meta: { title: 'Forgot password' },
      },
      {
        path: 'reset-password',
        name: 'reset-password',
        component: () => import('../features/auth/ResetPasswordPage.vue'),
        meta: { title: 'Choose a new password' },
      },
      {
        path: 'invite/:token',
        name: 'invite',
        component: () => import('../features/invites/InviteAcceptPage.vue'),
        meta: { title: 'Invitation' },
      },
    ],
  },
  {
    // The customer's quote by its unguessable link: outside the signed-in shell, no session needed or used.
    path: '/q/:token',
    component: () => import('../layouts/PublicPageLayout.vue'),
    children: [
      {
        path: '',
        name: 'quote-public',
        component: () => import('../features/quotes/QuotePublicPage.vue'),
        meta: { title: 'Quote' },
      },
    ],
  },
  {
    path: '/:pathMatch(.*)*',
    component: () => import('../layouts/AuthLayout.vue'),
    children: [
      {
        path: '',
        name: 'not-found',
        component: () => import('../features/not-found/NotFoundPage.vue'),
        meta: { title: 'Not found' },
      },
    ],
  },
]

/** Only paths inside this app: a crafted `?redirect=//elsewhere` must not send anyone away. */
export function safeRedirect(value: unknown): string | null {
  if (typeof value !== 'string') return null
  if (!value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) return null
  return value
}

/** Keeps the typed address in the bar while showing the 404 page. */
export function notFoundAt(to: RouteLocationNormalized): RouteLocationRaw {
  return {
    name: 'not-found',
    params: { pathMatch: to.path.slice(1).split('/') },
    query: to.query,
    hash: to.hash,
  }
}

async function redirectToHomeWorkspace(): Promise<RouteLocationRaw | true> {
  const workspaces = useWorkspacesStore()
  try {
    await workspaces.load()
  } catch {
    // The start page explains what went wrong and offers a retry.
    return true
  }
  const workspaceId = workspaces.homeWorkspaceId()
  return workspaceId ? { name: 'workspace-home', params: { workspaceId } } : true
}

export const router = createRouter({
  history: createWebHistory(import.meta.env.BASE_URL),
  routes,
  // A hash (the skip link) scrolls to its element; anything else starts at the top.
  scrollBehavior: (to, _from, saved) => saved ?? (to.hash ? { el: to.hash } : { top: 0 }),
})

router.beforeEach(async (to, from) => {
  const auth = useAuthStore()
  await auth.restore()

  if (to.meta.requiresAuth && !auth.isSignedIn) {
    return { name: 'signin', query: to.fullPath === '/' ? {} : { redirect: to.fullPath } }
  }
  if (to.meta.guestOnly && auth.isSignedIn) {
    return safeRedirect(to.query.redirect) ?? '/'
  }

  // The workspace switcher keeps the kind of page; a design belongs to one workspace, so land on the other's library.
  if (to.name === 'design-detail' && from.name === 'design-detail' && to.params.workspaceId !== from.params.workspaceId) {
    return { name: 'designs', params: { workspaceId: to.params.workspaceId } }
  }
  if (to.name === 'material-detail' && from.name === 'material-detail' && to.params.workspaceId !== from.params.workspaceId) {
    return { name: 'materials', params: { workspaceId: to.params.workspaceId } }
  }

  const workspaceId = to.params.workspaceId
  if (typeof workspaceId === 'string' && auth.isSignedIn) {
    const workspaces = useWorkspacesStore()
    try {
      await workspaces.load()
    } catch (error) {
      Notify.create({ type: 'negative', message: error instanceof Error ? error.message : 'Could not load your workspaces.' })
      return true
    }
    // Someone else's workspace looks exactly like one that does not exist.
    if (!workspaces.has(workspaceId)) return notFoundAt(to)
    workspaces.select(workspaceId)
  }
  return true
})

router.afterEach((to) => {
  document.title = to.meta.title ? `${to.meta.title} · Sheetsmith` : 'Sheetsmith'
})
