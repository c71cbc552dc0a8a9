import { z } from 'zod';
import { PASSWORD_MIN_LENGTH, ROLES } from '../types';

export const Email = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }));

export const Password = z
  .string({ error: 'Enter a password.' })
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
  .max(200, 'Use at most 200 characters.');

export const PersonName = z
  .string({ error: 'Enter a name.' })
  .trim()
  .min(1, 'Enter a name.')
  .max(120, 'Use at most 120 characters.');

export const SignupRequest = z.object({
  organizationName: z
    .string({ error: 'Enter the company name.' })
    .trim()
    .min(2, 'Enter the company name.')
    .max(160, 'Use at most 160 characters.'),
  name: PersonName,
  email: Email,
  password: Password,
});
export type SignupRequest = z.infer<typeof SignupRequest>;

export const LoginRequest = z.object({
  email: Email,
  password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(200),
});
export type LoginRequest = z.infer<typeof LoginRequest>;

export const PasswordResetRequest = z.object({ email: Email });
export type PasswordResetRequest = z.infer<typeof PasswordResetRequest>;

export const Token = z.string({ error: 'The link is incomplete.' }).trim().min(20, 'The link is incomplete.').max(200);

export const PasswordResetConfirm = z.object({ token: Token, password: Password });
export type PasswordResetConfirm = z.infer<typeof PasswordResetConfirm>;

export const InviteAccept = z.object({ token: Token, name: PersonName.optional(), password: Password });
export type InviteAccept = z.infer<typeof InviteAccept>;

export const SessionUser = z.object({
  id: z.string(),
  name: z.string(),
  email: z.string(),
  role: z.enum(ROLES),
});

/** GET /api/auth/me, and the answer of signup, login and invite acceptance. */
export const MeResponse = z.object({
  user: SessionUser,
  organization: z.object({ id: z.string(), name: z.string() }),
  areas: z.array(z.string()),
});
export type MeResponse = z.infer<typeof MeResponse>;

/** GET /api/auth/invites/:token */
export const InvitePreview = z.object({
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  organizationName: z.string(),
});
export type InvitePreview = z.infer<typeof InvitePreview>;
