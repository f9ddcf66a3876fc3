import type PDFDocument from 'pdfkit';
import type { Caution } from '../../../shared/safety-caution';
import { SAFETY_SIGNS, WARNING_TRIANGLE, type SignalLevel } from '../../../shared/safety-signs';

/** Pieces every PDF of Benchwright draws the same way: run sheets (pdf.ts) and blank bench sheets. */

export type Doc = InstanceType<typeof PDFDocument>;

/** The warning triangle of shared/safety-signs.ts (its own paths), `size` points wide, at (x, y). */
export function drawTriangle(doc: Doc, x: number, y: number, size: number) {
  const t = WARNING_TRIANGLE;
  const [, , w = 48] = t.viewBox.split(' ').map(Number);
  doc
    .save()
    .translate(x, y)
    .scale(size / w);
  doc.path(t.outline).lineWidth(4).lineJoin('round').fillAndStroke(t.field, t.ink);
  doc.rect(t.bar.x, t.bar.y, t.bar.width, t.bar.height).fill(t.ink);
  doc.circle(t.dot.cx, t.dot.cy, t.dot.r).fill(t.ink);
  doc.restore();
}

/**
 * The signal-word band of a safety sign, as on the page: the level's field colour, the triangle
 * where it belongs, the word in the sign's ink. Drawn at (x, y), `height` points tall; returns its width.
 */
export function signBand(doc: Doc, level: SignalLevel, x: number, y: number, height: number) {
  const sign = SAFETY_SIGNS[level];
  const size = height * 0.55;
  doc.font('Helvetica-Bold').fontSize(size);
  const triangle = sign.triangle ? height - 4 : 0;
  const wordAt = 5 + (triangle ? triangle + 4 : 0);
  const width = wordAt + doc.widthOfString(sign.word) + 5;
  doc.rect(x, y, width, height).fill(sign.field);
  if (triangle) drawTriangle(doc, x + 4, y + 2, triangle);
  doc.fillColor(sign.ink).text(sign.word, x + wordAt, y + (height - size) / 2 + 0.5, { lineBreak: false });
  doc.fillColor(INK);
  return width;
}

// The built-in PDF fonts speak WinAnsi only: spell out what they cannot draw.
const SPELLED: Record<string, string> = {
  Ω: 'ohm',
  '\u2126': 'ohm',
  '…': '...',
  '−': '-',
  '≥': '>=',
  '≤': '<=',
  '√': 'sqrt ',
  '→': '->',
  '≈': '~',
  '\u2009': ' ',
  '\u202f': ' ',
};
const WIN_ANSI_EXTRA = new Set('€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ');
export const pdfText = (s: string) =>
  // "22 Ω" → "22 ohm", "300 mΩ" → "300 mohm"
  [...s.replace(/(\d) ?[Ω\u2126]/g, '$1 ohm')]
    .map(
      (c) =>
        SPELLED[c] ??
        ((c.codePointAt(0)! < 256 && c >= ' ') || WIN_ANSI_EXTRA.has(c) ? c : c === '\n' ? c : '?'),
    )
    .join('');

export const INK = '#2b2a28';

/** The standing caution in a box under the DANGER sign's band (shared/safety-signs.ts), full width at doc.y. */
export function cautionBox(doc: Doc, caution: Caution, left: number, width: number) {
  doc.moveDown(0.5);
  const cautionTop = doc.y;
  const words = pdfText(`${caution.lead} ${caution.text}`);
  doc.font('Helvetica').fontSize(8.5);
  // The DANGER sign of shared/safety-signs.ts: its band across the box, then the text.
  const sign = SAFETY_SIGNS.danger;
  const band = 18;
  const cautionHeight = band + doc.heightOfString(words, { width: width - 20 }) + 12;
  doc.rect(left, cautionTop, width, cautionHeight).lineWidth(2).stroke(sign.field);
  doc.rect(left, cautionTop, width, band).fill(sign.field);
  signBand(doc, 'danger', left, cautionTop, band);
  doc
    .fillColor(INK)
    .font('Helvetica')
    .fontSize(8.5)
    .text(words, left + 10, cautionTop + band + 6, { width: width - 20 });
  doc.y = cautionTop + cautionHeight + 4;
  doc.fillColor(INK);
}

/** The page frame both sheets write in: the text column, a page break before a block that won't fit, and a section heading. */
export function pageFrame(doc: Doc) {
  const left = doc.page.margins.left;
  const width = doc.page.width - left - doc.page.margins.right;
  const ensure = (h: number) => {
    if (doc.y + h > doc.page.height - doc.page.margins.bottom) doc.addPage();
  };
  const heading = (t: string) => {
    ensure(40);
    doc
      .moveDown(0.6)
      .font('Helvetica-Bold')
      .fontSize(12)
      .fillColor('#134a44')
      .text(pdfText(t), left, doc.y, { width })
      .fillColor(INK)
      .moveDown(0.2);
  };
  return { left, width, ensure, heading };
}
