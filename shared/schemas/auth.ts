import { z } from 'zod';

export const ROLE_NAMES = ['member', 'moderator', 'admin'] as const;
export const roleSchema = z.enum(ROLE_NAMES);
export type RoleName = z.infer<typeof roleSchema>;

const email = z
  .string()
  .trim()
  .max(254, { error: 'must be at most 254 characters' })
  .pipe(z.email({ error: 'must be a valid e-mail address, like name@example.test' }))
  .transform((s) => s.toLowerCase());

export const displayNameSchema = z
  .string()
  .trim()
  .min(2, { error: 'must be at least 2 characters' })
  .max(60, { error: 'must be at most 60 characters' });

// Length and commonness are checked on the server with the full rule (passwordProblem).
const password = z.string().max(200, { error: 'must be at most 200 characters' });

export const registerSchema = z.strictObject({ email, displayName: displayNameSchema, password });
export const loginSchema = z.strictObject({ email, password: z.string().max(200) });
export const tokenSchema = z.strictObject({ token: z.string().min(10).max(200) });
export const passwordResetSchema = z.strictObject({ email });
export const passwordResetConfirmSchema = z.strictObject({
  token: z.string().min(10).max(200),
  password,
});
export const changePasswordSchema = z.strictObject({
  currentPassword: z.string().max(200),
  newPassword: password,
});
export const updateMeSchema = z.strictObject({ displayName: displayNameSchema });
export const updateRoleSchema = z.strictObject({ role: roleSchema });

export type RegisterInput = z.infer<typeof registerSchema>;
export type LoginInput = z.infer<typeof loginSchema>;

export interface PublicUser {
  id: number;
  email: string;
  displayName: string;
  role: RoleName;
  emailVerified: boolean;
}
