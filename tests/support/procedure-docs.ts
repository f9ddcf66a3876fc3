/**
 * Small builders for procedure documents in tests of the procedure check: each returns a plain
 * TipTap node as the server stores it. Block ids are made from the text so a test can name them.
 */
import { evaluateDocument, type Snapshot } from '../../shared/document/evaluate';
import { lintProcedure, type CheckOptions, type LintWarning } from '../../shared/document/lint';
import type { ProcedureParams } from '../../shared/document/params';
import { validateDocument, type DocNode, type ProcedureDoc } from '../../shared/document/schema';

let counter = 0;
const nextId = (prefix: string) => `${prefix}-${String(++counter).padStart(4, '0')}`;

export const mains230: ProcedureParams = { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 };
export const mains120: ProcedureParams = { mainsNominal: 120, mainsVoltage: 120, mainsFrequency: 60 };

/** Every live-work flag a hazard note can carry. */
export const LIVE_WORK = { oneHand: true, isolation: true, currentLimited: true, discharge: true } as const;

const paragraph = (text: string): DocNode => ({ type: 'paragraph', content: [{ type: 'text', text }] });

export const doc = (...content: DocNode[]): ProcedureDoc => ({ type: 'doc', content });
export const heading = (text: string): DocNode => ({
  type: 'heading',
  attrs: { level: 2 },
  content: [{ type: 'text', text }],
});
export const para = paragraph;

export function note(
  text: string,
  flags?: Partial<Record<keyof typeof LIVE_WORK, boolean>>,
  level: 'danger' | 'warning' = 'danger',
  id = nextId('hz'),
): DocNode {
  return {
    type: 'hazardNote',
    attrs: { id, level, ...(flags ? { flags } : {}) },
    content: [paragraph(text)],
  };
}

export function check(text: string, extra: Record<string, unknown> = {}, id = nextId('ck')): DocNode {
  return { type: 'checkStep', attrs: { id, text, ...extra } };
}

/** A discharge-verified step: the capacitors measured below `threshold` with a meter. */
export const verified = (threshold = '60 V', id?: string) =>
  check(
    `Capacitors discharged below ${threshold}, verified with a meter at every filter node.`,
    { kind: 'discharge-verified', threshold },
    id,
  );

export const wait = (seconds: number, drain?: 'bleeder' | 'probe' | 'none', id?: string) =>
  check(`Wait ${seconds} s before going on.`, { kind: 'wait', seconds, ...(drain ? { drain } : {}) }, id);

export function reading(
  label: string,
  unit: string,
  expected: { literal: string } | { ref: string },
  extra: Record<string, unknown> = {},
  id = nextId('rd'),
): DocNode {
  return {
    type: 'reading',
    attrs: {
      id,
      label,
      testPoint: 'TP3 to chassis',
      meterRange: '',
      unit,
      expected,
      tolerance: '±10 %',
      ...extra,
    },
  };
}

export function reckoner(
  name: string,
  kind: string,
  inputs: Record<string, unknown>,
  id = nextId('rk'),
): DocNode {
  return { type: 'reckoner', attrs: { id, name, kind, inputs } };
}

/** A mains fuse sized from the windings, at the nominal mains. */
export const fuse = (
  windings: { label: string; volts: string; amps: string }[],
  extra: Record<string, unknown> = {},
  id?: string,
) =>
  reckoner(
    'fuse',
    'mains-fuse',
    { load: 'windings', windings, mainsVoltage: { param: 'mainsNominal' }, ...extra },
    id,
  );

/** Validated (as the server would), evaluated and checked. Throws if the document would be refused. */
export function checkProcedure(
  d: ProcedureDoc,
  params: ProcedureParams,
  options?: number | Partial<CheckOptions>,
): { warnings: LintWarning[]; snapshot: Snapshot } {
  const v = validateDocument(structuredClone(d));
  if (!v.ok) throw new Error(`test document refused: ${JSON.stringify(v.problems)}`);
  const snapshot = evaluateDocument(v.doc, params);
  return { warnings: lintProcedure(v.doc, snapshot, options), snapshot };
}

/** The check's own findings, without the reckoners' cautions it passes on. */
export const findingsOf = (warnings: LintWarning[]) => warnings.filter((w) => w.code !== 'reckoner-caution');
