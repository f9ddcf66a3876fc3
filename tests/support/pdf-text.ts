import { inflateSync } from 'node:zlib';
import type { Response } from 'superagent';

/**
 * The text a PDF from pdfkit draws, one line per text-showing operator: each content stream is
 * inflated (zlib) and the hex strings of every `[…] TJ` array are decoded (the built-in fonts use
 * single-byte WinAnsi codes, ISO 32000-1 Annex D: windows-1252). Enough to check what a run sheet
 * names, without a PDF library.
 */
const winAnsi = new TextDecoder('windows-1252');

export function pdfText(pdf: Buffer): string[] {
  const raw = pdf.toString('latin1');
  const lines: string[] = [];
  const stream = /stream\r?\n/g;
  for (let m = stream.exec(raw); m; m = stream.exec(raw)) {
    const start = m.index + m[0].length;
    const end = raw.indexOf('endstream', start);
    let content: string;
    try {
      content = inflateSync(pdf.subarray(start, end)).toString('latin1');
    } catch {
      continue; // not a deflated stream (fonts, images)
    }
    for (const tj of content.matchAll(/\[((?:<[0-9a-fA-F]*>|[^\]])*)\]\s*TJ/g)) {
      const hex = [...tj[1]!.matchAll(/<([0-9a-fA-F]*)>/g)].map((h) => h[1]).join('');
      lines.push(winAnsi.decode(Buffer.from(hex, 'hex')));
    }
  }
  return lines;
}

/** A PDF answer from supertest as a Buffer. */
export const pdfBody = (r: Response, cb: (err: Error | null, body: Buffer) => void) => {
  const stream = r as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};
