import type { RouteLocationNormalized, RouteRecordRaw } from 'vue-router';

const MainLayout = () => import('@/layouts/MainLayout.vue');
const AuthLayout = () => import('@/layouts/AuthLayout.vue');

/** Passes one query value as a string prop (the first one if repeated). */
function queryProp(name: string) {
  return (route: RouteLocationNormalized) => {
    const raw = route.query[name];
    const value = Array.isArray(raw) ? raw[0] : raw;
    return { [name]: typeof value === 'string' ? value : '' };
  };
}

/**
 * Every route of the client. Add new pages as children of a layout, in their group;
 * the nav in MainLayout shows an entry once a route with its name exists
 * (`connectors`, `adapters`, `writeups`, `review-queue`).
 */
export const routes: RouteRecordRaw[] = [
  {
    path: '/',
    component: MainLayout,
    children: [
      // ── Look up ──────────────────────────────────────────────
      {
        path: '',
        name: 'home',
        component: () => import('@/pages/HomePage.vue'),
        meta: { title: 'Look up a connector' },
      },
      {
        path: 'search',
        name: 'search',
        component: () => import('@/pages/SearchPage.vue'),
        meta: { title: 'Search' },
      },
      // The nav's per-kind entries are searches narrowed to that kind.
      {
        path: 'connectors',
        name: 'connectors',
        redirect: { name: 'search', query: { kind: 'connector' } },
      },
      {
        path: 'adapters',
        name: 'adapters',
        redirect: { name: 'search', query: { kind: 'adapter' } },
      },
      {
        path: 'browse',
        name: 'browse',
        component: () => import('@/pages/BrowsePage.vue'),
        meta: { title: 'Browse by component and cavity count' },
      },

      // ── Documents: connector sheets, adapter sheets, write-ups ─
      // One editor page for every kind (it picks the kind's editor); `/…/new` and
      // `/documents/:id/edit` share it so the page stays mounted when a new draft is created.
      {
        path: 'connectors/new',
        name: 'connector-new',
        component: () => import('@/pages/documents/DocumentEditPage.vue'),
        props: { kind: 'connector' },
        meta: { verified: true, title: 'New connector sheet' },
      },
      {
        path: 'writeups/new',
        name: 'writeups-new',
        component: () => import('@/pages/documents/DocumentEditPage.vue'),
        props: { kind: 'writeup' },
        meta: { verified: true, title: 'New write-up' },
      },
      {
        path: 'writeups',
        name: 'writeups',
        component: () => import('@/pages/writeups/WriteupsPage.vue'),
        meta: { title: 'Write-ups' },
      },
      {
        path: 'adapters/new',
        name: 'adapter-new',
        component: () => import('@/pages/documents/DocumentEditPage.vue'),
        props: { kind: 'adapter' },
        meta: { verified: true, title: 'New adapter sheet' },
      },
      {
        path: 'documents/:id(\\d+)/edit',
        name: 'document-edit',
        component: () => import('@/pages/documents/DocumentEditPage.vue'),
        props: (route) => ({ id: String(route.params.id) }),
        meta: { verified: true, title: 'Edit document' },
      },
      {
        path: 'documents/:slug/build-sheet',
        name: 'build-sheet',
        component: () => import('@/pages/adapters/BuildSheetPage.vue'),
        props: true,
        meta: { title: 'Build sheet' },
      },
      {
        path: 'documents/:slug',
        name: 'document',
        component: () => import('@/pages/documents/DocumentPage.vue'),
        props: true,
        meta: { title: 'Document' },
      },
      {
        path: 'me/documents',
        name: 'my-documents',
        component: () => import('@/pages/documents/MyDocumentsPage.vue'),
        meta: { requiresAuth: true, title: 'My documents' },
      },

      // ── Review (moderator+) ──────────────────────────────────
      {
        path: 'review',
        name: 'review-queue',
        component: () => import('@/pages/review/ReviewQueuePage.vue'),
        meta: { role: 'moderator', title: 'Review queue' },
      },
      {
        path: 'review/:revisionId(\\d+)',
        name: 'review',
        component: () => import('@/pages/review/ReviewPage.vue'),
        props: true,
        meta: { role: 'moderator', title: 'Review' },
      },
      {
        path: 'review/flags',
        name: 'review-flags',
        component: () => import('@/pages/review/FlagQueuePage.vue'),
        meta: { role: 'moderator', title: 'Flags' },
      },

      // ── Account ──────────────────────────────────────────────
      {
        path: 'account',
        name: 'account',
        component: () => import('@/pages/AccountPage.vue'),
        meta: { requiresAuth: true, title: 'Your account' },
      },
      {
        path: 'account/notifications',
        name: 'account-notifications',
        component: () => import('@/pages/account/NotificationSettingsPage.vue'),
        meta: { requiresAuth: true, title: 'Notifications' },
      },
      {
        path: 'unsubscribe',
        name: 'unsubscribe',
        component: () => import('@/pages/UnsubscribePage.vue'),
        props: queryProp('token'),
        meta: { title: 'Unsubscribe' },
      },
      {
        path: 'verify-email',
        name: 'verify-email',
        component: () => import('@/pages/VerifyEmailPage.vue'),
        props: queryProp('token'),
        meta: { title: 'Verify your e-mail' },
      },

      // ── Admin ────────────────────────────────────────────────
      {
        path: 'admin',
        meta: { requiresAuth: true, role: 'admin' },
        children: [
          { path: '', name: 'admin', redirect: { name: 'admin-members' } },
          {
            path: 'members',
            name: 'admin-members',
            component: () => import('@/pages/admin/AdminMembersPage.vue'),
            meta: { title: 'Members and roles' },
          },
          {
            path: 'audit',
            name: 'admin-audit',
            component: () => import('@/pages/admin/AdminAuditPage.vue'),
            meta: { title: 'Audit log' },
          },
          {
            path: 'mail',
            name: 'admin-mail',
            component: () => import('@/pages/admin/AdminMailPage.vue'),
            meta: { title: 'Outgoing mail' },
          },
        ],
      },

      // ── Development only (the page checks /api/meta) ─────────
      {
        path: 'dev/mail',
        name: 'dev-mailbox',
        component: () => import('@/pages/dev/MailboxPage.vue'),
        meta: { title: 'Development mailbox' },
      },

      // ── Notices ──────────────────────────────────────────────
      {
        path: 'not-allowed',
        name: 'not-allowed',
        component: () => import('@/pages/NotAllowedPage.vue'),
        props: (route) => ({
          need: typeof route.query.need === 'string' ? route.query.need : '',
          from: typeof route.query.from === 'string' ? route.query.from : '',
        }),
        meta: { title: 'Not allowed' },
      },
    ],
  },

  // ── Signing in and out (a plain layout) ──────────────────────
  {
    path: '/',
    component: AuthLayout,
    children: [
      {
        path: 'sign-in',
        name: 'sign-in',
        component: () => import('@/pages/SignInPage.vue'),
        props: queryProp('redirect'),
        meta: { title: 'Sign in' },
      },
      {
        path: 'register',
        name: 'register',
        component: () => import('@/pages/RegisterPage.vue'),
        meta: { title: 'Create an account' },
      },
      {
        path: 'forgot-password',
        name: 'forgot-password',
        component: () => import('@/pages/ForgotPasswordPage.vue'),
        meta: { title: 'Forgotten password' },
      },
      {
        path: 'reset-password',
        name: 'reset-password',
        component: () => import('@/pages/ResetPasswordPage.vue'),
        props: queryProp('token'),
        meta: { title: 'Choose a new password' },
      },
    ],
  },

  // ── Keep last: anything unknown ──────────────────────────────
  {
    path: '/:pathMatch(.*)*',
    component: MainLayout,
    children: [
      {
        path: '',
        name: 'not-found',
        component: () => import('@/pages/NotFoundPage.vue'),
        meta: { title: 'Page not found' },
      },
    ],
  },
];
