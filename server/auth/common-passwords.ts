import { dictionary } from '@zxcvbn-ts/language-common';

/**
 * Passwords seen most often in breaches (zxcvbn-ts's common list, ~49,000 entries, most
 * frequent first). ASVS 6.2.4 asks to refuse at least the top 3,000; we refuse them all.
 */
const COMMON = new Set((dictionary['passwords-common'] as string[]).map((p) => p.toLowerCase()));

export const isCommonPassword = (password: string) => COMMON.has(password.toLowerCase());
