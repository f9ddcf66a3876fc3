import PDFDocument from 'pdfkit';
import {
  READING_COLUMNS,
  runSheetModel,
  SHEET_HEADINGS,
  type SheetField,
  type SheetNotice,
} from '../../../shared/runs/run-sheet-model';
import type { RunView } from '../../../shared/schemas/runs';
import { SAFETY_SIGNS, WARNING_TRIANGLE } from '../../../shared/safety-signs';

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

const INK = '#2b2a28';
const OUT = '#a3261b';
const NOTICE_INK: Record<SheetNotice['kind'], string> = {
  signed: '#1d6b3a',
  'in-progress': OUT,
  abandoned: OUT,
  hold: OUT,
  out: OUT,
};
/** Share of the table width per column, in READING_COLUMNS order. */
const COLUMN_SHARES = [0.23, 0.17, 0.14, 0.18, 0.11, 0.17];

/** A run sheet for the customer's file, drawn from the same model as the page (shared/runs/run-sheet-model). */
export function renderRunSheetPdf(run: RunView): Promise<Buffer> {
  const sheet = runSheetModel(run);
  const doc = new PDFDocument({
    size: 'A4',
    margin: 40,
    info: {
      Title: pdfText(sheet.title),
      Author: 'Benchwright',
      Subject: pdfText(`${run.unit.model} ${run.unit.serial}`),
    },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));
  const left = doc.page.margins.left;
  const width = doc.page.width - left - doc.page.margins.right;
  const bottom = () => doc.page.height - doc.page.margins.bottom;
  const ensure = (h: number) => {
    if (doc.y + h > bottom()) doc.addPage();
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
  const line = (label: string, value: string, tone?: SheetField['tone']) => {
    ensure(14);
    doc
      .font('Helvetica-Bold')
      .fontSize(9)
      .text(pdfText(`${label}: `), left, doc.y, { continued: true, width })
      .font('Helvetica')
      .fillColor(tone === 'out' ? OUT : INK)
      .text(pdfText(value))
      .fillColor(INK);
  };
  const fields = (title: string, list: SheetField[]) => {
    heading(title);
    for (const f of list) line(f.label, f.value, f.tone);
  };

  doc.font('Helvetica-Bold').fontSize(16).text(pdfText(sheet.title), { width });
  doc.font('Helvetica').fontSize(9).fillColor('#5a5650').text(pdfText(sheet.reference)).fillColor(INK);
  for (const n of sheet.notices)
    doc
      .moveDown(0.3)
      .font('Helvetica-Bold')
      .fontSize(11)
      .fillColor(NOTICE_INK[n.kind])
      .text(pdfText(n.kind === 'signed' ? n.text : n.text.toUpperCase()), { width })
      .fillColor(INK);

  // Caution box
  doc.moveDown(0.5);
  const cautionTop = doc.y;
  const caution = pdfText(`${sheet.caution.lead} ${sheet.caution.text}`);
  doc.font('Helvetica').fontSize(8.5);
  // The DANGER sign of shared/safety-signs.ts: its band with the triangle and word, then the text.
  const sign = SAFETY_SIGNS.danger;
  const band = 18;
  const cautionHeight = band + doc.heightOfString(caution, { width: width - 20 }) + 12;
  doc.rect(left, cautionTop, width, cautionHeight).lineWidth(2).stroke(sign.field);
  doc.rect(left, cautionTop, width, band).fill(sign.field);
  const t = { x: left + 8, y: cautionTop + 3, s: 12 };
  doc
    .polygon([t.x + t.s / 2, t.y], [t.x + t.s, t.y + t.s], [t.x, t.y + t.s])
    .lineWidth(1.2)
    .fillAndStroke(WARNING_TRIANGLE.field, WARNING_TRIANGLE.ink);
  doc
    .fillColor(WARNING_TRIANGLE.ink)
    .font('Helvetica-Bold')
    .fontSize(8)
    .text('!', t.x + t.s / 2 - 1.5, t.y + 3);
  doc
    .fillColor(sign.ink)
    .font('Helvetica-Bold')
    .fontSize(9)
    .text(sign.word, left + 26, cautionTop + 5, { width: width - 36 });
  doc
    .fillColor(INK)
    .font('Helvetica')
    .fontSize(8.5)
    .text(caution, left + 10, cautionTop + band + 6, { width: width - 20 });
  doc.y = cautionTop + cautionHeight + 4;
  doc.fillColor(INK);

  fields(SHEET_HEADINGS.unit, sheet.unit);
  fields(SHEET_HEADINGS.procedure, sheet.procedure);
  fields(SHEET_HEADINGS.bench, sheet.bench);

  heading(SHEET_HEADINGS.readings);
  const cols = COLUMN_SHARES.map((w) => w * width);
  const row = (cells: string[], opts: { bold?: boolean; tint?: string; markInk?: string } = {}) => {
    doc.font(opts.bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(8.5);
    const h = Math.max(...cells.map((c, i) => doc.heightOfString(pdfText(c), { width: cols[i]! - 6 }))) + 6;
    ensure(h);
    const y = doc.y;
    if (opts.tint) doc.rect(left, y, width, h).fill(opts.tint).fillColor(INK);
    let x = left;
    cells.forEach((c, i) => {
      doc.fillColor(i === 4 && opts.markInk ? opts.markInk : INK).text(pdfText(c), x + 3, y + 3, {
        width: cols[i]! - 6,
      });
      x += cols[i]!;
    });
    doc.fillColor(INK);
    doc.y = y + h;
    doc
      .moveTo(left, doc.y)
      .lineTo(left + width, doc.y)
      .lineWidth(0.3)
      .strokeColor('#d8ccb5')
      .stroke();
  };
  row([...READING_COLUMNS], { bold: true, tint: '#ece4d3' });
  for (const r of sheet.readings) {
    const out = r.mark === 'out';
    row(
      [
        [`${r.position}. ${r.label}`, r.testPoint, r.note && `Note: ${r.note}`].filter(Boolean).join('\n'),
        `${r.expected}\n${r.band}`,
        [r.measured, r.asTyped && `as typed: ${r.asTyped}`, r.corrected && '(corrected)']
          .filter(Boolean)
          .join('\n'),
        r.deviation,
        r.markText,
        r.recordedBy ? `${r.recordedBy}\n${r.recordedAt}` : '—',
      ],
      out ? { tint: '#f6dcd6', markInk: OUT } : {},
    );
  }

  heading(SHEET_HEADINGS.checks);
  for (const c of sheet.checks) {
    ensure(24);
    doc
      .font('Helvetica-Bold')
      .fontSize(8.5)
      .text(pdfText(`${c.position}. ${c.kindText}: `), left, doc.y, { continued: true, width })
      .font('Helvetica')
      .text(pdfText(`${c.text.slice(0, 400)} [${c.status}]`));
    if (c.note) doc.font('Helvetica-Oblique').text(pdfText(`Note: ${c.note}`), left + 12, doc.y, { width });
    doc.moveDown(0.2);
  }

  if (sheet.instruments.length) fields(SHEET_HEADINGS.instruments, sheet.instruments);
  if (sheet.corrections.length) heading(SHEET_HEADINGS.corrections);
  for (const c of sheet.corrections) for (const v of c.versions) line(`Step ${c.position ?? '?'}`, v);
  if (sheet.photos) line('Photos', sheet.photos);

  fields(SHEET_HEADINGS.signature, sheet.signature);

  doc.end();
  return done;
}
