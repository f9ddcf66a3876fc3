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
import { drawRunPictures } from './pdf-reckoner-pictures';
import { cautionBox, INK, pageFrame, pdfText, signBand } from './pdf-parts';

export { pdfText } from './pdf-parts';

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
  const { left, width, ensure, heading } = pageFrame(doc);
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

  cautionBox(doc, sheet.caution, left, width);

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
  drawRunPictures(doc, run, { left, width, heading, ensure, text: pdfText });

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

  if (sheet.followUp.length) fields(SHEET_HEADINGS.followUp, sheet.followUp);
  fields(SHEET_HEADINGS.signature, sheet.signature);
  fields(SHEET_HEADINGS.release, sheet.release);

  doc.end();
  return done;
}
