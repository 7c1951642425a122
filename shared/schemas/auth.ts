import { z } from 'zod';
import { RoleSchema } from './common';

// Password rules after NIST SP 800-63B §3.1.1.2 / OWASP ASVS 5.0: at least 8 characters,
// up to 128, no composition rules; the most common passwords are refused on the server.
export const PasswordSchema = z
  .string()
  .min(8, 'Use at least 8 characters (15 or more is better).')
  .max(128, 'Use at most 128 characters.');

export const EmailSchema = z.string().trim().toLowerCase().email('Enter an e-mail address.');

export const SignInInputSchema = z.object({
  email: EmailSchema,
  password: z.string().min(1, 'Enter your password.').max(256),
});
export type SignInInput = z.infer<typeof SignInInputSchema>;

export const UserSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
});
export type User = z.infer<typeof UserSchema>;

/** A member as the team list sends it (GET /api/team/members, admins only). */
export type Member = User & { disabledAt: number | null; createdAt: number };

export const MeResponseSchema = z.object({ user: UserSchema.nullable() });

export const InviteInputSchema = z.object({
  email: EmailSchema,
  role: RoleSchema,
});
export type InviteInput = z.infer<typeof InviteInputSchema>;

export const AcceptInviteInputSchema = z.object({
  token: z.string().min(20).max(200),
  name: z.string().trim().min(1, 'Enter your name.').max(120),
  password: PasswordSchema,
});
export type AcceptInviteInput = z.infer<typeof AcceptInviteInputSchema>;

export const RequestResetInputSchema = z.object({ email: EmailSchema });
export const ResetPasswordInputSchema = z.object({
  token: z.string().min(20).max(200),
  password: PasswordSchema,
});
export type ResetPasswordInput = z.infer<typeof ResetPasswordInputSchema>;

export const ChangeRoleInputSchema = z.object({
  role: RoleSchema.optional(),
  disabled: z.boolean().optional(),
});
