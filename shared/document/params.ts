import { z } from 'zod';
import { PARAM_SPECS, type ParamSpec } from '../reckoners/params';
import type { ParamKey } from '../reckoners/types';

export { PARAM_SPECS, paramSpec } from '../reckoners/params';
export type { ParamKey, ParamSpec };
export type ProcedureParams = Record<ParamKey, number>;

const bounded = (p: ParamSpec) =>
  z
    .number({ error: `${p.label} must be a number in ${p.unit}` })
    .refine(Number.isFinite, 'must be finite')
    .pipe(
      z
        .number()
        .min(p.min, `${p.label} must be at least ${p.min} ${p.unit}`)
        .max(p.max, `${p.label} must be at most ${p.max} ${p.unit}`),
    )
    .meta({ title: p.label });

export const paramsSchema = z
  .object(
    Object.fromEntries(PARAM_SPECS.map((p) => [p.key, bounded(p)])) as unknown as Record<
      ParamKey,
      z.ZodType<number>
    >,
  )
  .strict()
  .meta({ title: 'Procedure parameters' });

export const defaultParams = (): ProcedureParams =>
  Object.fromEntries(PARAM_SPECS.map((p) => [p.key, p.default])) as ProcedureParams;
