import { z } from 'zod';
import { roleSchema } from './common.ts';

export const signInBodySchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address such as name@example.com.'),
  password: z.string().min(1, 'Enter your password.'),
});
export type SignInBody = z.infer<typeof signInBodySchema>;

export const userSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
});
export type User = z.infer<typeof userSchema>;

export const meResponseSchema = z.object({ user: userSchema });

/** A person as the admin's list shows them: also whether they may sign in. */
export const listedUserSchema = userSchema.extend({
  /** False while deactivated: no sign-in; their name stays on everything they did. */
  active: z.boolean(),
  deactivatedAt: z.string().nullable(),
});
export type ListedUser = z.infer<typeof listedUserSchema>;

export const createUserBodySchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address such as name@example.com.'),
  name: z.string().trim().min(1, 'Enter a name.').max(120),
  role: roleSchema,
  password: z.string().min(10, 'A password needs at least 10 characters.').max(200),
});
export type CreateUserBody = z.infer<typeof createUserBodySchema>;

export const updateUserBodySchema = z
  .object({
    name: z.string().trim().min(1).max(120).optional(),
    role: roleSchema.optional(),
    password: z.string().min(10, 'A password needs at least 10 characters.').max(200).optional(),
    /** false deactivates (ends their sessions at once), true reactivates. */
    active: z.boolean().optional(),
  })
  .refine((b) => Object.keys(b).length > 0, 'Nothing to change: give a name, role, password or whether the account is active.');
export type UpdateUserBody = z.infer<typeof updateUserBodySchema>;

/** `POST /api/auth/password`: a person changes their own password; their other sessions end. */
export const changePasswordBodySchema = z
  .object({
    currentPassword: z.string().min(1, 'Enter your current password.'),
    newPassword: z.string().min(10, 'A password needs at least 10 characters.').max(200),
  })
  .refine((b) => b.newPassword !== b.currentPassword, { message: 'The new password must differ from the current one.', path: ['newPassword'] });
export type ChangePasswordBody = z.infer<typeof changePasswordBodySchema>;
