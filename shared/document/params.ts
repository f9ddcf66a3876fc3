import { z } from 'zod';

/**
 * Procedure parameters: the design values stored with a revision. A bench run replaces
 * mainsVoltage (and may replace mainsFrequency) with what the technician measured.
 */
export const PARAM_SPECS = [
  { key: 'mainsNominal', label: 'Nominal mains', unit: 'V', min: 90, max: 260, default: 230 },
  { key: 'mainsVoltage', label: 'Measured mains', unit: 'V', min: 80, max: 280, default: 230 },
  { key: 'mainsFrequency', label: 'Mains frequency', unit: 'Hz', min: 45, max: 65, default: 50 },
] as const;

export type ParamKey = (typeof PARAM_SPECS)[number]['key'];
export type ProcedureParams = Record<ParamKey, number>;

const bounded = (label: string, unit: string, min: number, max: number) =>
  z.number({ error: `${label} must be a number in ${unit}` }).refine(Number.isFinite, 'must be finite').pipe(
    z.number().min(min, `${label} must be at least ${min} ${unit}`).max(max, `${label} must be at most ${max} ${unit}`),
  );

export const paramsSchema = z
  .object(
    Object.fromEntries(PARAM_SPECS.map((p) => [p.key, bounded(p.label, p.unit, p.min, p.max)])) as unknown as Record<ParamKey, z.ZodType<number>>,
  )
  .strict();

export const defaultParams = (): ProcedureParams =>
  Object.fromEntries(PARAM_SPECS.map((p) => [p.key, p.default])) as ProcedureParams;
