import type { z } from 'zod';
import { optionalQuantity, quantity, select } from './fields';

export const RECTIFIER_OPTIONS = [
  { value: 'silicon-bridge', label: 'Silicon bridge (two diodes conduct)' },
  { value: 'silicon-centre-tap', label: 'Silicon full-wave, centre-tapped winding (one diode conducts)' },
  { value: 'valve', label: 'Valve rectifier, full-wave (author enters its drop)' },
] as const;
export type RectifierKind = (typeof RECTIFIER_OPTIONS)[number]['value'];

export const rectifierField = () =>
  select({
    label: 'Rectifier',
    options: RECTIFIER_OPTIONS,
    default: 'silicon-bridge',
    help: 'For a centre-tapped winding, enter the voltage of one half (e.g. 300 V for 300-0-300).',
  });

/** One silicon diode's forward drop; the same part wherever a block names it. */
export const diodeDropField = () =>
  quantity('V dc', {
    label: 'Silicon diode forward drop',
    default: 0.9,
    min: 0,
    max: 3,
    plausible: { min: 0.3, max: 1.5 },
    part: 'silicon-diode-drop',
    help: '0.7–1.1 V per diode is usual (common practice).',
  });

/** Silicon diodes in the conducting path: 2 for a bridge, 1 for a centre-tap pair. */
export function diodesInPath(kind: RectifierKind): number {
  return kind === 'silicon-bridge' ? 2 : kind === 'silicon-centre-tap' ? 1 : 0;
}

/** The author's figure for a valve rectifier's drop; the same part wherever a block names it. */
export const valveDropField = (help?: string) =>
  optionalQuantity('V dc', {
    label: 'Valve rectifier drop',
    min: 0,
    max: 200,
    plausible: { min: 2, max: 100 },
    part: 'valve-rectifier-drop',
    ...(help ? { help } : {}),
  });

/** A valve rectifier has no standard drop: a block with one must give its figure. */
export function requireValveDrop(
  v: { rectifier: RectifierKind; valveDrop?: number },
  ctx: z.RefinementCtx,
  path = 'valveDrop',
): void {
  if (v.rectifier === 'valve' && v.valveDrop === undefined)
    ctx.addIssue({ code: 'custom', path: [path], message: 'is required for a valve rectifier' });
}
