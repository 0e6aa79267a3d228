// Named routes. Only sign-in is in the first bundle; every other screen loads lazily.
import { createRouter, createWebHistory, type RouteRecordRaw } from 'vue-router';
import SignInView from '@/views/SignInView.vue';
import { useSessionStore } from '@/stores/session';
import type { Role } from '@shared/domain';

declare module 'vue-router' {
  interface RouteMeta {
    public?: boolean;
    roles?: Role[];
    title?: string;
  }
}

/** Screens inside one build; later features add theirs here. */
export const buildRoutes: RouteRecordRaw[] = [
  // Owner and producer land on the build's numbers; everyone else on the backlog. A guard, not a
  // redirect, because only guards run after the session is known (beforeEach below loads it).
  {
    path: '',
    name: 'build-home',
    component: () => import('@/views/BacklogView.vue'),
    beforeEnter: (to) => ({
      name: useSessionStore().can('producer') ? 'overview' : 'backlog',
      params: to.params,
      replace: true,
    }),
  },
  {
    path: 'overview',
    name: 'overview',
    component: () => import('@/views/OverviewView.vue'),
    meta: { roles: ['producer'], title: 'Overview' },
  },
  {
    path: 'report',
    name: 'build-report',
    component: () => import('@/views/BuildReportView.vue'),
    meta: { roles: ['producer'], title: 'Build report' },
  },
  { path: 'backlog', name: 'backlog', component: () => import('@/views/BacklogView.vue'), meta: { title: 'Backlog' } },
  { path: 'parts', name: 'parts', component: () => import('@/views/PartsView.vue'), meta: { title: 'Parts' } },
  { path: 'media', name: 'media', component: () => import('@/views/MediaLibraryView.vue'), meta: { title: 'Media' } },
  {
    path: 'planner',
    name: 'planner',
    component: () => import('@/views/PlannerView.vue'),
    meta: { roles: ['producer'], title: 'Episode planner' },
  },
  {
    path: 'shop-floor',
    name: 'shop-floor',
    component: () => import('@/views/ShopFloorView.vue'),
    meta: { roles: ['installer', 'producer'], title: 'Shop floor' },
  },
  {
    path: 'publish',
    name: 'publish',
    component: () => import('@/views/PublishView.vue'),
    meta: { roles: ['marketing', 'producer'], title: 'Publish' },
  },
  {
    path: 'sales',
    name: 'sales',
    component: () => import('@/views/SalesView.vue'),
    meta: { roles: ['marketing', 'producer'], title: 'Sales' },
  },
  {
    path: 'viewer-requests',
    name: 'viewer-requests',
    component: () => import('@/views/ViewerRequestsView.vue'),
    meta: { roles: ['marketing', 'producer'], title: 'Viewer requests' },
  },
  {
    path: 'settings',
    name: 'build-settings',
    component: () => import('@/views/BuildSettingsView.vue'),
    meta: { roles: ['producer'], title: 'Build settings' },
  },
];

const routes: RouteRecordRaw[] = [
  { path: '/sign-in', name: 'sign-in', component: SignInView, meta: { public: true, title: 'Sign in' } },
  {
    path: '/',
    component: () => import('@/components/AppLayout.vue'),
    children: [
      { path: '', redirect: { name: 'builds' } },
      { path: 'builds', name: 'builds', component: () => import('@/views/BuildsView.vue'), meta: { title: 'Builds' } },
      {
        path: 'users',
        name: 'users',
        component: () => import('@/views/UsersView.vue'),
        meta: { roles: ['owner'], title: 'Users & roles' },
      },
      {
        path: 'account',
        name: 'account',
        component: () => import('@/views/AccountView.vue'),
        meta: { title: 'My account' },
      },
      { path: 'builds/:buildId(\\d+)', children: buildRoutes },
    ],
  },
  // The public build page and the links in viewers' mails: no sign-in, their own simple layout.
  {
    path: '/b/:slug',
    name: 'public-build',
    component: () => import('@/views/PublicBuildView.vue'),
    meta: { public: true, title: 'Build page' },
  },
  {
    path: '/confirm/:token',
    name: 'confirm-vote',
    component: () => import('@/views/PublicBuildView.vue'),
    meta: { public: true, title: 'Confirm your vote' },
  },
  {
    path: '/welcome/:token',
    name: 'welcome',
    component: () => import('@/views/WelcomeView.vue'),
    meta: { public: true, title: 'Welcome' },
  },
  {
    path: '/unsubscribe/:token',
    name: 'unsubscribe',
    component: () => import('@/views/PublicBuildView.vue'),
    meta: { public: true, title: 'Unsubscribe' },
  },
  {
    path: '/:pathMatch(.*)*',
    name: 'not-found',
    component: () => import('@/views/NotFoundView.vue'),
    meta: { public: true, title: 'Not found' },
  },
];

export const router = createRouter({ history: createWebHistory(), routes });

router.beforeEach(async (to, from) => {
  const session = useSessionStore();
  if (to.meta.public) return true;
  if (!session.checked) await session.refresh();
  if (!session.user) return { name: 'sign-in', query: to.fullPath !== '/' ? { next: to.fullPath } : {} };
  if (to.meta.roles && !session.can(...to.meta.roles)) return { name: 'builds' };
  if (
    to.name === 'builds' &&
    (from.name === 'sign-in' || !from.matched.length) &&
    isInstallerOnly(session.user.roles)
  ) {
    const id = await currentBuildId();
    if (id) return { name: 'shop-floor', params: { buildId: id }, replace: true };
  }
  return true;
});

/** Installers land on the shop floor of their current build (the last one they opened, else the first). */
const isInstallerOnly = (roles: readonly Role[]) =>
  roles.includes('installer') && !roles.some((r) => r !== 'installer');
const LAST_BUILD = 'bayslate.lastBuild';
async function currentBuildId(): Promise<string | null> {
  try {
    const { buildsApi } = await import('@/api/builds');
    const { builds } = await buildsApi.list();
    const last = localStorage.getItem(LAST_BUILD);
    return String(builds.find((b) => String(b.id) === last)?.id ?? builds[0]?.id ?? '') || null;
  } catch {
    // Offline: the build opened last (its shop floor works from what the phone kept).
    return localStorage.getItem(LAST_BUILD);
  }
}
router.afterEach((to) => {
  if (to.params.buildId) localStorage.setItem(LAST_BUILD, String(to.params.buildId));
});

router.afterEach((to) => {
  document.title = to.meta.title ? `${to.meta.title} · Bayslate` : 'Bayslate';
});
