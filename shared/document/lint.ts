/**
 * The procedure check: warnings an author sees beside the editor before submitting. Each names the
 * block it is about (by id) so the editor can link to it. Warnings never block saving a draft.
 */
import { HAZARD_DC_VOLTS } from '../standards/thresholds';
import type { Snapshot } from './evaluate';
import { extractBlocks } from './extract';
import type { ProcedureDoc } from './schema';

export type LintCode =
  | 'hazard-note-missing'
  | 'reading-without-tolerance'
  | 'reading-unresolved'
  | 'fuse-reckoner-missing'
  | 'discharge-check-missing'
  | 'reckoner-input-error'
  | 'procedure-error';

export interface LintWarning {
  code: LintCode;
  /** The block the warning is about; null for the procedure as a whole. */
  blockId: string | null;
  message: string;
}

const DISCHARGE_WORDS = /discharg|bleed|drain/i;

/** Highest DC voltage a block produces (outputs in V), for the >60 V DC rule. */
function peakVolts(block: Snapshot['blocks'][number]): number {
  if (!block.ok) return 0;
  let max = 0;
  for (const out of Object.values(block.outputs)) {
    if (out.unit === 'V' && typeof out.value === 'number') max = Math.max(max, Math.abs(out.value));
  }
  return max;
}

export function lintProcedure(doc: ProcedureDoc, snapshot: Snapshot, threshold = HAZARD_DC_VOLTS): LintWarning[] {
  const warnings: LintWarning[] = [];
  const { reckoners, readings, checkSteps, hazardNotes } = extractBlocks(doc);
  const sectionsWithHazard = new Set(hazardNotes.map((h) => h.section));

  let anyHigh = false;
  for (const block of snapshot.blocks) {
    if (!block.ok) {
      for (const e of block.errors) {
        warnings.push({ code: 'reckoner-input-error', blockId: block.id, message: `Reckoner “${block.name}”: ${e.field} ${e.reason}` });
      }
      continue;
    }
    const volts = peakVolts(block);
    if (volts > threshold) {
      anyHigh = true;
      if (!sectionsWithHazard.has(block.section)) {
        warnings.push({
          code: 'hazard-note-missing',
          blockId: block.id,
          message: `Reckoner “${block.name}” gives ${Math.round(volts)} V, above ${threshold} V DC, but its section has no hazard note.`,
        });
      }
    }
  }
  for (const r of snapshot.readings) {
    const high = r.expected !== null && r.unit === 'V' && Math.abs(r.expected) > threshold;
    if (high) {
      anyHigh = true;
      if (!sectionsWithHazard.has(r.section)) {
        warnings.push({ code: 'hazard-note-missing', blockId: r.id, message: `Reading “${r.label}” expects above ${threshold} V, but its section has no hazard note.` });
      }
    }
    if (!r.toleranceText.trim()) warnings.push({ code: 'reading-without-tolerance', blockId: r.id, message: `Reading “${r.label || 'untitled'}” has no tolerance.` });
    else if (r.error) warnings.push({ code: 'reading-unresolved', blockId: r.id, message: `Reading “${r.label || 'untitled'}”: ${r.error}.` });
  }
  const mainsPowered = reckoners.length > 0 || readings.length > 0;
  if (mainsPowered && !reckoners.some((r) => r.kind === 'mains-fuse')) {
    warnings.push({ code: 'fuse-reckoner-missing', blockId: null, message: 'This mains-powered procedure has no mains-fuse reckoner.' });
  }
  if (anyHigh && !checkSteps.some((c) => DISCHARGE_WORDS.test(c.text))) {
    warnings.push({
      code: 'discharge-check-missing',
      blockId: null,
      message: `A node exceeds ${threshold} V DC, but no check step confirms the capacitors are discharged.`,
    });
  }
  for (const e of snapshot.errors) warnings.push({ code: 'procedure-error', blockId: null, message: e.message });
  return warnings;
}
