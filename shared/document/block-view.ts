/**
 * What a reader or reviewer sees of each reckoner block: every input the author chose — value,
 * unit, measure and where it came from — beside the outputs, in the order the author sees them
 * (the registry's field order; the reckoner's output declaration order). The one description used
 * by the reader, the review page and the review diff.
 *
 * Stored snapshots keep outputs in jsonb, which does not keep key order, and older snapshots carry
 * no validated input or sources: both are worked out again here from the document's own inputs.
 */
import { getReckoner, validateInputs, type AnyReckoner, type Caution, type FieldSpec, type Output } from '../reckoners';
import { formatNumber, formatQuantity, parseQuantity } from '../units';
import type { BlockSnapshot, Snapshot } from './evaluate';
import { extractBlocks } from './extract';
import { PARAM_SPECS } from './params';
import type { ProcedureDoc, ReckonerAttrs } from './schema';

// Until the shared measure and parameter-following declarations land in the registry types,
// read them where present without depending on them.
export type Measure = 'rms' | 'peak' | 'peak-to-peak' | 'dc' | 'scalar';
type StoredSource = { kind: 'typed' } | { kind: 'param'; param: string; followed: boolean } | { kind: 'ref'; ref: string };
const measureOfSpec = (s: FieldSpec) => (s as FieldSpec & { measure?: Measure }).measure;
const followsOf = (s: FieldSpec) => (s as FieldSpec & { follows?: string }).follows;
const measureOfOutput = (o: Output) => (o as Output & { measure?: Measure }).measure;

export const MEASURE_WORDS: Record<Measure, string> = { rms: 'rms', peak: 'peak', 'peak-to-peak': 'peak-to-peak', dc: 'DC', scalar: '' };

/** Where an input's value came from. */
export type InputOrigin =
  | { kind: 'typed' }
  /** Left empty; the registry's default applies. */
  | { kind: 'default' }
  /** Left empty and optional: no value. */
  | { kind: 'empty' }
  /** `followed`: the field was left empty and follows the parameter by declaration. */
  | { kind: 'param'; param: string; paramLabel: string; followed: boolean }
  | { kind: 'ref'; blockId: string | null; block: string; output: string; outputLabel: string };

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

const isObj = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const isRef = (v: unknown): v is { ref: string } => isObj(v) && typeof v.ref === 'string';
const isParam = (v: unknown): v is { param: string } => isObj(v) && typeof v.param === 'string';
const isEmpty = (v: unknown) => v === undefined || v === null || (typeof v === 'string' && v.trim() === '');
const isNumeric = (s: FieldSpec) => s.kind === 'quantity' || s.kind === 'number' || s.kind === 'integer';

/** The text column that names a row ("HT", "Heaters"), if the rows have one. */
const rowNameColumn = (rows: FieldSpec) => rows.columns?.find((c) => c.kind === 'text');

/** "Secondary windings, row 2 (HT): Winding voltage" for "windings.1.volts"; the path itself if unknown. */
export function fieldLabel(fields: readonly FieldSpec[], path: string, input?: Record<string, unknown>): string {
  const [head, index, col] = path.split('.');
  const spec = fields.find((f) => f.key === head);
  if (!spec) return { name: 'Block name', kind: 'Reckoner', inputs: 'Inputs', '': 'Block' }[path] ?? path;
  if (spec.kind !== 'rows' || index === undefined || !/^\d+$/.test(index)) return spec.label;
  const nameCol = rowNameColumn(spec);
  const rowValue = (input?.[spec.key] as unknown[] | undefined)?.[Number(index)];
  const rowName = nameCol && isObj(rowValue) && typeof rowValue[nameCol.key] === 'string' ? (rowValue[nameCol.key] as string).trim() : '';
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
 * came from — for snapshots stored before blocks carried their input and sources.
 */
function resolveRaw(fields: readonly FieldSpec[], raw: Record<string, unknown>, ctx: Context, prefix: string, sources: Record<string, StoredSource>) {
  const out: Record<string, unknown> = {};
  for (const f of fields) {
    const path = prefix ? `${prefix}.${f.key}` : f.key;
    let v = raw[f.key];
    if (f.kind === 'rows') {
      out[f.key] = Array.isArray(v) ? v.map((row, i) => (isObj(row) ? resolveRaw(f.columns ?? [], row, ctx, `${path}.${i}`, sources) : row)) : v;
      continue;
    }
    const follows = followsOf(f);
    const followed = isEmpty(v) && follows !== undefined;
    if (followed) v = { param: follows };
    if (isRef(v)) {
      const [block = '', key = ''] = [v.ref.slice(0, v.ref.indexOf('.')), v.ref.slice(v.ref.indexOf('.') + 1)];
      const target = ctx.byName.get(block);
      sources[path] = { kind: 'ref', ref: v.ref };
      out[f.key] = target?.ok ? target.outputs[key]?.value : undefined;
    } else if (isParam(v)) {
      sources[path] = { kind: 'param', param: v.param, followed };
      out[f.key] = ctx.params[v.param];
    } else {
      if (!isEmpty(v)) sources[path] = { kind: 'typed' };
      out[f.key] = v;
    }
  }
  return out;
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

function originOf(stored: StoredSource | undefined, spec: FieldSpec, value: unknown, ctx: Context): InputOrigin {
  if (!stored) return isEmpty(value) ? { kind: 'empty' } : spec.default !== undefined ? { kind: 'default' } : { kind: 'typed' };
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
    return { kind: 'ref', blockId: target?.id ?? null, block, output, outputLabel };
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
      return `output “${o.outputLabel}” of block “${o.block}”`;
  }
}

function formatInput(spec: FieldSpec, value: unknown): string {
  if (value === undefined || value === null || value === '') return '—';
  if (typeof value === 'number') return spec.unit ? formatQuantity(value, spec.unit, 4) : formatNumber(value, 4);
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (spec.kind === 'select') return spec.options?.find((o) => o.value === value)?.label ?? String(value);
  return String(value);
}

function inputRows(def: AnyReckoner, input: Record<string, unknown>, sources: Record<string, StoredSource>, ctx: Context): InputRow[] {
  const rows: InputRow[] = [];
  const visit = (fields: readonly FieldSpec[], obj: Record<string, unknown>, prefix: string, inRow: boolean) => {
    for (const f of fields) {
      const path = prefix ? `${prefix}.${f.key}` : f.key;
      const value = obj[f.key];
      if (f.kind === 'rows') {
        if (Array.isArray(value)) value.forEach((row, i) => isObj(row) && visit(f.columns ?? [], row, `${path}.${i}`, true));
        continue;
      }
      // A row's own name is in the row's label, not a figure of its own.
      if (inRow && f.kind === 'text') continue;
      const source = originOf(sources[path], f, value, ctx);
      const measure = measureOfSpec(f);
      rows.push({
        path,
        label: fieldLabel(def.fields, path, input),
        value: value === undefined ? null : (value as InputRow['value']),
        formatted: formatInput(f, value),
        unit: f.unit ?? '',
        measure: measure && measure !== 'scalar' ? measure : null,
        source,
        sourceText: sourceText(source),
      });
    }
  };
  visit(def.fields, input, '', false);
  return rows;
}

/** Output keys in the reckoner's declaration order: computed again, since jsonb keeps no key order. */
function declaredOrder(def: AnyReckoner, input: unknown, stored: string[]): string[] {
  let declared: string[] = [];
  try {
    declared = Object.keys(def.compute(input).outputs);
  } catch {
    // The stored outputs are what was signed; without a fresh run they keep their stored order.
  }
  return [...declared.filter((k) => stored.includes(k)), ...stored.filter((k) => !declared.includes(k))];
}

function outputRow(key: string, o: Output): OutputRow {
  const m = measureOfOutput(o);
  return {
    key,
    label: o.label,
    value: o.value,
    formatted: o.formatted,
    unit: o.unit ?? '',
    measure: m && m !== 'scalar' ? m : null,
    explanation: o.explanation,
    ...(o.source && { source: o.source }),
  };
}

export function describeBlock(node: ReckonerAttrs & { section?: string }, stored: BlockSnapshot | undefined, ctx: Context): BlockView {
  const def = getReckoner(node.kind);
  const base = { id: node.id, name: node.name, kind: node.kind, label: def?.label ?? stored?.label ?? node.kind, section: node.section ?? stored?.section ?? '' };
  const storedOutputs = stored?.ok ? stored.outputs : {};
  if (!def) {
    return { ...base, ok: false, inputs: [], outputs: [], errors: [{ field: 'Reckoner', reason: `unknown reckoner “${node.kind}”` }], cautions: [] };
  }
  const given = stored?.ok ? (stored as { input?: Record<string, unknown>; sources?: Record<string, StoredSource> }) : {};
  let input: Record<string, unknown>;
  let sources: Record<string, StoredSource>;
  let valid: boolean;
  if (given.input && given.sources) {
    [input, sources, valid] = [given.input, given.sources, true];
  } else {
    sources = {};
    const resolved = resolveRaw(def.fields, node.inputs ?? {}, ctx, '', sources);
    const checked = validateInputs(node.kind, resolved);
    valid = checked.ok;
    input = checked.ok ? (checked.input as Record<string, unknown>) : readEach(def.fields, resolved);
  }
  const keys = Object.keys(storedOutputs);
  const order = valid && stored?.ok ? declaredOrder(def, input, keys) : keys;
  return {
    ...base,
    ok: !!stored?.ok,
    inputs: inputRows(def, input, sources, ctx),
    outputs: order.map((k) => outputRow(k, storedOutputs[k]!)),
    errors: stored && !stored.ok ? stored.errors.map((e) => ({ field: fieldLabel(def.fields, e.field, input), reason: e.reason })) : stored ? [] : [{ field: 'Block', reason: 'missing from the stored results' }],
    cautions: stored?.ok ? stored.cautions : [],
  };
}

function readEach(fields: readonly FieldSpec[], raw: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const f of fields) {
    const v = raw[f.key];
    out[f.key] = f.kind === 'rows' ? (Array.isArray(v) ? v.map((r) => (isObj(r) ? readEach(f.columns ?? [], r) : r)) : v) : readAlone(f, v);
  }
  return out;
}

/** Every reckoner block of a revision, in document order, described from its document and stored snapshot. */
export function describeBlocks(doc: ProcedureDoc, snapshot: Snapshot): BlockView[] {
  const ctx: Context = { params: snapshot.params ?? {}, byName: new Map(snapshot.blocks.map((b) => [b.name, b])) };
  const byId = new Map(snapshot.blocks.map((b) => [b.id, b]));
  return extractBlocks(doc).reckoners.map((node) => describeBlock(node, byId.get(node.id) ?? ctx.byName.get(node.name), ctx));
}

export function describeParams(snapshot: Snapshot): ParamRow[] {
  return PARAM_SPECS.flatMap((p) => {
    const v = snapshot.params?.[p.key];
    if (typeof v !== 'number') return [];
    const measure = (p as { measure?: Measure }).measure;
    return [{ key: p.key, label: p.label, value: v, formatted: formatQuantity(v, p.unit, 4), measure: measure && measure !== 'scalar' ? measure : null }];
  });
}

export function describeRevision(doc: ProcedureDoc, snapshot: Snapshot): RevisionFigures {
  return { params: describeParams(snapshot), blocks: describeBlocks(doc, snapshot), readings: snapshot.readings };
}
