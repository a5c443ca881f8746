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
  })
  .refine((b) => Object.keys(b).length > 0, 'Nothing to change: give a name, role or password.');
export type UpdateUserBody = z.infer<typeof updateUserBodySchema>;
