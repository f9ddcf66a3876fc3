import PDFDocument from 'pdfkit';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import SVGtoPDF from 'svg-to-pdfkit';
import { deviationLayout } from '../../../shared/plots/deviation-layout';
import { DeviationPlotSvg } from '../../../shared/plots/deviation-plot';
import {
  READING_COLUMNS,
  runSheetModel,
  SHEET_HEADINGS,
  type RunSheetModel,
  type SheetField,
  type SheetNotice,
} from '../../../shared/runs/run-sheet-model';
import type { RunView } from '../../../shared/schemas/runs';
import { SAFETY_SIGNS, WARNING_TRIANGLE, type SignalLevel } from '../../../shared/safety-signs';

type Doc = InstanceType<typeof PDFDocument>;

/** The warning triangle of shared/safety-signs.ts (its own paths), `size` points wide, at (x, y). */
function drawTriangle(doc: Doc, x: number, y: number, size: number) {
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
function signBand(doc: Doc, level: SignalLevel, x: number, y: number, height: number) {
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

const INK = '#2b2a28';
const OUT = '#a3261b';
const NOTICE_INK: Record<SheetNotice['kind'], string> = {
  signed: '#1d6b3a',
  // Under way is a state, not a fault or a hazard.
  'in-progress': INK,
  abandoned: OUT,
  hold: OUT,
  out: OUT,
};
/** Share of the table width per column, in READING_COLUMNS order. */
const COLUMN_SHARES = [0.23, 0.17, 0.14, 0.18, 0.11, 0.17];

/**
 * The readings against their bands: the page's own SVG (shared/plots/deviation-plot.tsx) drawn by
 * svg-to-pdfkit, its text in this document's Helvetica and spelled for WinAnsi like every other line.
 */
function plotSection(
  doc: PDFKit.PDFDocument,
  plot: RunSheetModel['plot'],
  at: { left: number; width: number; heading: (t: string) => void; ensure: (h: number) => void },
) {
  const { width: w, height: h } = deviationLayout(plot);
  // Full width, or smaller when a long run's plot would not fit on one page with its heading.
  const page = doc.page.height - doc.page.margins.top - doc.page.margins.bottom - 48;
  const scale = Math.min(at.width / w, page / h);
  const height = plot.readings.length ? h * scale : 0;
  at.ensure(height + 48); // the heading stays with the plot
  at.heading(plot.title);
  if (height) {
    const svg = pdfText(renderToStaticMarkup(createElement(DeviationPlotSvg, { plot, id: 'readings-plot' })));
    const top = doc.y;
    SVGtoPDF(doc, svg, at.left, top, {
      // Only with preserveAspectRatio does svg-to-pdfkit fit the drawing to width × height; without it the
      // SVG's own width and height attributes (pixels) would set its size.
      width: w * scale,
      height,
      preserveAspectRatio: 'xMinYMin meet',
      fontCallback: (_family, bold) => (bold ? 'Helvetica-Bold' : 'Helvetica'),
    });
    doc.y = top + height + 4;
  }
  doc.font('Helvetica').fontSize(8.5).fillColor(INK);
  for (const t of [
    plot.readings.length ? plot.caption : plot.description,
    ...plot.notPlotted.map((n) => `Not plotted: ${n}`),
  ])
    doc.text(pdfText(t), at.left, doc.y, { width: at.width });
}

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
  // The DANGER sign of shared/safety-signs.ts: its band across the box, then the text.
  const sign = SAFETY_SIGNS.danger;
  const band = 18;
  const cautionHeight = band + doc.heightOfString(caution, { width: width - 20 }) + 12;
  doc.rect(left, cautionTop, width, cautionHeight).lineWidth(2).stroke(sign.field);
  doc.rect(left, cautionTop, width, band).fill(sign.field);
  signBand(doc, 'danger', left, cautionTop, band);
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

  plotSection(doc, sheet.plot, { left, width, heading, ensure });

  heading(SHEET_HEADINGS.checks);
  for (const c of sheet.checks) {
    ensure(24);
    // A hazard note leads with its safety sign, as on the page; the text follows beside it.
    const y = doc.y;
    const x = c.signal ? left + signBand(doc, c.signal, left, y, 12) + 4 : left;
    doc
      .font('Helvetica-Bold')
      .fontSize(8.5)
      .text(pdfText(`${c.position}. ${c.signal ? '' : `${c.kindText}: `}`), x, y + (c.signal ? 2 : 0), {
        continued: true,
        width: width - (x - left),
      })
      .font('Helvetica')
      .text(pdfText(`${c.text} [${c.status}]`));
    if (c.note) doc.font('Helvetica-Oblique').text(pdfText(`Note: ${c.note}`), left + 12, doc.y, { width });
    doc.moveDown(0.2);
  }

  if (sheet.decisions.length) fields(SHEET_HEADINGS.decisions, sheet.decisions);
  if (sheet.instruments.length) fields(SHEET_HEADINGS.instruments, sheet.instruments);
  if (sheet.corrections.length) heading(SHEET_HEADINGS.corrections);
  for (const c of sheet.corrections) {
    ensure(14);
    doc
      .font('Helvetica-Bold')
      .fontSize(9)
      .text(pdfText(`${c.position ?? '?'}. ${c.text}`), left, doc.y, { width });
    for (const v of c.versions) line(`Step ${c.position ?? '?'}`, v);
  }
  if (sheet.photos) line('Photos', sheet.photos);

  fields(SHEET_HEADINGS.signature, sheet.signature);

  doc.end();
  return done;
}
