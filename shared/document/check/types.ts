import type { Snapshot } from '../evaluate';
import type { DocBlocks, Placed } from '../extract';
import type { CheckStepAttrs, HazardFlag, HazardNoteAttrs, ProcedureDoc, ReadingAttrs } from '../schema';

/** The safety-sign levels, as reckoner cautions use them. */
export type CheckLevel = 'danger' | 'warning' | 'note';

export type LintCode =
  | 'reckoner-caution'
  | 'reckoner-input-error'
  | 'procedure-error'
  | 'hazard-note-missing'
  | 'live-step-unguarded'
  | 'discharge-check-missing'
  | 'discharge-threshold-high'
  | 'wait-shorter-than-bleeder'
  | 'capacitor-rating-low'
  | 'part-values-differ'
  | 'reading-without-tolerance'
  | 'reading-unresolved'
  | 'reading-mains-unstated'
  | 'hold-point-without-band'
  | 'fuse-reckoner-missing'
  | 'block-empty';

export interface LintWarning {
  code: LintCode;
  level: CheckLevel;
  /** The block the warning is about; null for the procedure as a whole. */
  blockId: string | null;
  message: string;
  /** For 'reckoner-caution': the reckoner's own caution code ('quick-acting-fuse', 'local-codes', …). */
  caution?: string;
}

/** The shop's settings for the check. */
export interface CheckOptions {
  /** Highest voltage treated as safe to touch, V DC. */
  safeVoltage: number;
  /** How far above nominal the mains may run, in %, for the capacitor-rating figure. */
  highMainsPercent: number;
}

export type CheckedReading = ReadingAttrs & Placed;
export type CheckedStep = CheckStepAttrs & Placed;
export type CheckedNote = HazardNoteAttrs & Placed & { text: string };

/** What every rule reads: the document's blocks in order, the snapshot and the shop's options. */
export interface CheckContext {
  doc: ProcedureDoc;
  snapshot: Snapshot;
  options: CheckOptions;
  blocks: DocBlocks;
  /** Check steps and readings in document order. */
  steps: ({ type: 'check'; step: CheckedStep } | { type: 'reading'; step: CheckedReading })[];
  /** Hazard notes earlier in the same section. */
  notesBefore(at: Placed): CheckedNote[];
  /** The flags stated by the notes that govern a step: earlier in its section, or above the first heading. */
  flagsInScope(at: Placed): Set<HazardFlag>;
  /** The snapshot again with the mains at its high limit (computed once, on first use). */
  atHighMains(): Snapshot;
}

export interface Finding {
  blockId: string | null;
  message: string;
  /** Overrides the rule's level (a reckoner caution brings its own). */
  level?: CheckLevel;
  caution?: string;
}

/** One rule of the check: one code, one small function. */
export interface Rule {
  code: LintCode;
  level: CheckLevel;
  run(ctx: CheckContext): Finding[];
}
