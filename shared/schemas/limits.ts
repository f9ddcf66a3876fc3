/** Password length rules (ASVS 6.2.1 / 6.2.9): long passphrases accepted, no composition rules. */
export const PASSWORD_MIN = 12;
export const PASSWORD_MAX = 256;
