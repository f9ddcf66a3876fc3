import { createHash, randomBytes } from 'node:crypto';
import { Secret, TOTP } from 'otpauth';

/**
 * Time-based one-time codes (RFC 6238) as every authenticator app reads them: HMAC-SHA-1, 6 digits,
 * a 30-second step. The code of the step before or after the current one is accepted too (clock drift,
 * RFC 6238 §5.2); the caller makes sure no step is accepted twice.
 */
const PERIOD_S = 30;
const totpOf = (secretBase32: string, label = '') =>
  new TOTP({
    issuer: 'Benchwright',
    label,
    secret: Secret.fromBase32(secretBase32),
    algorithm: 'SHA1',
    digits: 6,
    period: PERIOD_S,
  });

/** A new 160-bit secret (RFC 4226 §4 recommends 160 bits), base32. */
export const newTotpSecret = () => new Secret({ size: 20 }).base32;

/** The otpauth:// address an authenticator app takes from the enrolment QR code. */
export const otpauthUrl = (secretBase32: string, email: string) => totpOf(secretBase32, email).toString();

/** The time step `code` belongs to (within one step of `atMs`), or null when it matches none. */
export function matchTotp(secretBase32: string, code: string, atMs = Date.now()): number | null {
  if (!/^\d{6}$/.test(code)) return null;
  const delta = totpOf(secretBase32).validate({ token: code, timestamp: atMs, window: 1 });
  return delta === null ? null : Math.floor(atMs / 1000 / PERIOD_S) + delta;
}

// Recovery codes: 80 random bits as 16 base32 letters in groups of four ("k7qd-3mfa-…"). With that
// much entropy a plain SHA-256 is enough to store them (no guessing from the hash).
const BASE32 = 'abcdefghijklmnopqrstuvwxyz234567';
export const RECOVERY_CODE_COUNT = 10;

export function newRecoveryCodes(n = RECOVERY_CODE_COUNT): string[] {
  return Array.from({ length: n }, () => {
    const bytes = randomBytes(10);
    let bits = 0;
    let value = 0;
    let out = '';
    for (const b of bytes) {
      value = (value << 8) | b;
      bits += 8;
      while (bits >= 5) {
        out += BASE32[(value >>> (bits - 5)) & 31];
        bits -= 5;
      }
    }
    return out.match(/.{4}/g)!.join('-');
  });
}

/** The stored form of a recovery code, whatever case and separators it was typed with. */
export const recoveryCodeHash = (code: string) =>
  createHash('sha256').update(code.toLowerCase().replace(/[\s-]/g, '')).digest('hex');

/** Whether typed text looks like a recovery code (rather than a 6-digit code). */
export const isRecoveryCode = (code: string) =>
  /^[a-z2-7]{16}$/.test(code.toLowerCase().replace(/[\s-]/g, ''));
