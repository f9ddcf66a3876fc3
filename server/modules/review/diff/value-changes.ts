/**
 * The numbers a reviewer must see change, in the author's order: the procedure parameters, then
 * each reckoner block as the document has it — renamed, its inputs (value and where it came from)
 * and its outputs — then each reading's expected value, tolerance and band. Blocks are followed by
 * their stable id, so a renamed block is one block renamed, not one removed and one added.
 * A first revision has nothing to compare with: it lists what was assumed and what follows.
 */
import { getReckoner } from '../../../../shared/reckoners';
import {
  valueWithMeasure,
  type BlockView,
  type InputRow,
  type OutputRow,
  type RevisionFigures,
} from '../../../../shared/document/block-view';
import { withLabel } from '../../../../shared/schemas/problems';
import type { ValueChange } from '../../../../shared/schemas/review';
import { formatQuantity } from '../../../../shared/units/format';

export type { ValueChange };

type Reading = RevisionFigures['readings'][number];

/** A comparable identity of where an input came from: a renamed source block is the same source. */
function sourceKey(row: InputRow): string {
  const s = row.source;
  if (s.kind === 'param') return `param:${s.param}:${s.followed}`;
  if (s.kind === 'ref') return `ref:${s.blockId ?? s.block}:${s.output}`;
  return s.kind;
}

const blockInfo = (b: BlockView) => ({ subject: b.name, blockId: b.id, blockLabel: b.label });

function inputChange(b: BlockView, before: InputRow | undefined, after: InputRow | undefined): ValueChange {
  const row = (after ?? before)!;
  return {
    kind: 'input',
    ...blockInfo(b),
    label: row.label,
    before: before ? valueWithMeasure(before) : null,
    after: after ? valueWithMeasure(after) : null,
    sourceBefore: before?.sourceText ?? null,
    sourceAfter: after?.sourceText ?? null,
  };
}

function outputChange(
  b: BlockView,
  before: OutputRow | undefined,
  after: OutputRow | undefined,
): ValueChange {
  return {
    kind: 'output',
    ...blockInfo(b),
    label: (after ?? before)!.label,
    before: before ? valueWithMeasure(before) : null,
    after: after ? valueWithMeasure(after) : null,
  };
}

/** Pairs of rows by key, in `after`'s order, then rows only in `before`, in theirs. */
function paired<T>(before: T[], after: T[], key: (t: T) => string): [T | undefined, T | undefined][] {
  const old = new Map(before.map((t) => [key(t), t]));
  const now = new Set(after.map(key));
  return [
    ...after.map((t): [T | undefined, T] => [old.get(key(t)), t]),
    ...before.filter((t) => !now.has(key(t))).map((t): [T, undefined] => [t, undefined]),
  ];
}

/**
 * The outputs worth listing for a block seen for the first time: those its reckoner marks as key,
 * and any the procedure uses (in a reading or another block). All, if the reckoner marks none.
 */
export function keyOutputs(block: BlockView, used: Set<string>): OutputRow[] {
  const marked = getReckoner(block.kind)?.keyOutputs;
  if (!marked?.length) return block.outputs;
  return block.outputs.filter(
    (o) => used.has(`${block.name}.${o.key}`) || marked.some((k) => o.key === k || o.key.endsWith(`.${k}`)),
  );
}

/** Outputs referred to elsewhere in the revision, as "block.output". */
function usedOutputs(f: RevisionFigures): Set<string> {
  const used = new Set(f.readings.map((r) => r.expectedSource));
  for (const b of f.blocks)
    for (const i of b.inputs) if (i.source.kind === 'ref') used.add(`${i.source.block}.${i.source.output}`);
  return used;
}

/** A block seen for the first time: what it assumes (inputs given) and what follows (key outputs). */
function newBlock(b: BlockView, used: Set<string>): ValueChange[] {
  if (!b.ok)
    return [
      {
        kind: 'block',
        ...blockInfo(b),
        label: 'problems',
        before: null,
        after: b.errors.map((e) => withLabel(e.field, e.reason)).join('; '),
      },
    ];
  return [
    ...b.inputs.filter((i) => i.source.kind !== 'empty').map((i) => inputChange(b, undefined, i)),
    ...keyOutputs(b, used).map((o) => outputChange(b, undefined, o)),
  ];
}

function blockChanges(before: BlockView, after: BlockView): ValueChange[] {
  const out: ValueChange[] = [];
  if (before.name !== after.name)
    out.push({
      kind: 'block',
      ...blockInfo(after),
      label: 'name',
      before: before.name,
      after: after.name,
      renamedFrom: before.name,
    });
  for (const [a, b] of paired(before.inputs, after.inputs, (r) => r.path)) {
    if (a && b && valueWithMeasure(a) === valueWithMeasure(b) && sourceKey(a) === sourceKey(b)) continue;
    out.push(inputChange(after, a, b));
  }
  const problems = (v: BlockView) =>
    v.ok ? null : v.errors.map((e) => withLabel(e.field, e.reason)).join('; ');
  if (problems(before) !== problems(after))
    out.push({
      kind: 'block',
      ...blockInfo(after),
      label: 'problems',
      before: problems(before),
      after: problems(after),
    });
  for (const [a, b] of paired(before.outputs, after.outputs, (o) => o.key)) {
    if (a && b && valueWithMeasure(a) === valueWithMeasure(b)) continue;
    out.push(outputChange(after, a, b));
  }
  return out;
}

function readingValues(r: Reading): [string, string][] {
  return [
    [
      'expected',
      r.expected === null ? `unresolved (${r.error ?? 'no value'})` : formatQuantity(r.expected, r.unit),
    ],
    ['tolerance', r.toleranceText],
    ['band', r.bandText ?? '—'],
  ];
}

/** One line per reading for a first revision: "350 V ±5 % (332.5 V … 367.5 V)". */
function readingSummary(r: Reading): string {
  const [[, expected], [, tolerance], [, band]] = readingValues(r) as [
    [string, string],
    [string, string],
    [string, string],
  ];
  return r.bandText ? `${expected} ${tolerance} (${band})` : `${expected} ${tolerance}`.trim();
}

/** What a first revision assumes and what follows from it, one row per figure, in the author's order. */
export function firstRevisionFigures(after: RevisionFigures): ValueChange[] {
  const used = usedOutputs(after);
  return [
    ...after.params.map((p): ValueChange => ({
      kind: 'parameter',
      subject: 'Parameters',
      label: p.label,
      before: null,
      after: valueWithMeasure(p),
    })),
    ...after.blocks.flatMap((b) => newBlock(b, used)),
    ...after.readings.map((r): ValueChange => ({
      kind: 'reading',
      subject: r.label || r.id,
      label: 'expected',
      before: null,
      after: readingSummary(r),
    })),
  ];
}

export function valueChanges(before: RevisionFigures | null, after: RevisionFigures): ValueChange[] {
  if (!before) return firstRevisionFigures(after);
  const changes: ValueChange[] = [];
  for (const [a, b] of paired(before.params, after.params, (p) => p.key)) {
    const [x, y] = [a && valueWithMeasure(a), b && valueWithMeasure(b)];
    if (x !== y)
      changes.push({
        kind: 'parameter',
        subject: 'Parameters',
        label: (b ?? a)!.label,
        before: x ?? null,
        after: y ?? null,
      });
  }
  const used = usedOutputs(after);
  for (const [a, b] of paired(before.blocks, after.blocks, (v) => v.id)) {
    if (a && b) changes.push(...blockChanges(a, b));
    else if (b)
      changes.push(
        { kind: 'block', ...blockInfo(b), label: 'added', before: null, after: b.label },
        ...newBlock(b, used),
      );
    else if (a)
      changes.push({ kind: 'block', ...blockInfo(a), label: 'removed', before: a.label, after: null });
  }
  for (const [a, b] of paired(before.readings, after.readings, (r) => r.id)) {
    const r = (b ?? a)!;
    const old = new Map(a ? readingValues(a) : []);
    const now = new Map(b ? readingValues(b) : []);
    for (const label of ['expected', 'tolerance', 'band']) {
      const [x, y] = [old.get(label) ?? null, now.get(label) ?? null];
      if (x !== y) changes.push({ kind: 'reading', subject: r.label || r.id, label, before: x, after: y });
    }
  }
  return changes;
}
