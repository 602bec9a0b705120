import 'vue-router';

export {};

declare module 'vue-router' {
  interface RouteMeta {
    /** Only for signed-in readers; others are sent to sign-in with `?redirect=`. */
    requiresAuth?: boolean;
    /** Lowest role allowed (ranked member < moderator < admin). Implies requiresAuth. */
    role?: 'member' | 'moderator' | 'admin';
    /** Needs a verified e-mail address (drafting, replying, uploading). Implies requiresAuth. */
    verified?: boolean;
    /** Shown in the browser tab as "<title> · Loomwright". */
    title?: string;
  }
}
