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
