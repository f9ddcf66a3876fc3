import { z } from 'zod';

import { PASSWORD_MAX, PASSWORD_MIN } from './limits';

export { PASSWORD_MAX, PASSWORD_MIN };

export const emailSchema = z
  .string()
  .trim()
  .max(254, 'at most 254 characters')
  .pipe(z.email('not a valid e-mail address'))
  .transform((e) => e.toLowerCase());

/** Long passphrases welcome; no composition rules, no truncation. */
export const newPasswordSchema = z
  .string()
  .min(PASSWORD_MIN, `at least ${PASSWORD_MIN} characters`)
  .max(PASSWORD_MAX, `at most ${PASSWORD_MAX} characters`);

export const signInBody = z
  .object({
    email: z.string().trim().min(1, 'required').max(254, 'at most 254 characters'),
    password: z.string().min(1, 'required').max(PASSWORD_MAX, `at most ${PASSWORD_MAX} characters`),
  })
  .strict();

export const setPasswordBody = z
  .object({
    token: z.string().min(20, 'not a valid link').max(200, 'not a valid link'),
    password: newPasswordSchema,
  })
  .strict();

export type SignInBody = z.infer<typeof signInBody>;

export const changePasswordBody = z
  .object({
    currentPassword: z.string().min(1, 'required').max(PASSWORD_MAX, `at most ${PASSWORD_MAX} characters`),
    newPassword: newPasswordSchema,
  })
  .strict();

/** Re-entering one's password (authenticator set-up, new recovery codes, turning codes off). */
export const passwordBody = z
  .object({ password: z.string().min(1, 'required').max(PASSWORD_MAX, `at most ${PASSWORD_MAX} characters`) })
  .strict();

/** Six digits from the authenticator app, or a recovery code (xxxx-xxxx-xxxx-xxxx). */
export const codeBody = z
  .object({
    code: z.string().trim().min(6, 'six digits or a recovery code').max(40, 'six digits or a recovery code'),
  })
  .strict();

export const signInSettingsBody = z
  .object({ requireSecondFactor: z.boolean({ error: 'must be true or false' }) })
  .strict();

export type ChangePasswordBody = z.infer<typeof changePasswordBody>;
