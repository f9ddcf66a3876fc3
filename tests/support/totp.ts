// One-time codes computed the long way, independently of the library the server uses:
// HOTP (RFC 4226 §5.3: HMAC-SHA-1, dynamic truncation) over the time step of RFC 6238 §4.2
// (T0 = 0, X = 30 s), with the secret in base32 (RFC 4648 §6).
import { createHmac } from 'node:crypto';

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ234567';

export function base32Decode(text: string): Buffer {
  const clean = text.toUpperCase().replace(/[\s=-]/g, '');
  let bits = 0;
  let value = 0;
  const out: number[] = [];
  for (const ch of clean) {
    const v = ALPHABET.indexOf(ch);
    if (v < 0) throw new Error(`not base32: ${ch}`);
    value = (value << 5) | v;
    bits += 5;
    if (bits >= 8) {
      out.push((value >>> (bits - 8)) & 0xff);
      bits -= 8;
    }
  }
  return Buffer.from(out);
}

export function hotp(key: Buffer, counter: number, digits = 6): string {
  const msg = Buffer.alloc(8);
  msg.writeBigUInt64BE(BigInt(counter));
  const mac = createHmac('sha1', key).update(msg).digest();
  const offset = mac[mac.length - 1]! & 0x0f;
  const binary =
    ((mac[offset]! & 0x7f) << 24) | (mac[offset + 1]! << 16) | (mac[offset + 2]! << 8) | mac[offset + 3]!;
  return String(binary % 10 ** digits).padStart(digits, '0');
}

/** The code an authenticator app shows for this base32 secret at `atMs` (default: now). */
export const totpCode = (secretBase32: string, atMs = Date.now(), digits = 6) =>
  hotp(base32Decode(secretBase32), Math.floor(atMs / 1000 / 30), digits);
