import { simpleParser, type AddressObject } from 'mailparser';
import type { ReceivedMail } from '../../server/mail/fake-smtp';

/** A message the mail catcher received, parsed as mail (RFC 5322 / MIME) by mailparser. */
export interface ParsedMail {
  /** Who the SMTP envelope delivered it to (RCPT TO), lower case. */
  envelopeTo: string[];
  /** The addresses in the To header, lower case. */
  to: string[];
  from: string;
  subject: string;
  /** The text/plain part, decoded. */
  text: string;
  /** The text/html part, decoded ('' when there is none). */
  html: string;
  /** The http(s) URLs written in the plain-text body, in order. */
  links: string[];
}

/** The http(s) URLs written in a plain text, in order. */
export const linksIn = (text: string) => text.match(/https?:\/\/[^\s<>"]+/g) ?? [];

const lower = (a: AddressObject | AddressObject[] | undefined) =>
  [a ?? []].flat().flatMap((o) => o.value.map((v) => (v.address ?? '').toLowerCase()));

const cache = new WeakMap<ReceivedMail, Promise<ParsedMail>>();

export function parseMail(m: ReceivedMail): Promise<ParsedMail> {
  let parsed = cache.get(m);
  if (!parsed) {
    parsed = simpleParser(m.raw).then((p) => {
      const text = p.text ?? '';
      return {
        envelopeTo: m.to.map((a) => a.toLowerCase()),
        to: lower(p.to),
        from: lower(p.from)[0] ?? '',
        subject: p.subject ?? '',
        text,
        html: typeof p.html === 'string' ? p.html : '',
        links: linksIn(text),
      };
    });
    cache.set(m, parsed);
  }
  return parsed;
}

export const parseMails = (received: readonly ReceivedMail[]) => Promise.all(received.map(parseMail));

/**
 * The received messages that `match`, waiting up to five seconds for at least `atLeast` of them
 * (mail goes out in the background after the change it reports).
 */
export async function mailsMatching(
  received: readonly ReceivedMail[],
  match: (m: ParsedMail) => boolean,
  atLeast = 1,
): Promise<ParsedMail[]> {
  const deadline = Date.now() + 5_000;
  for (;;) {
    const found = (await parseMails(received)).filter(match);
    if (found.length >= atLeast || Date.now() > deadline) return found;
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** The token of the set-password link in a message's text, if it has one. */
export const setPasswordToken = (m: Pick<ParsedMail, 'links'>) =>
  m.links.map((l) => /\/set-password\/([A-Za-z0-9_-]{20,})$/.exec(l)?.[1]).find(Boolean);
