import type { z } from 'zod';

export type FieldKind = 'quantity' | 'number' | 'integer' | 'select' | 'text' | 'rows' | 'tolerance';

/** One input, described for form generation. Built by the same helper that builds its schema. */
export interface FieldSpec {
  key: string;
  label: string;
  kind: FieldKind;
  /** SI base unit of the value ('V', 'F', …); '' for plain numbers. */
  unit?: string;
  default?: unknown;
  /** Inclusive limits unless minExclusive is set. */
  min?: number;
  minExclusive?: boolean;
  max?: number;
  optional?: boolean;
  options?: readonly { value: string; label: string }[];
  /** For 'rows': the columns of each row. */
  columns?: FieldSpec[];
  minRows?: number;
  maxRows?: number;
  help?: string;
}

export interface Output {
  value: number | string | boolean;
  /** SI base unit when value is a number with a unit. */
  unit?: string;
  label: string;
  explanation: string;
  /** Provenance: a standard and clause, a handbook, "derived", "common practice, no source", "from memory". */
  source?: string;
  /** Printed form with SI prefix and unit ("325 V"). */
  formatted: string;
}

export interface ReckonerResult {
  outputs: Record<string, Output>;
}

export interface Caution {
  level: 'danger' | 'warning' | 'note';
  /** Stable id for the kind of caution, e.g. 'hazardous-voltage'. */
  code: string;
  message: string;
  source?: string;
}

export interface ReckonerDefinition<I> {
  /** Stable kind id stored in documents. Never rename. */
  kind: string;
  label: string;
  summary: string;
  inputs: z.ZodType<I>;
  fields: FieldSpec[];
  compute(input: I): ReckonerResult;
  cautions(input: I, result: ReckonerResult): Caution[];
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type AnyReckoner = ReckonerDefinition<any>;

export interface FieldError {
  field: string;
  reason: string;
}
