import { z } from 'zod';
import { PASSWORD_MIN_LENGTH, ROLES } from '../types';

export const Email = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }));

/** bcrypt reads only the first 72 bytes of a password (bcryptjs 3 README, "Security considerations": "The maximum input length is 72 bytes"). */
export const PASSWORD_MAX_BYTES = 72;

const utf8Length = (s: string) => new TextEncoder().encode(s).length;

/** A password someone chooses. The server also refuses the demo password and very common ones. */
export const Password = z
  .string({ error: 'Enter a password.' })
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
  .refine(
    (s) => utf8Length(s) <= PASSWORD_MAX_BYTES,
    `Use at most ${PASSWORD_MAX_BYTES} bytes: ${PASSWORD_MAX_BYTES} plain letters, fewer with accents or emoji. The rest would be ignored.`,
  );

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

/** The answer to a sign-up: the same for every address (an address with an account gets a note by e-mail instead). */
export const SignupAccepted = z.object({ message: z.string() });
export type SignupAccepted = z.infer<typeof SignupAccepted>;

export const PasswordResetRequest = z.object({ email: Email });
export type PasswordResetRequest = z.infer<typeof PasswordResetRequest>;

export const Token = z.string({ error: 'The link is incomplete.' }).trim().min(20, 'The link is incomplete.').max(200);

/** The e-mailed link that finishes a sign-up: the company is made, and its owner signed in. */
export const SignupConfirm = z.object({ token: Token });
export type SignupConfirm = z.infer<typeof SignupConfirm>;

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
