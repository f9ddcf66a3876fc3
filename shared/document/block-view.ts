/**
 * What a reader or reviewer sees of each reckoner block: every input the author chose — value,
 * unit, measure and where it came from — beside the outputs, in the order the author sees them
 * (the registry's field order; the reckoner's output declaration order). The one description used
 * by the reader, the review page and the review diff.
 *
 * Stored snapshots keep outputs in jsonb, which does not keep key order, and older snapshots carry
 * no validated input or sources: both are worked out again here from the document's own inputs.
 */
import { isEmptyInput, isParam, isRef, withFollowedParams } from '../reckoners/field-paths';
import { MEASURE_WORDS } from '../reckoners/measures';
import {
  getReckoner,
  validateInputs,
  type AnyReckoner,
  type Caution,
  type FieldSpec,
  type InputSource,
  type Measure,
  type Output,
} from '../reckoners';
import { formatNumber, formatQuantity, parseQuantity } from '../units';
import { humanize, rowFieldLabel } from '../schemas/problems';
import type { BlockSnapshot, Snapshot } from './evaluate';
import { extractBlocks } from './extract';
import { PARAM_SPECS } from './params';
import type { ProcedureDoc, ReckonerAttrs } from './schema';

export type { Measure };
type AcMeasure = Exclude<Measure, 'scalar'>;
const named = (m: Measure | undefined): AcMeasure | null => (m && m !== 'scalar' ? m : null);

/** Where an input's value came from. */
export type InputOrigin =
  | { kind: 'typed' }
  /** Left empty; the registry's default applies. */
  | { kind: 'default' }
  /** Left empty and optional: no value. */
  | { kind: 'empty' }
  /** `followed`: the field was left empty and follows the parameter by declaration. */
  | { kind: 'param'; param: string; paramLabel: string; followed: boolean }
  | {
      kind: 'ref';
      blockId: string | null;
      /** The block's internal name, for matching only: people see `blockLabel`. */
      block: string;
      /** The referred block's reckoner label ("Loaded B+"). */
      blockLabel: string;
      output: string;
      outputLabel: string;
    };

export interface InputRow {
  /** Dotted field path ("windings.1.volts"): for matching only, never shown. */
  path: string;
  /** In the registry's words: "Secondary windings, row 2 (HT): Winding voltage". */
  label: string;
  value: number | string | boolean | null;
  /** With SI prefix and unit ("6.3 V"), an option's label, or "—". */
  formatted: string;
  unit: string;
  /** rms, peak, peak-to-peak or dc for volts and amps. */
  measure: Measure | null;
  source: InputOrigin;
  /** The source in plain words. */
  sourceText: string;
}

export interface OutputRow {
  key: string;
  label: string;
  value: number | string | boolean;
  formatted: string;
  unit: string;
  measure: Measure | null;
  explanation: string;
  source?: string;
}

export interface BlockView {
  id: string;
  name: string;
  kind: string;
  /** The reckoner's label ("Mains fuse"). */
  label: string;
  section: string;
  ok: boolean;
  inputs: InputRow[];
  outputs: OutputRow[];
  /** Input problems, each field named in words. */
  errors: { field: string; reason: string }[];
  cautions: Caution[];
}

export interface ParamRow {
  key: string;
  label: string;
  value: number;
  formatted: string;
  measure: Measure | null;
}

/** A revision's figures in the author's order: parameters, blocks, readings. */
export interface RevisionFigures {
  params: ParamRow[];
  blocks: BlockView[];
  readings: Snapshot['readings'];
}

/** "6.3 V rms", "0.85", "Silicon bridge": a value with its measure, as one phrase. */
export function valueWithMeasure(row: { formatted: string; measure: Measure | null }): string {
  const word = row.measure ? MEASURE_WORDS[row.measure] : '';
  return word && row.formatted !== '—' ? `${row.formatted} ${word}` : row.formatted;
}

const isObj = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);
const isNumeric = (s: FieldSpec) => s.kind === 'quantity' || s.kind === 'number' || s.kind === 'integer';

/** The text column that names a row ("HT", "Heaters"), if the rows have one. */
const rowNameColumn = (rows: FieldSpec) => rows.columns?.find((c) => c.kind === 'text');

/** Names for what a block's problems may be about besides its declared inputs. */
const BLOCK_PARTS: Record<string, string> = {
  name: 'Block name',
  kind: 'Reckoner',
  inputs: 'Inputs',
  '': 'Block',
};

/**
 * An input as a message names it: "Winding 1 voltage" for "windings.0.volts" (the row's noun is its
 * name column's label, rows numbered from 1), "Secondary windings" for the rows themselves.
 */
export function inputLabel(fields: readonly FieldSpec[], path: string): string {
  const [head, index, col] = path.split('.');
  const spec = fields.find((f) => f.key === head);
  if (!spec) return BLOCK_PARTS[path] ?? humanize(path.split('.').pop() ?? path);
  if (spec.kind !== 'rows' || index === undefined || !/^\d+$/.test(index)) return spec.label;
  const noun = rowNameColumn(spec)?.label ?? spec.label;
  const column = col === undefined ? undefined : spec.columns?.find((c) => c.key === col);
  return column ? rowFieldLabel(noun, Number(index) + 1, column.label) : `${noun} ${Number(index) + 1}`;
}

/** "Secondary windings, row 2 (HT): Winding voltage" for "windings.1.volts"; the path itself if unknown. */
export function fieldLabel(
  fields: readonly FieldSpec[],
  path: string,
  input?: Record<string, unknown>,
): string {
  const [head, index, col] = path.split('.');
  const spec = fields.find((f) => f.key === head);
  if (!spec) return BLOCK_PARTS[path] ?? humanize(path.split('.').pop() ?? path);
  if (spec.kind !== 'rows' || index === undefined || !/^\d+$/.test(index)) return spec.label;
  const nameCol = rowNameColumn(spec);
  const rowValue = (input?.[spec.key] as unknown[] | undefined)?.[Number(index)];
  const rowName =
    nameCol && isObj(rowValue) && typeof rowValue[nameCol.key] === 'string'
      ? (rowValue[nameCol.key] as string).trim()
      : '';
  const row = `${spec.label}, row ${Number(index) + 1}${rowName ? ` (${rowName})` : ''}`;
  const column = col === undefined ? undefined : spec.columns?.find((c) => c.key === col);
  return column ? `${row}: ${column.label}` : row;
}

interface Context {
  params: Record<string, number>;
  byName: Map<string, BlockSnapshot>;
}

/**
 * The document's raw inputs with references and parameters replaced by values, and where each
 * came from: the same reading evaluateProcedure makes, for snapshots stored before blocks kept it.
 */
function resolveRaw(fields: readonly FieldSpec[], raw: Record<string, unknown>, ctx: Context) {
  const { inputs, followed } = withFollowedParams(raw, fields);
  const sources: Record<string, InputSource> = {};
  const walk = (v: unknown, path: string): unknown => {
    if (isRef(v)) {
      const dot = v.ref.indexOf('.');
      const target = ctx.byName.get(v.ref.slice(0, dot));
      sources[path] = { kind: 'ref', ref: v.ref };
      return target?.ok ? target.outputs[v.ref.slice(dot + 1)]?.value : undefined;
    }
    if (isParam(v)) {
      const param = PARAM_SPECS.find((p) => p.key === v.param);
      if (param) sources[path] = { kind: 'param', param: param.key, followed: followed.has(path) };
      return ctx.params[v.param];
    }
    if (Array.isArray(v)) return v.map((x, i) => walk(x, `${path}.${i}`));
    if (isObj(v))
      return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, walk(x, path ? `${path}.${k}` : k)]));
    if (path && !isEmptyInput(v)) sources[path] = { kind: 'typed' };
    return v;
  };
  return { resolved: walk(inputs, '') as Record<string, unknown>, sources };
}

/** One raw value read on its own, for a block whose inputs do not validate as a whole. */
function readAlone(spec: FieldSpec, v: unknown): unknown {
  if (!isNumeric(spec) || typeof v !== 'string') return v;
  try {
    return parseQuantity(v, spec.unit ?? '').value;
  } catch {
    return v;
  }
}

function originOf(
  stored: InputSource | undefined,
  spec: FieldSpec,
  value: unknown,
  ctx: Context,
): InputOrigin {
  if (!stored)
    return isEmptyInput(value)
      ? { kind: 'empty' }
      : spec.default !== undefined
        ? { kind: 'default' }
        : { kind: 'typed' };
  if (stored.kind === 'param') {
    const label = PARAM_SPECS.find((p) => p.key === stored.param)?.label ?? stored.param;
    return { kind: 'param', param: stored.param, paramLabel: label, followed: stored.followed };
  }
  if (stored.kind === 'ref') {
    const dot = stored.ref.indexOf('.');
    const block = dot > 0 ? stored.ref.slice(0, dot) : stored.ref;
    const output = dot > 0 ? stored.ref.slice(dot + 1) : '';
    const target = ctx.byName.get(block);
    const outputLabel = (target?.ok ? target.outputs[output]?.label : undefined) ?? output;
    const blockLabel = (target && getReckoner(target.kind)?.label) ?? target?.label ?? 'another';
    return { kind: 'ref', blockId: target?.id ?? null, block, blockLabel, output, outputLabel };
  }
  return { kind: 'typed' };
}

export function sourceText(o: InputOrigin): string {
  switch (o.kind) {
    case 'typed':
      return 'typed';
    case 'default':
      return 'default (left empty)';
    case 'empty':
      return 'not given';
    case 'param':
      return o.followed
        ? `procedure parameter “${o.paramLabel}”, followed because the field was left empty`
        : `procedure parameter “${o.paramLabel}”`;
    case 'ref':
      return `“${o.outputLabel}” from the ${o.blockLabel} block`;
  }
}

/** Typed figures keep four significant figures; a linked output is shown as that output is (three). */
function formatInput(spec: FieldSpec, value: unknown, source: InputOrigin): string {
  if (value === undefined || value === null || value === '') return '—';
  const sig = source.kind === 'ref' ? 3 : 4;
  if (typeof value === 'number')
    return spec.unit ? formatQuantity(value, spec.unit, sig) : formatNumber(value, sig);
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (spec.kind === 'select') return spec.options?.find((o) => o.value === value)?.label ?? String(value);
  return String(value);
}

function inputRows(
  def: AnyReckoner,
  input: Record<string, unknown>,
  sources: Record<string, InputSource>,
  ctx: Context,
): InputRow[] {
  const rows: InputRow[] = [];
  const visit = (
    fields: readonly FieldSpec[],
    obj: Record<string, unknown>,
    prefix: string,
    inRow: boolean,
  ) => {
    for (const f of fields) {
      const path = prefix ? `${prefix}.${f.key}` : f.key;
      const value = obj[f.key];
      if (f.kind === 'rows') {
        if (Array.isArray(value))
          value.forEach((row, i) => isObj(row) && visit(f.columns ?? [], row, `${path}.${i}`, true));
        continue;
      }
      // A row's own name is in the row's label, not a figure of its own.
      if (inRow && f.kind === 'text') continue;
      const source = originOf(sources[path], f, value, ctx);
      rows.push({
        path,
        label: fieldLabel(def.fields, path, input),
        value: value === undefined ? null : (value as InputRow['value']),
        formatted: formatInput(f, value, source),
        unit: f.unit ?? '',
        measure: named(f.measure),
        source,
        sourceText: f.kind === 'select' && source.kind === 'typed' ? 'chosen' : sourceText(source),
      });
    }
  };
  visit(def.fields, input, '', false);
  return rows;
}

/** Declared output order by reckoner and output set: the same set always comes out in the same order. */
const orderCache = new Map<string, string[]>();

/** Output keys in the reckoner's declaration order: computed again, since jsonb keeps no key order. */
function declaredOrder(def: AnyReckoner, input: unknown, stored: string[]): string[] {
  const cacheKey = `${def.kind}\n${[...stored].sort().join('\n')}`;
  const cached = orderCache.get(cacheKey);
  if (cached) return cached;
  let declared: string[] = [];
  try {
    declared = Object.keys(def.compute(input).outputs);
  } catch {
    // The stored outputs are what was signed; without a fresh run they keep their stored order.
    return stored;
  }
  const order = [
    ...declared.filter((k) => stored.includes(k)),
    ...stored.filter((k) => !declared.includes(k)),
  ];
  if (orderCache.size > 1000) orderCache.clear();
  orderCache.set(cacheKey, order);
  return order;
}

function outputRow(key: string, o: Output): OutputRow {
  return {
    key,
    label: o.label,
    value: o.value,
    formatted: o.formatted,
    unit: o.unit ?? '',
    measure: named(o.measure),
    explanation: o.explanation,
    ...(o.source && { source: o.source }),
  };
}

export function describeBlock(
  node: ReckonerAttrs & { section?: string },
  stored: BlockSnapshot | undefined,
  ctx: Context,
): BlockView {
  const def = getReckoner(node.kind);
  const base = {
    id: node.id,
    name: node.name,
    kind: node.kind,
    label: def?.label ?? stored?.label ?? node.kind,
    section: node.section ?? stored?.section ?? '',
  };
  const storedOutputs = stored?.ok ? stored.outputs : {};
  if (!def) {
    return {
      ...base,
      ok: false,
      inputs: [],
      outputs: [],
      errors: [{ field: 'Reckoner', reason: `unknown reckoner “${node.kind}”` }],
      cautions: [],
    };
  }
  const given = stored?.ok
    ? (stored as { input?: Record<string, unknown>; sources?: Record<string, InputSource> })
    : {};
  let input: Record<string, unknown>;
  let sources: Record<string, InputSource>;
  let valid: boolean;
  if (given.input && given.sources) {
    [input, sources, valid] = [given.input, given.sources, true];
  } else {
    let resolved: Record<string, unknown>;
    ({ resolved, sources } = resolveRaw(def.fields, node.inputs ?? {}, ctx));
    const checked = validateInputs(node.kind, resolved);
    valid = checked.ok;
    input = checked.ok ? (checked.input as Record<string, unknown>) : readEach(def.fields, resolved);
  }
  // The document says which fields were left empty: the evaluator may have been handed a
  // document already upgraded to name the parameter, which hides that.
  for (const path of withFollowedParams(node.inputs ?? {}, def.fields).followed) {
    const s = sources[path];
    if (s?.kind === 'param') sources = { ...sources, [path]: { ...s, followed: true } };
  }
  const keys = Object.keys(storedOutputs);
  const order = valid && stored?.ok ? declaredOrder(def, input, keys) : keys;
  return {
    ...base,
    ok: !!stored?.ok,
    inputs: inputRows(def, input, sources, ctx),
    outputs: order.map((k) => outputRow(k, storedOutputs[k]!)),
    errors:
      stored && !stored.ok
        ? stored.errors.map((e) => ({ field: inputLabel(def.fields, e.field), reason: e.reason }))
        : stored
          ? []
          : [{ field: 'Block', reason: 'missing from the stored results' }],
    cautions: stored?.ok ? stored.cautions : [],
  };
}

function readEach(fields: readonly FieldSpec[], raw: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const f of fields) {
    const v = raw[f.key];
    out[f.key] =
      f.kind === 'rows'
        ? Array.isArray(v)
          ? v.map((r) => (isObj(r) ? readEach(f.columns ?? [], r) : r))
          : v
        : readAlone(f, v);
  }
  return out;
}

/** Every reckoner block of a revision, in document order, described from its document and stored snapshot. */
export function describeBlocks(doc: ProcedureDoc, snapshot: Snapshot): BlockView[] {
  const ctx: Context = {
    params: snapshot.params ?? {},
    byName: new Map(snapshot.blocks.map((b) => [b.name, b])),
  };
  const byId = new Map(snapshot.blocks.map((b) => [b.id, b]));
  return extractBlocks(doc).reckoners.map((node) =>
    describeBlock(node, byId.get(node.id) ?? ctx.byName.get(node.name), ctx),
  );
}

export function describeParams(snapshot: Snapshot): ParamRow[] {
  return PARAM_SPECS.flatMap((p) => {
    const v = snapshot.params?.[p.key];
    if (typeof v !== 'number') return [];
    return [
      {
        key: p.key,
        label: p.label,
        value: v,
        formatted: formatQuantity(v, p.unit, 4),
        measure: named(p.measure),
      },
    ];
  });
}

export function describeRevision(doc: ProcedureDoc, snapshot: Snapshot): RevisionFigures {
  return {
    params: describeParams(snapshot),
    blocks: describeBlocks(doc, snapshot),
    readings: snapshot.readings,
  };
}
