import { inflateSync } from 'node:zlib';
import type { Response } from 'superagent';

/**
 * The text a PDF from pdfkit draws: each content stream is inflated (zlib) and the hex strings
 * decoded (the built-in fonts use single-byte WinAnsi codes, ISO 32000-1 Annex D: windows-1252).
 * pdfkit's own text gives a line per `[…] TJ` array; an SVG drawn by svg-to-pdfkit places glyph by
 * glyph (`<..> Tj`), so those of one text object (BT … ET) make one line. Enough to check what a run
 * sheet names, without a PDF library.
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
    for (const block of content.matchAll(/\bBT\b([\s\S]*?)\bET\b/g)) {
      const decode = (hex: string) => winAnsi.decode(Buffer.from(hex, 'hex'));
      for (const tj of block[1]!.matchAll(/\[((?:<[0-9a-fA-F]*>|[^\]])*)\]\s*TJ/g))
        lines.push(decode([...tj[1]!.matchAll(/<([0-9a-fA-F]*)>/g)].map((h) => h[1]).join('')));
      const glyphs = [...block[1]!.matchAll(/<([0-9a-fA-F]*)>\s*Tj/g)].map((h) => h[1]).join('');
      if (glyphs) lines.push(decode(glyphs));
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
