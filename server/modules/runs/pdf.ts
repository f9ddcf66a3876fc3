import PDFDocument from 'pdfkit';
import type { RunView } from '../../../shared/schemas/runs';
import { formatNumber, formatQuantity } from '../../../shared/units/format';

/** The standing safety caution, printed on every run sheet. */
export const RUN_SHEET_CAUTION =
  'Lethal voltages. Valve equipment holds hundreds of volts DC, and filter capacitors stay charged after switch-off. ' +
  'Work one hand, bring new or repaired units up on an isolation transformer or a current-limited supply, and discharge ' +
  'and verify with a meter before touching. This run sheet records what was measured and that a qualified person approved ' +
  'the procedure followed; it does not make the procedure or the unit safe. Follow your local electrical codes and licensed practice.';

// The built-in PDF fonts speak WinAnsi only: spell out what they cannot draw.
const SPELLED: Record<string, string> = {
  Ω: ' ohm',
  '\u2126': ' ohm',
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
  [...s.replace(/ ?Ω/g, ' ohm')]
    .map(
      (c) =>
        SPELLED[c] ??
        ((c.codePointAt(0)! < 256 && c >= ' ') || WIN_ANSI_EXTRA.has(c) ? c : c === '\n' ? c : '?'),
    )
    .join('');

const utc = (iso: string | null) => (iso ? `${iso.slice(0, 19).replace('T', ' ')} UTC` : '—');
const qty = (v: number | null, unit: string | null) => (v === null ? '—' : formatQuantity(v, unit ?? '', 4));

/** A run sheet for the customer's file: unit, revision and its approval record, readings, checks, signature, caution. */
export function renderRunSheetPdf(run: RunView): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margin: 40,
    info: {
      Title: pdfText(`Run sheet: ${run.title}`),
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
      .fillColor('#2b2a28')
      .moveDown(0.2);
  };
  const line = (label: string, value: string) => {
    ensure(14);
    doc
      .font('Helvetica-Bold')
      .fontSize(9)
      .text(pdfText(`${label}: `), left, doc.y, { continued: true, width })
      .font('Helvetica')
      .text(pdfText(value));
  };

  doc
    .font('Helvetica-Bold')
    .fontSize(16)
    .text(pdfText(`Run sheet: ${run.title}`), { width });
  doc
    .font('Helvetica')
    .fontSize(9)
    .fillColor('#5a5650')
    .text(pdfText(`Benchwright bench run ${run.id}`))
    .fillColor('#2b2a28');
  const alert = (t: string) =>
    doc
      .moveDown(0.3)
      .font('Helvetica-Bold')
      .fontSize(11)
      .fillColor('#a3261b')
      .text(pdfText(t), { width })
      .fillColor('#2b2a28');
  if (run.closed)
    alert(
      `ABANDONED, NOT SIGNED: closed by ${run.closed.by.displayName}, ${utc(run.closed.at)}. Reason: ${run.closed.reason}`,
    );
  else if (run.status !== 'signed') alert('NOT SIGNED: this bench run is still in progress.');
  if (run.hold)
    alert(
      `ON HOLD: revision ${run.hold.revisionNumber} was withdrawn by ${run.hold.by}, ${utc(run.hold.at)}. Reason: ${run.hold.reason}`,
    );
  if (run.outOfTolerance) {
    doc
      .moveDown(0.3)
      .font('Helvetica-Bold')
      .fontSize(11)
      .fillColor('#a3261b')
      .text(`OUT OF TOLERANCE: ${run.progress.outOfTolerance} reading(s) outside their band.`)
      .fillColor('#2b2a28');
  }

  // Caution box
  doc.moveDown(0.5);
  const cautionTop = doc.y;
  doc.font('Helvetica').fontSize(8.5);
  const cautionHeight = doc.heightOfString(pdfText(RUN_SHEET_CAUTION), { width: width - 20 }) + 22;
  doc.rect(left, cautionTop, width, cautionHeight).fill('#f9c300');
  doc
    .fillColor('#111111')
    .font('Helvetica-Bold')
    .fontSize(9)
    .text('SAFETY CAUTION', left + 10, cautionTop + 6, { width: width - 20 });
  doc
    .font('Helvetica')
    .fontSize(8.5)
    .text(pdfText(RUN_SHEET_CAUTION), left + 10, doc.y, { width: width - 20 });
  doc.y = cautionTop + cautionHeight + 4;
  doc.fillColor('#2b2a28');

  heading('Unit');
  line('Model', run.unit.model);
  line('Serial', run.unit.serial);
  line('Owner', run.unit.owner || '—');
  line('Job number', run.unit.jobNumber || '—');

  heading('Procedure followed and its approval record');
  line('Procedure', run.revision.title);
  line(
    'Revision',
    `${run.revision.number} (${run.revision.state}), approved ${utc(run.revision.approvedAt)}`,
  );
  line('Author', run.revision.author.displayName);
  line('Revision content SHA-256', run.revision.contentHash);
  if (run.revision.signOffs.length) {
    for (const s of run.revision.signOffs)
      line('Reviewer sign-off', `${s.name}, ${s.meaning}, ${utc(s.signedAt)}`);
  } else {
    line('Reviewer sign-off', 'none recorded for this revision');
  }

  heading('Bench conditions');
  line('Measured mains', formatQuantity(run.params.mainsVoltage, 'V', 4));
  line('Mains frequency', formatQuantity(run.params.mainsFrequency, 'Hz', 3));
  line('Nominal mains of the procedure', formatQuantity(run.params.mainsNominal, 'V', 4));
  line('Started', `${utc(run.startedAt)} by ${run.startedBy.displayName}`);
  for (const h of run.handovers) {
    line(
      'Handed over',
      `${h.from.displayName} handed the run over to ${h.to.displayName}, ${utc(h.at)}${h.by.id !== h.from.id ? ` (reassigned by ${h.by.displayName})` : ''}`,
    );
    line('Reason', h.reason);
  }
  if (run.status === 'in_progress') line('Performed by', run.performedBy.displayName);

  // Readings table
  heading('Readings');
  const cols = [
    { title: 'Reading', w: 0.25 },
    { title: 'Expected band', w: 0.19 },
    { title: 'Measured', w: 0.13 },
    { title: 'Deviation', w: 0.16 },
    { title: 'Mark', w: 0.12 },
    { title: 'Recorded by', w: 0.15 },
  ].map((c) => ({ ...c, w: c.w * width }));
  const row = (cells: string[], bold = false, tint?: string) => {
    doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(8.5);
    const h = Math.max(...cells.map((c, i) => doc.heightOfString(pdfText(c), { width: cols[i]!.w - 6 }))) + 6;
    ensure(h);
    const y = doc.y;
    if (tint) doc.rect(left, y, width, h).fill(tint).fillColor('#2b2a28');
    let x = left;
    cells.forEach((c, i) => {
      doc
        .fillColor(i === 4 && c.startsWith('OUT') ? '#a3261b' : '#2b2a28')
        .text(pdfText(c), x + 3, y + 3, { width: cols[i]!.w - 6 });
      x += cols[i]!.w;
    });
    doc.fillColor('#2b2a28');
    doc.y = y + h;
    doc
      .moveTo(left, doc.y)
      .lineTo(left + width, doc.y)
      .lineWidth(0.3)
      .strokeColor('#d8ccb5')
      .stroke();
  };
  row(
    cols.map((c) => c.title),
    true,
    '#ece4d3',
  );
  const entries = new Map(run.entries.map((e) => [e.stepId, e]));
  for (const step of run.steps.filter((s) => s.kind === 'reading')) {
    const r = step.reading!;
    const e = entries.get(step.id);
    const sign = (x: number) => (x > 0 ? '+' : '');
    const dev =
      e?.deviation != null
        ? `${sign(e.deviation)}${formatQuantity(e.deviation, r.unit, 3)}${e.deviationPercent != null ? ` (${sign(e.deviationPercent)}${formatNumber(e.deviationPercent, 2)} %)` : ''}`
        : '—';
    const mark =
      !e || e.measured === null
        ? 'not recorded'
        : e.within === null
          ? 'no band'
          : e.within
            ? 'within'
            : 'OUT of tolerance';
    row(
      [
        `${step.position}. ${step.text}\n${r.testPoint}`,
        r.bandText ?? r.error ?? '—',
        e?.raw ? `${qty(e.measured, r.unit)}${e.version > 1 ? ' (corrected)' : ''}` : '—',
        dev,
        mark,
        e?.enteredBy.displayName ?? '—',
      ],
      false,
      e?.within === false ? '#f6dcd6' : undefined,
    );
  }

  heading('Check steps and hazard notes');
  for (const step of run.steps.filter((s) => s.kind !== 'reading')) {
    const e = entries.get(step.id);
    const status = e?.done
      ? `${step.kind === 'hazard' ? 'acknowledged' : 'done'} by ${e.enteredBy.displayName}, ${utc(e.enteredAt)}`
      : 'not done';
    ensure(24);
    doc
      .font('Helvetica-Bold')
      .fontSize(8.5)
      .text(pdfText(`${step.position}. ${step.kind === 'hazard' ? 'Hazard note' : 'Check'}: `), left, doc.y, {
        continued: true,
        width,
      })
      .font('Helvetica')
      .text(pdfText(`${step.text.slice(0, 400)} [${status}]`));
    doc.moveDown(0.2);
  }

  const notes = run.entries.filter((e) => e.note.trim());
  const corrections = run.entries.filter((e) => e.history.length > 1);
  if (notes.length || corrections.length) heading('Notes and corrections');
  for (const e of notes)
    line(`Note, step ${run.steps.find((s) => s.id === e.stepId)?.position ?? '?'}`, e.note);
  for (const e of corrections) {
    const step = run.steps.find((s) => s.id === e.stepId);
    for (const h of e.history) {
      line(
        `Step ${step?.position ?? '?'} v${h.version}`,
        `${h.raw ?? (h.done ? 'ticked' : 'unticked')} by ${h.enteredBy.displayName}, ${utc(h.enteredAt)}${h.reason ? `; reason: ${h.reason}` : ''}`,
      );
    }
  }
  if (run.photos.length) line('Photos', `${run.photos.length} photo(s) kept with the run in Benchwright`);

  heading('Signature');
  if (run.signature) {
    line('Signed by', `${run.signature.signer.displayName} (${run.signature.signerRole})`);
    line('Meaning', 'performed: I carried out this bench run and recorded these readings');
    line('Signed at', utc(run.signature.signedAt));
    line('Run content SHA-256', run.signature.contentHash);
    line(
      'Verified on export',
      run.signature.verified
        ? 'yes, the stored content matches the signed hash'
        : 'NO: the content does not match the signed hash',
    );
  } else {
    line('Signed by', 'not signed yet');
  }

  doc.end();
  return done;
}
