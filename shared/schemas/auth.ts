import { z } from 'zod';
import { ROLES } from './vocabulary';

export { ROLES, ROLE_LABELS, type Role } from './vocabulary';
export const roleSchema = z.enum(ROLES, { message: `role must be one of ${ROLES.join(', ')}` });

export const PASSWORD_MIN = 12;
export const PASSWORD_MAX = 200;

export const emailSchema = z
  .string({ message: 'Enter an e-mail address' })
  .trim()
  .toLowerCase()
  .min(1, 'Enter an e-mail address')
  .max(254, 'That e-mail address is too long')
  .pipe(z.email({ message: 'Enter a valid e-mail address' }));

export const loginSchema = z.object({
  email: emailSchema,
  password: z.string({ message: 'Enter your password' }).min(1, 'Enter your password').max(PASSWORD_MAX),
});
export type LoginInput = z.infer<typeof loginSchema>;

export const newPasswordSchema = z
  .string({ message: 'Enter a new password' })
  .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters`)
  .max(PASSWORD_MAX, `Use at most ${PASSWORD_MAX} characters`);

export const changePasswordSchema = z
  .object({
    currentPassword: z.string().min(1, 'Enter your current password').max(PASSWORD_MAX),
    newPassword: newPasswordSchema,
  })
  .refine((v) => v.currentPassword !== v.newPassword, {
    path: ['newPassword'],
    message: 'The new password must differ from the current one',
  });
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;

export const sessionUserSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  supplierId: z.string().nullable(),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

export const loginResponseSchema = z.object({ user: sessionUserSchema, csrfToken: z.string() });
export const meResponseSchema = z.object({ user: sessionUserSchema });
export const csrfResponseSchema = z.object({ token: z.string() });

export const userSchema = sessionUserSchema.extend({
  active: z.boolean(),
  lockedUntil: z.string().nullable(),
  createdAt: z.string(),
});
export type User = z.infer<typeof userSchema>;

export const createUserSchema = z
  .object({
    email: emailSchema,
    name: z.string().trim().min(1, 'Enter a name').max(120, 'At most 120 characters'),
    role: roleSchema,
    supplierId: z.uuid({ message: 'must be a valid supplier id' }).nullable().optional(),
    password: newPasswordSchema,
  })
  .superRefine((v, ctx) => {
    if (v.role === 'supplier' && !v.supplierId) {
      ctx.addIssue({ code: 'custom', path: ['supplierId'], message: 'A supplier user needs a supplier' });
    }
    if (v.role !== 'supplier' && v.supplierId) {
      ctx.addIssue({ code: 'custom', path: ['supplierId'], message: 'Only supplier users belong to a supplier' });
    }
  });
export type CreateUserInput = z.infer<typeof createUserSchema>;

export const updateUserSchema = z
  .object({
    role: roleSchema.optional(),
    active: z.boolean({ message: 'active must be true or false' }).optional(),
    name: z.string().trim().min(1).max(120).optional(),
    supplierId: z.uuid().nullable().optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

export const healthResponseSchema = z.object({ status: z.enum(['ok', 'degraded']), db: z.enum(['up', 'down']) });
