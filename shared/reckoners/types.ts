import type { z } from 'zod';

export type FieldKind = 'quantity' | 'number' | 'integer' | 'select' | 'text' | 'rows' | 'tolerance';

/**
 * How an alternating or pulsating voltage or current is stated. Volts and amps always carry one;
 * every other quantity is 'scalar'. Conversions between rms, peak and peak-to-peak hold for a sine.
 */
export type Measure = 'rms' | 'peak' | 'peak-to-peak' | 'dc' | 'scalar';

/** The procedure parameters a field can follow (see shared/reckoners/params.ts). */
export type ParamKey = 'mainsNominal' | 'mainsVoltage' | 'mainsFrequency';

/** One input, described for form generation. Built by the same helper that builds its schema. */
export interface FieldSpec {
  key: string;
  label: string;
  kind: FieldKind;
  /** SI base unit of the value ('V', 'F', …); '' for plain numbers. */
  unit?: string;
  /** For volts and amps: rms, peak, peak-to-peak or dc. A value written in another measure is refused. */
  measure?: Measure;
  /**
   * The range met in shop work. A value outside it (but inside min/max) raises a named
   * 'implausible-input' caution: usually a slipped prefix or unit.
   */
  plausible?: { min: number; max: number };
  /** The procedure parameter this field follows unless the author types a value or links a block. */
  follows?: ParamKey;
  /**
   * The physical part or figure this field describes ('valve-rectifier-drop', 'reservoir-capacitance', …).
   * Two blocks giving the same part different typed values are flagged by the procedure check.
   */
  part?: string;
  /** A capacitor's voltage rating: the procedure check compares it with the no-load peak at high mains. */
  rating?: 'capacitor-voltage';
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
  /** SI base unit when value is a number with a unit; '' for a plain number, text or yes/no. */
  unit: string;
  /** rms, peak, peak-to-peak or dc for volts and amps; 'scalar' for everything else. */
  measure: Measure;
  label: string;
  explanation: string;
  /** Provenance shown to people: a standard and clause, a handbook, "derived", "common practice, no source". */
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
  /** The input the caution is about (dotted path), when it is about one. */
  field?: string;
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
  /**
   * The outputs a reviewer checks first: a first revision's review lists these beside every input.
   * An output of a row ("stage1.resistance") matches by its last part ("resistance").
   */
  keyOutputs?: readonly string[];
  /**
   * Outputs giving the DC the filter reaches with no load: with nothing drawing current every filter
   * node sits near it, so the procedure check rates every capacitor against the highest of them.
   */
  noLoadOutputs?: readonly string[];
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type AnyReckoner = ReckonerDefinition<any>;

export interface FieldError {
  field: string;
  reason: string;
}
