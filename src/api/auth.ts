import { api, isApiError, resetCsrfToken, setCsrfToken, type RequestOptions } from './client';
import type { RegisterInput, User } from './types';

interface UserBody {
  user: User;
}

/** Sign-in and password change regenerate the session, and so its CSRF token. */
interface SessionBody extends UserBody {
  csrfToken?: string;
}

function adoptToken(body: SessionBody | undefined) {
  resetCsrfToken();
  setCsrfToken(body?.csrfToken);
}

/** The signed-in user, or null when nobody is (a 401 here is an ordinary answer). */
export async function fetchCurrentUser(options: RequestOptions = {}): Promise<User | null> {
  try {
    const body = await api.get<UserBody>('/api/auth/me', { quiet: true, ...options });
    return body?.user ?? null;
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export async function login(email: string, password: string, options?: RequestOptions) {
  const body = await api.post<SessionBody>('/api/auth/login', { email, password }, options);
  adoptToken(body);
  return body.user;
}

export async function logout(options?: RequestOptions): Promise<void> {
  try {
    await api.post('/api/auth/logout', undefined, options);
  } finally {
    resetCsrfToken(); // the session is gone either way
  }
}

/** Registering does not sign in: the new member verifies their e-mail first. */
export async function register(input: RegisterInput, options?: RequestOptions) {
  const body = await api.post<UserBody>('/api/auth/register', input, options);
  return body.user;
}

export async function verifyEmail(token: string, options?: RequestOptions): Promise<void> {
  await api.post('/api/auth/verify', { token }, options);
}

export async function resendVerification(options?: RequestOptions): Promise<void> {
  await api.post('/api/auth/verify/resend', undefined, options);
}

/** The server answers 202 whether or not the address has an account. */
export async function requestPasswordReset(email: string, options?: RequestOptions) {
  await api.post('/api/auth/password-reset', { email }, options);
}

export async function confirmPasswordReset(
  token: string,
  password: string,
  options?: RequestOptions,
): Promise<void> {
  await api.post('/api/auth/password-reset/confirm', { token, password }, options);
}

export async function updateProfile(changes: { displayName: string }, options?: RequestOptions) {
  const body = await api.patch<UserBody>('/api/auth/me', changes, options);
  return body.user;
}

export async function changePassword(
  currentPassword: string,
  newPassword: string,
  options?: RequestOptions,
): Promise<User> {
  const body = await api.post<SessionBody>(
    '/api/auth/password',
    { currentPassword, newPassword },
    options,
  );
  adoptToken(body);
  return body.user;
}
