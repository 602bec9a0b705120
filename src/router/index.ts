import {
  createRouter,
  createWebHistory,
  type RouteLocationNormalized,
  type RouteLocationRaw,
  type Router,
  type RouterHistory,
} from 'vue-router';
import { useAuthStore } from '@/stores/auth';
import { routes } from './routes';

/**
 * The access decision for one navigation, kept apart from the router so it can be
 * tested: `true` lets the reader through, a location sends them elsewhere.
 */
export async function accessGuard(to: RouteLocationNormalized): Promise<true | RouteLocationRaw> {
  const auth = useAuthStore();
  await auth.load(); // once per visit; later calls answer from the store
  const { requiresAuth, role, verified } = to.meta;

  if ((requiresAuth || role || verified) && !auth.isSignedIn) {
    return { name: 'sign-in', query: { redirect: to.fullPath } };
  }
  if (role && !auth.hasRole(role)) {
    return { name: 'not-allowed', query: { need: role, from: to.fullPath } };
  }
  if (verified && !auth.isVerified) {
    return { name: 'not-allowed', query: { need: 'verified', from: to.fullPath } };
  }
  return true;
}

export function setTitle(to: RouteLocationNormalized): void {
  if (typeof document === 'undefined') return;
  document.title = to.meta.title ? `${to.meta.title} · Loomwright` : 'Loomwright';
}

export function createAppRouter(history: RouterHistory = createWebHistory()): Router {
  const router = createRouter({
    history,
    routes,
    scrollBehavior: (_to, _from, saved) => saved ?? { top: 0 },
  });
  router.beforeEach(accessGuard);
  router.afterEach((to) => setTitle(to));
  return router;
}

/**
 * Only send readers to same-site paths after sign-in; `//host` or `https://…`
 * in `?redirect=` would otherwise make us an open redirect.
 */
export function safeRedirect(target: unknown, fallback = '/'): string {
  if (typeof target !== 'string' || !target.startsWith('/') || target.startsWith('//')) {
    return fallback;
  }
  if (target.startsWith('/\\')) return fallback;
  return target;
}
