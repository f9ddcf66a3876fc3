import { z } from 'zod';

import { PASSWORD_MAX, PASSWORD_MIN } from './limits';

export { PASSWORD_MAX, PASSWORD_MIN };

export const emailSchema = z
  .string()
  .trim()
  .max(254)
  .pipe(z.email())
  .transform((e) => e.toLowerCase())
  .meta({ title: 'E-mail' });

/** Long passphrases welcome; no composition rules, no truncation. */
export const newPasswordSchema = z
  .string()
  .min(PASSWORD_MIN)
  .max(PASSWORD_MAX)
  .meta({ title: 'New password' });

/** A password typed again to confirm who is acting. */
const password = (title = 'Password') => z.string().min(1).max(PASSWORD_MAX).meta({ title });

export const signInBody = z
  .object({
    email: z.string().trim().min(1).max(254).meta({ title: 'E-mail' }),
    password: password(),
  })
  .strict();

export const setPasswordBody = z
  .object({
    token: z
      .string()
      .min(20, 'This link is not valid; ask for a new one')
      .max(200, 'This link is not valid; ask for a new one')
      .meta({ title: 'Link' }),
    password: newPasswordSchema,
  })
  .strict();

export type SignInBody = z.infer<typeof signInBody>;

export const changePasswordBody = z
  .object({
    currentPassword: password('Current password'),
    newPassword: newPasswordSchema,
  })
  .strict();

/** Re-entering one's password (authenticator set-up, new recovery codes, turning codes off). */
export const passwordBody = z.object({ password: password('Your password') }).strict();

/** Six digits from the authenticator app, or a recovery code (xxxx-xxxx-xxxx-xxxx). */
export const codeBody = z
  .object({
    code: z
      .string()
      .trim()
      .min(6, 'Enter the six digits from the app or a recovery code')
      .max(40, 'Enter the six digits from the app or a recovery code')
      .meta({ title: 'Code' }),
  })
  .strict();

export const signInSettingsBody = z
  .object({ requireSecondFactor: z.boolean().meta({ title: 'Require an authenticator code' }) })
  .strict();

export type ChangePasswordBody = z.infer<typeof changePasswordBody>;
