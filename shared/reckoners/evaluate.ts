/**
 * Evaluate a whole procedure's reckoner blocks in dependency order. An input may be a value, a
 * reference to another block's output ({ ref: "block.outputKey" }) or to a procedure parameter
 * ({ param: "mainsVoltage" }). User mistakes come back as errors; this never throws for them.
 */
import { runReckoner } from './validate';
import { getReckoner } from './registry';
import { BLOCK_NAME, BLOCK_NAME_RULE, isParam, isRef, specAt, withFollowedParams } from './field-paths';
import { unitWithMeasure } from './measures';
import { paramSpec } from './params';
import type { Caution, FieldError, FieldSpec, Measure, Output, ParamKey } from './types';

export interface ProcedureBlock {
  name: string;
  kind: string;
  inputs: Record<string, unknown>;
}

/** Where an input's value came from. `followed`: the field was left empty and follows the parameter. */
export type InputSource =
  { kind: 'typed' } | { kind: 'param'; param: ParamKey; followed: boolean } | { kind: 'ref'; ref: string };

export type BlockResult =
  | {
      name: string;
      kind: string;
      ok: true;
      outputs: Record<string, Output>;
      cautions: Caution[];
      /** The validated input, references resolved, in SI base units. */
      input: Record<string, unknown>;
      /** Where each input value came from, by dotted field path ("windings.0.volts"). */
      sources: Record<string, InputSource>;
    }
  | { name: string; kind: string; ok: false; errors: FieldError[] };

export interface ProcedureError {
  message: string;
  blocks: string[];
}

export interface ProcedureResult {
  /** One result per block, in the order given. */
  blocks: BlockResult[];
  /** Problems of the procedure as a whole: duplicate names, cycles. */
  errors: ProcedureError[];
  /** Evaluation order actually used. */
  order: string[];
}

interface Reference {
  field: string;
  kind: 'ref' | 'param';
  target: string;
  block?: string;
  output?: string;
}

function collectRefs(value: unknown, path: string[], out: Reference[]): void {
  if (isRef(value)) {
    const dot = value.ref.indexOf('.');
    out.push({
      field: path.join('.'),
      kind: 'ref',
      target: value.ref,
      block: dot > 0 ? value.ref.slice(0, dot) : value.ref,
      output: dot > 0 ? value.ref.slice(dot + 1) : undefined,
    });
  } else if (isParam(value)) {
    out.push({ field: path.join('.'), kind: 'param', target: value.param });
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => collectRefs(v, [...path, String(i)], out));
  } else if (typeof value === 'object' && value !== null) {
    for (const [k, v] of Object.entries(value)) collectRefs(v, [...path, k], out);
  }
}

/** Why a value of `unit`/`measure` cannot go into `spec`, or null when it fits. */
function quantityMismatch(spec: FieldSpec | undefined, unit: string, measure: Measure): string | null {
  if (!spec || spec.unit === undefined) return null; // a field whose unit is set by another input
  const want = unitWithMeasure(spec.unit || 'a plain number', spec.measure);
  const have = unitWithMeasure(unit || 'a plain number', measure);
  if (spec.unit !== unit) return `gives ${have}, but this field takes ${want}`;
  if (spec.measure && measure !== spec.measure) return `gives ${have}, but this field takes ${want}`;
  return null;
}

interface ResolveContext {
  fields: FieldSpec[];
  outputsOf: (block: string) => Record<string, Output> | undefined;
  /** The kind of the block of that name, to name it by its label. */
  kindOf: (block: string) => string | undefined;
  params: Record<string, number>;
  followed: Set<string>;
  errors: FieldError[];
  sources: Record<string, InputSource>;
}

/** Replace references with values, checking each against the field's unit and measure. */
function resolve(value: unknown, path: string[], ctx: ResolveContext): unknown {
  const field = path.join('.');
  const spec = specAt(ctx.fields, path);
  if (isRef(value)) {
    const dot = value.ref.indexOf('.');
    const block = value.ref.slice(0, dot);
    const key = value.ref.slice(dot + 1);
    const outputs = ctx.outputsOf(block);
    const out = outputs?.[key];
    if (!outputs) return undefined; // reported before resolving
    if (!out) {
      ctx.errors.push({
        field,
        reason: `refers to a result the ${getReckoner(ctx.kindOf(block) ?? '')?.label ?? 'other'} block does not give ("${key}"); it gives ${Object.values(
          outputs,
        )
          .map((o) => `“${o.label}”`)
          .join(', ')}`,
      });
      return undefined;
    }
    const wrong =
      typeof out.value === 'number'
        ? quantityMismatch(spec, out.unit, out.measure)
        : spec?.kind === 'select' || spec?.kind === 'text'
          ? null
          : 'is not a number';
    if (wrong) {
      ctx.errors.push({ field, reason: `refers to "${value.ref}" (${out.label}), which ${wrong}` });
      return undefined;
    }
    ctx.sources[field] = { kind: 'ref', ref: value.ref };
    return out.value;
  }
  if (isParam(value)) {
    const v = ctx.params[value.param];
    const p = paramSpec(value.param);
    // A field left empty follows its parameter only when one is given; otherwise its own default applies.
    if (ctx.followed.has(field) && (typeof v !== 'number' || !Number.isFinite(v))) return undefined;
    if (!p || typeof v !== 'number' || !Number.isFinite(v)) {
      ctx.errors.push({ field, reason: `refers to procedure parameter "${value.param}", which is not set` });
      return undefined;
    }
    const wrong = quantityMismatch(spec, p.unit, p.measure);
    if (wrong) {
      ctx.errors.push({
        field,
        reason: `refers to the procedure’s ${p.label.toLowerCase()}, which ${wrong}`,
      });
      return undefined;
    }
    ctx.sources[field] = { kind: 'param', param: p.key, followed: ctx.followed.has(field) };
    return v;
  }
  if (Array.isArray(value)) return value.map((v, i) => resolve(v, [...path, String(i)], ctx));
  if (typeof value === 'object' && value !== null) {
    const o: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) o[k] = resolve(v, [...path, k], ctx);
    return o;
  }
  if (path.length && value !== undefined && value !== null && value !== '')
    ctx.sources[field] = { kind: 'typed' };
  return value;
}

export function evaluateProcedure(
  blocks: ProcedureBlock[],
  params: Record<string, number> = {},
): ProcedureResult {
  const results = new Map<number, BlockResult>();
  const errors: ProcedureError[] = [];
  const fail = (i: number, errs: FieldError[]) => {
    const b = blocks[i]!;
    results.set(i, { name: String(b?.name ?? ''), kind: String(b?.kind ?? ''), ok: false, errors: errs });
  };

  // Names: valid and unique; a duplicate makes every reference to that name ambiguous.
  const byName = new Map<string, number>();
  const duplicates = new Set<string>();
  blocks.forEach((b, i) => {
    if (typeof b?.name !== 'string' || !BLOCK_NAME.test(b.name)) {
      fail(i, [{ field: 'name', reason: `a block name ${BLOCK_NAME_RULE}` }]);
      return;
    }
    if (byName.has(b.name)) duplicates.add(b.name);
    else byName.set(b.name, i);
  });
  for (const name of duplicates) {
    const idx = blocks.map((b, i) => (b?.name === name ? i : -1)).filter((i) => i >= 0);
    errors.push({ message: `more than one block is named "${name}"`, blocks: [name] });
    idx.forEach((i) => fail(i, [{ field: 'name', reason: `another block is also named "${name}"` }]));
    byName.delete(name);
  }

  // Dependencies.
  const deps = new Map<number, Set<number>>();
  blocks.forEach((b, i) => {
    if (results.has(i)) return;
    if (!getReckoner(b.kind)) {
      fail(i, [{ field: 'kind', reason: `unknown reckoner "${String(b.kind)}"` }]);
      return;
    }
    const refs: Reference[] = [];
    collectRefs(b.inputs ?? {}, [], refs);
    const errs: FieldError[] = [];
    const set = new Set<number>();
    for (const r of refs) {
      if (r.kind !== 'ref') continue;
      if (!r.output) {
        errs.push({
          field: r.field,
          reason: `reference "${r.target}" must name a block and an output, as "block.output"`,
        });
        continue;
      }
      const target = byName.get(r.block!);
      if (target === undefined) {
        errs.push({
          field: r.field,
          reason: duplicates.has(r.block!)
            ? `refers to "${r.target}", but more than one block is named "${r.block}"`
            : `refers to "${r.target}", but there is no block named "${r.block}" in this procedure`,
        });
      } else if (target === i) {
        errs.push({ field: r.field, reason: `refers to "${r.target}", an output of this same block` });
      } else set.add(target);
    }
    if (errs.length) fail(i, errs);
    else deps.set(i, set);
  });

  // Kahn's algorithm over blocks still in play; keeps the author's order among ready blocks.
  const indegree = new Map<number, number>();
  const dependents = new Map<number, number[]>();
  for (const [i, set] of deps) {
    indegree.set(i, set.size);
    for (const d of set) dependents.set(d, [...(dependents.get(d) ?? []), i]);
  }
  const order: number[] = [];
  const ready = [...deps.keys()].filter((i) => indegree.get(i) === 0).sort((a, b) => a - b);
  while (ready.length) {
    const i = ready.shift()!;
    order.push(i);
    for (const j of dependents.get(i) ?? []) {
      const n = indegree.get(j)! - 1;
      indegree.set(j, n);
      if (n === 0) {
        ready.push(j);
        ready.sort((a, b) => a - b);
      }
    }
  }
  // Whatever is left depends on a cycle (or is on one).
  const stuck = [...deps.keys()].filter((i) => !order.includes(i));
  if (stuck.length) {
    for (const cycle of findCycles(stuck, deps)) {
      const names = cycle.map((i) => blocks[i]!.name);
      errors.push({
        message: `blocks refer to each other in a cycle: ${[...names, names[0]].join(' → ')}`,
        blocks: names,
      });
    }
    for (const i of stuck) {
      const waitsOn = [...deps.get(i)!].filter((d) => stuck.includes(d)).map((d) => blocks[d]!.name);
      fail(i, [
        {
          field: 'inputs',
          reason: `cannot be evaluated: it depends on a reference cycle (through ${waitsOn.map((n) => `"${n}"`).join(', ')})`,
        },
      ]);
    }
  }

  // Evaluate.
  const outputsOf = (name: string) => {
    const idx = byName.get(name);
    const r = idx === undefined ? undefined : results.get(idx);
    return r && r.ok ? r.outputs : undefined;
  };
  for (const i of order) {
    const b = blocks[i]!;
    // Named by kind (the label people know), not by the internal name references use.
    const failedDeps = [...deps.get(i)!]
      .filter((d) => !results.get(d)?.ok)
      .map((d) => `the ${getReckoner(String(blocks[d]!.kind))?.label ?? 'other'} block`);
    if (failedDeps.length) {
      fail(i, [
        {
          field: 'inputs',
          reason: `depend on ${[...new Set(failedDeps)].join(' and ')}, which has problems of its own`,
        },
      ]);
      continue;
    }
    const fields = getReckoner(b.kind)!.fields;
    const { inputs, followed } = withFollowedParams(b.inputs ?? {}, fields);
    const kindOf = (name: string) => {
      const idx = byName.get(name);
      return idx === undefined ? undefined : String(blocks[idx]!.kind);
    };
    const ctx: ResolveContext = { fields, outputsOf, kindOf, params, followed, errors: [], sources: {} };
    const resolved = resolve(inputs, [], ctx);
    if (ctx.errors.length) {
      fail(i, ctx.errors);
      continue;
    }
    let run;
    try {
      run = runReckoner(b.kind, resolved);
    } catch (e) {
      run = {
        ok: false as const,
        errors: [{ field: '', reason: `internal error: ${e instanceof Error ? e.message : String(e)}` }],
      };
    }
    results.set(
      i,
      run.ok
        ? {
            name: b.name,
            kind: b.kind,
            ...run,
            cautions: [...typedFollowers(fields, ctx.sources), ...run.cautions],
            sources: ctx.sources,
          }
        : { name: b.name, kind: b.kind, ok: false, errors: run.errors },
    );
  }

  return {
    blocks: blocks.map((_, i) => results.get(i)!),
    errors,
    order: order.map((i) => blocks[i]!.name),
  };
}

/**
 * A field declared to follow a parameter but typed instead: on the bench it stays as typed. For the
 * measured mains that makes a run's expected values ignore the mains the technician measured.
 */
function typedFollowers(fields: FieldSpec[], sources: Record<string, InputSource>): Caution[] {
  const out: Caution[] = [];
  for (const f of fields) {
    if (!f.follows || sources[f.key]?.kind !== 'typed') continue;
    const p = paramSpec(f.follows)!;
    out.push({
      level: f.follows === 'mainsVoltage' ? 'warning' : 'note',
      code: 'parameter-typed',
      field: f.key,
      message:
        f.follows === 'mainsVoltage'
          ? `${f.label} is typed, so bench runs will not work this block out again at the mains the technician measures. Leave it empty (or set it to the procedure’s ${p.label.toLowerCase()}) unless the figure must stay fixed.`
          : `${f.label} is typed instead of following the procedure’s ${p.label.toLowerCase()}; a change to the procedure’s figure will not reach this block.`,
    });
  }
  return out;
}

/** The elementary cycles among `nodes` reachable by following dependencies (one per cycle set). */
function findCycles(nodes: number[], deps: Map<number, Set<number>>): number[][] {
  const inSet = new Set(nodes);
  const seen = new Set<string>();
  const cycles: number[][] = [];
  const state = new Map<number, 0 | 1 | 2>();
  const stack: number[] = [];
  const visit = (u: number) => {
    state.set(u, 1);
    stack.push(u);
    for (const v of deps.get(u) ?? []) {
      if (!inSet.has(v)) continue;
      if (state.get(v) === 1) {
        const cyc = stack.slice(stack.indexOf(v)).reverse(); // dependency order: v needs …
        const key = [...cyc].sort((a, b) => a - b).join(',');
        if (!seen.has(key)) {
          seen.add(key);
          cycles.push(cyc);
        }
      } else if (!state.get(v)) visit(v);
    }
    stack.pop();
    state.set(u, 2);
  };
  for (const n of nodes) if (!state.get(n)) visit(n);
  return cycles;
}
