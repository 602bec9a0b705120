import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import * as authApi from '@/api/auth';
import type { RegisterInput, Role, User } from '@/api/types';

const RANK: Record<Role, number> = { member: 1, moderator: 2, admin: 3 };

export const useAuthStore = defineStore('auth', () => {
  const user = ref<User | null>(null);
  /** True once we have asked the server who is signed in (whatever it said). */
  const loaded = ref(false);
  let pending: Promise<User | null> | null = null;

  const isSignedIn = computed(() => user.value !== null);
  const isVerified = computed(() => user.value?.emailVerified === true);
  const isModerator = computed(() => hasRole('moderator'));
  const isAdmin = computed(() => hasRole('admin'));

  /** Roles are ranked: an admin may do what a moderator may, and so on. */
  function hasRole(role: Role): boolean {
    return user.value !== null && RANK[user.value.role] >= RANK[role];
  }

  /**
   * Ask the server who is signed in. Concurrent callers share one request;
   * `force` asks again (e.g. after verifying the e-mail).
   */
  function load(force = false): Promise<User | null> {
    if (loaded.value && !force) return Promise.resolve(user.value);
    if (!pending) {
      pending = authApi
        .fetchCurrentUser()
        .catch(() => null) // the site stays readable when the API is down
        .then((found) => {
          user.value = found;
          loaded.value = true;
          return found;
        })
        .finally(() => {
          pending = null;
        });
    }
    return pending;
  }

  async function signIn(email: string, password: string): Promise<User> {
    // The page shows sign-in errors beside the form.
    const signedIn = await authApi.login(email, password, { quiet: true });
    user.value = signedIn;
    loaded.value = true;
    return signedIn;
  }

  async function signOut(): Promise<void> {
    try {
      await authApi.logout({ quiet: true });
    } finally {
      user.value = null;
      loaded.value = true;
    }
  }

  function register(input: RegisterInput): Promise<User> {
    return authApi.register(input, { quiet: true });
  }

  async function updateDisplayName(displayName: string): Promise<User> {
    const updated = await authApi.updateProfile({ displayName }, { quiet: true });
    user.value = updated;
    return updated;
  }

  async function changePassword(currentPassword: string, newPassword: string): Promise<User> {
    const updated = await authApi.changePassword(currentPassword, newPassword, { quiet: true });
    user.value = updated;
    return updated;
  }

  /** The session ended on the server (a 401 elsewhere). */
  function forget(): void {
    user.value = null;
    loaded.value = true;
  }

  return {
    user,
    loaded,
    isSignedIn,
    isVerified,
    isModerator,
    isAdmin,
    hasRole,
    load,
    signIn,
    signOut,
    register,
    updateDisplayName,
    changePassword,
    forget,
  };
});
