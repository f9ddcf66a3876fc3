/**
 * Field builders: each makes the zod schema and the form FieldSpec of one input from one
 * description, so ranges, defaults and units are written once. Strings are read by the one
 * quantity parser, so "47 µF" and 4.7e-5 are both accepted and errors name the field.
 */
import { z } from 'zod';
import { parseQuantity, QuantityParseError } from '../units/parse';
import { formatQuantity } from '../units/format';
import { measureMismatch } from './measures';
import { splitUnit, type OutputUnit } from './outputs';
import { isEmptyInput } from './field-paths';
import { closestName } from './names';
import { orList } from '../schemas/problems';
import type { FieldSpec, Measure, ParamKey } from './types';

export interface FieldDef<T> {
  spec: Omit<FieldSpec, 'key'>;
  schema: z.ZodType<T>;
}

interface NumericOpts {
  label: string;
  help?: string;
  /** Hard limits: a value outside them is refused. */
  min?: number;
  minExclusive?: boolean;
  max?: number;
  /** The range met in shop work: outside it (inside min/max) the block raises a named caution. */
  plausible?: { min: number; max: number };
  /** The procedure parameter an empty field takes. */
  follows?: ParamKey;
  /** The physical part or figure this is, for the same-part check across blocks. */
  part?: string;
  /** A capacitor's voltage rating, checked against the no-load peak at high mains. */
  rating?: FieldSpec['rating'];
}

function describe(value: number, unit: string): string {
  return unit ? formatQuantity(value, unit, 4) : String(value);
}

function numericSchema(
  unit: string,
  opts: NumericOpts & { integer?: boolean; measure?: Measure },
  dflt: number | undefined,
  optional: boolean,
) {
  return z
    .unknown()
    .optional()
    .transform((raw, ctx): number | undefined => {
      const fail = (message: string) => {
        ctx.addIssue({ code: 'custom', message, input: raw });
        return z.NEVER;
      };
      if (isEmptyInput(raw)) {
        if (dflt !== undefined) return dflt;
        if (optional) return undefined;
        return fail('is required');
      }
      let value: number;
      if (typeof raw === 'number') {
        if (!Number.isFinite(raw)) return fail('must be a finite number');
        value = raw;
      } else if (typeof raw === 'string') {
        try {
          const parsed = parseQuantity(raw, unit);
          const wrong = measureMismatch(raw, parsed, opts.measure);
          if (wrong) return fail(wrong);
          value = parsed.value;
        } catch (e) {
          if (e instanceof QuantityParseError)
            return fail(
              `${e.reason === 'not a number' ? 'is not a number' : `cannot be read: ${e.reason}`} ("${raw}")`,
            );
          throw e;
        }
      } else {
        return fail(
          unit ? `must be a number or a quantity such as "${describe(1, unit)}"` : 'must be a number',
        );
      }
      if (opts.integer && !Number.isInteger(value)) return fail('must be a whole number');
      if (opts.min !== undefined) {
        if (opts.minExclusive && !(value > opts.min))
          return fail(`must be greater than ${describe(opts.min, unit)}`);
        if (!opts.minExclusive && value < opts.min)
          return fail(`must be at least ${describe(opts.min, unit)}`);
      }
      if (opts.max !== undefined && value > opts.max)
        return fail(`must be at most ${describe(opts.max, unit)}`);
      return value;
    });
}

/**
 * A quantity, required unless a default is given. Volts and amps name their measure ('V rms',
 * 'A dc'), so a value typed in another measure is refused with the conversion where one exists.
 */
export function quantity(
  unitAndMeasure: OutputUnit,
  opts: NumericOpts & { default?: number },
): FieldDef<number> {
  const { unit, measure } = splitUnit(unitAndMeasure);
  const m = measure === 'scalar' ? undefined : measure;
  return {
    spec: { kind: 'quantity', unit, ...(m && { measure: m }), ...opts },
    schema: numericSchema(unit, { ...opts, measure: m }, opts.default, false) as z.ZodType<number>,
  };
}

export function optionalQuantity(
  unitAndMeasure: OutputUnit,
  opts: NumericOpts,
): FieldDef<number | undefined> {
  const { unit, measure } = splitUnit(unitAndMeasure);
  const m = measure === 'scalar' ? undefined : measure;
  return {
    spec: { kind: 'quantity', unit, ...(m && { measure: m }), optional: true, ...opts },
    schema: numericSchema(unit, { ...opts, measure: m }, undefined, true),
  };
}

export function num(opts: NumericOpts & { default?: number }): FieldDef<number> {
  return {
    spec: { kind: 'number', unit: '', ...opts },
    schema: numericSchema('', opts, opts.default, false) as z.ZodType<number>,
  };
}

export function integer(opts: NumericOpts & { default?: number }): FieldDef<number> {
  return {
    spec: { kind: 'integer', unit: '', ...opts },
    schema: numericSchema('', { ...opts, integer: true }, opts.default, false) as z.ZodType<number>,
  };
}

export function optionalInteger(opts: NumericOpts): FieldDef<number | undefined> {
  return {
    spec: { kind: 'integer', unit: '', optional: true, ...opts },
    schema: numericSchema('', { ...opts, integer: true }, undefined, true),
  };
}

export function select<const T extends string>(opts: {
  label: string;
  options: readonly { value: T; label: string }[];
  default?: T;
  help?: string;
}): FieldDef<T> {
  const values = opts.options.map((o) => o.value);
  // In the words the form shows for each option.
  const list = orList(opts.options.map((o) => o.label));
  const schema = z
    .unknown()
    .optional()
    .transform((raw, ctx): T => {
      if (isEmptyInput(raw)) {
        if (opts.default !== undefined) return opts.default;
        ctx.addIssue({ code: 'custom', message: `is required: choose ${list}`, input: raw });
        return z.NEVER;
      }
      if (typeof raw !== 'string' || !(values as string[]).includes(raw)) {
        ctx.addIssue({ code: 'custom', message: `must be one of ${list}`, input: raw });
        return z.NEVER;
      }
      return raw as T;
    });
  return { spec: { kind: 'select', ...opts }, schema };
}

/** Optional free text (a row label). */
export function text(opts: { label: string; help?: string }): FieldDef<string | undefined> {
  const schema = z
    .unknown()
    .optional()
    .transform((raw, ctx): string | undefined => {
      if (raw === undefined || raw === null) return undefined;
      if (typeof raw !== 'string') {
        ctx.addIssue({ code: 'custom', message: 'must be text', input: raw });
        return z.NEVER;
      }
      return raw.trim().slice(0, 80) || undefined;
    });
  return { spec: { kind: 'text', ...opts, optional: true }, schema };
}

type Shape = Record<string, FieldDef<unknown>>;
export type InputOf<S extends Shape> = { [K in keyof S]: S[K] extends FieldDef<infer T> ? T : never };

/**
 * Named inputs over `zshape`, where a name that is not one of them is refused by name with the
 * nearest real one (a misspelt key must never be dropped silently).
 */
export function namedInputs<T extends Record<string, z.ZodType>>(zshape: T) {
  const known = Object.keys(zshape);
  return z
    .object(zshape, { error: () => 'must be a set of named inputs' })
    .catchall(z.unknown())
    .superRefine((value, ctx) => {
      for (const key of Object.keys(value)) {
        if (known.includes(key)) continue;
        const near = closestName(key, known);
        ctx.addIssue({
          code: 'custom',
          path: [key],
          message: `is not an input of this block${near ? ` — did you mean "${near}"?` : ''} (inputs: ${known.join(', ')})`,
        });
      }
    });
}

function objectSchema<S extends Shape>(shape: S) {
  const zshape: Record<string, z.ZodType> = {};
  for (const [k, def] of Object.entries(shape)) zshape[k] = def.schema;
  const known = Object.keys(shape);
  return namedInputs(zshape).transform((value) => {
    const out: Record<string, unknown> = {};
    for (const key of known) out[key] = (value as Record<string, unknown>)[key];
    return out;
  }) as unknown as z.ZodType<InputOf<S>>;
}

function specs<S extends Shape>(shape: S): FieldSpec[] {
  return Object.entries(shape).map(([key, def]) => ({ key, ...def.spec }));
}

export function rows<S extends Shape>(
  columns: S,
  opts: { label: string; help?: string; minRows?: number; maxRows?: number },
): FieldDef<InputOf<S>[]> {
  const minRows = opts.minRows ?? 1;
  const maxRows = opts.maxRows ?? 50;
  const schema = z
    .array(objectSchema(columns), { error: () => 'must be a list of rows' })
    .min(minRows, minRows === 1 ? 'needs at least one row' : `needs at least ${minRows} rows`)
    .max(maxRows, `allows at most ${maxRows} rows`);
  return {
    spec: { kind: 'rows', label: opts.label, help: opts.help, minRows, maxRows, columns: specs(columns) },
    schema: z
      .unknown()
      .optional()
      .transform((v) => (v === undefined || v === null ? [] : v))
      .pipe(schema) as unknown as z.ZodType<InputOf<S>[]>,
  };
}

/** The input schema and form fields of a reckoner, from one shape. */
export function defineInputs<S extends Shape>(
  shape: S,
): { schema: z.ZodType<InputOf<S>>; fields: FieldSpec[] } {
  return { schema: objectSchema(shape), fields: specs(shape) };
}
