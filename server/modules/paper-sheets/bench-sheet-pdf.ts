import PDFDocument from 'pdfkit';
import type { BenchSheetModel, BenchSheetStep } from '../../../shared/runs/bench-sheet-model';
import { cautionBox, INK, pageFrame, pdfText, signBand, type Doc } from '../runs/pdf-parts';

const SOFT = '#5a5650';
const RULE = '#8a8275';
/** Share of the width per reading column: step, expected, band, the box to write the reading in. */
const READING_SHARES = [0.4, 0.17, 0.23, 0.2];
const READING_HEAD = ['Reading', 'Expected', 'Band', 'Reading taken'];

/** An empty box to tick, `size` points square, at (x, y). */
const tickBox = (doc: Doc, x: number, y: number, size = 10) =>
  doc.rect(x, y, size, size).lineWidth(0.8).strokeColor(INK).stroke();

/**
 * The blank bench sheet on A4: the approval record and the mains it is worked out for, the standing
 * caution, every step in order (hazard notes under their sign, check steps with a box to tick,
 * readings with expected value, band and an empty box), lines for the bench, and the sheet identifier
 * on every page so the paper can be matched later.
 */
export function renderBenchSheetPdf(sheet: BenchSheetModel): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margin: 40,
    info: { Title: pdfText(sheet.title), Author: 'Benchwright', Subject: sheet.sheetId },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));
  const { left, width, ensure, heading } = pageFrame(doc);
  const stamp = () => {
    const y = doc.y;
    doc
      .font('Helvetica')
      .fontSize(7.5)
      .fillColor(SOFT)
      .text(`Sheet ${sheet.sheetId}`, left, 22, { width, align: 'right', lineBreak: false })
      .fillColor(INK);
    doc.y = y;
  };
  stamp();
  doc.on('pageAdded', stamp);

  doc.font('Helvetica-Bold').fontSize(16).text(pdfText(sheet.title), left, doc.y, { width });
  doc
    .font('Helvetica')
    .fontSize(9)
    .fillColor(SOFT)
    .text(
      pdfText(
        `Blank bench sheet, for copying into a bench run in Benchwright with the date written below. Sheet ${sheet.sheetId}`,
      ),
      { width },
    )
    .fillColor(INK);
  cautionBox(doc, sheet.caution, left, width);

  heading('Procedure and mains');
  for (const f of sheet.procedure) {
    ensure(14);
    doc
      .font('Helvetica-Bold')
      .fontSize(9)
      .text(pdfText(`${f.label}: `), left, doc.y, { continued: true, width })
      .font(f.mono ? 'Courier' : 'Helvetica')
      .text(pdfText(f.value));
  }

  heading('Unit and bench');
  for (const row of sheet.blanks) {
    ensure(26);
    const y = doc.y + 14;
    const cell = width / row.length;
    row.forEach((b, i) => {
      const x = left + i * cell;
      doc
        .font('Helvetica')
        .fontSize(8.5)
        .text(pdfText(b.label), x, y - 10, { width: cell - 12, lineBreak: false });
      doc
        .moveTo(x, y + 8)
        .lineTo(x + cell - 12, y + 8)
        .lineWidth(0.6)
        .strokeColor(RULE)
        .stroke();
    });
    doc.y = y + 14;
  }

  heading('Steps, in order');
  doc
    .font('Helvetica')
    .fontSize(8.5)
    .fillColor(SOFT)
    .text(
      'Tick each check step when done and each hazard note when read; write each reading with its unit. Out of band: stop and tell a senior.',
      left,
      doc.y,
      { width },
    )
    .fillColor(INK)
    .moveDown(0.3);
  let header = false;
  for (const s of sheet.steps) {
    if (s.reading) {
      if (!header) readingRow(doc, READING_HEAD, left, width, { bold: true });
      header = true;
      readingStep(doc, s, left, width, ensure);
    } else {
      header = false;
      otherStep(doc, s, left, width, ensure);
    }
  }

  doc.end();
  return done;
}

function readingRow(
  doc: Doc,
  cells: string[],
  left: number,
  width: number,
  opts: { bold?: boolean; box?: string } = {},
) {
  const cols = READING_SHARES.map((w) => w * width);
  doc.font(opts.bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(8.5);
  const h = Math.max(24, ...cells.map((c, i) => doc.heightOfString(pdfText(c), { width: cols[i]! - 6 }) + 6));
  if (doc.y + h > doc.page.height - doc.page.margins.bottom) doc.addPage();
  const y = doc.y;
  if (opts.bold) doc.rect(left, y, width, h).fill('#ece4d3').fillColor(INK);
  let x = left;
  cells.forEach((c, i) => {
    if (c) doc.fillColor(INK).text(pdfText(c), x + 3, y + 3, { width: cols[i]! - 6 });
    x += cols[i]!;
  });
  if (opts.box !== undefined) {
    // The empty box the reading is written in, its unit printed at its right.
    const bx = x - cols[3]! + 3;
    const bw = cols[3]! - 6;
    doc
      .rect(bx, y + 3, bw, h - 6)
      .lineWidth(0.8)
      .strokeColor(INK)
      .stroke();
    doc
      .font('Helvetica')
      .fontSize(8)
      .fillColor('#5a5650')
      .text(pdfText(opts.box), bx, y + h - 13, { width: bw - 3, align: 'right', lineBreak: false })
      .fillColor(INK);
  }
  doc.y = y + h;
  doc
    .moveTo(left, doc.y)
    .lineTo(left + width, doc.y)
    .lineWidth(0.3)
    .strokeColor('#d8ccb5')
    .stroke();
}

function readingStep(doc: Doc, s: BenchSheetStep, left: number, width: number, ensure: (h: number) => void) {
  const r = s.reading!;
  ensure(30);
  readingRow(
    doc,
    [
      [
        `${s.position}. ${s.text}`,
        r.testPoint,
        r.meterRange && `range ${r.meterRange}`,
        s.live && 'live: unit powered',
      ]
        .filter(Boolean)
        .join('\n'),
      r.expected,
      `${r.band}${r.tolerance ? `\n(${r.tolerance})` : ''}`,
      '',
    ],
    left,
    width,
    { box: r.unit },
  );
}

function otherStep(doc: Doc, s: BenchSheetStep, left: number, width: number, ensure: (h: number) => void) {
  ensure(28);
  doc.moveDown(0.3);
  const y = doc.y;
  tickBox(doc, left, y + 1);
  let x = left + 16;
  // A hazard note leads with its safety sign, as on the run sheet.
  if (s.signal) x += signBand(doc, s.signal, x, y, 12) + 4;
  doc
    .font('Helvetica-Bold')
    .fontSize(8.5)
    .fillColor(INK)
    .text(pdfText(`${s.position}. ${s.signal ? '' : 'Check: '}`), x, y + 2, {
      continued: true,
      width: left + width - x,
    })
    .font('Helvetica')
    .text(pdfText(`${s.text}${s.signal ? ' [read and understood]' : s.live ? ' [live: unit powered]' : ''}`));
  doc.moveDown(0.3);
}
