import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { evaluateProcedure } from '../../../shared/reckoners';
import type { PlotBlock, PlotModel } from '../../../shared/plots/reckoner-plot';
import { ReckonerPlotSvg } from '../../../shared/plots/reckoner-plot-svg';

/** One block evaluated as a procedure would evaluate it, ready for its picture. */
export function evaluatedBlock(kind: string, name: string, inputs: Record<string, unknown>): PlotBlock {
  const [block] = evaluateProcedure([{ kind, name, inputs }]).blocks;
  if (!block?.ok) throw new Error(`${kind} rejected ${JSON.stringify(inputs)}: ${JSON.stringify(block)}`);
  return block;
}

/** A tick step is 1, 2 or 5 times a power of ten (Heckbert's nice numbers, docs/references.md §11). */
export function isNiceStep(step: number) {
  const decade = 10 ** Math.floor(Math.log10(step));
  return [1, 2, 5, 10].some((m) => Math.abs(step / decade - m) < 1e-9);
}

/** Ticks evenly spaced by a nice step, each a whole multiple of it. */
export function expectRoundTicks(ticks: number[]) {
  const step = ticks[1]! - ticks[0]!;
  const problems: string[] = [];
  if (!isNiceStep(step)) problems.push(`step ${step}`);
  for (let i = 1; i < ticks.length; i++)
    if (Math.abs(ticks[i]! - ticks[i - 1]! - step) > 1e-9 * Math.abs(step))
      problems.push(`uneven at ${ticks[i]}`);
  for (const t of ticks)
    if (Math.abs(t / step - Math.round(t / step)) > 1e-9) problems.push(`${t} off the step`);
  return problems;
}

/** Where a value lands on a linear axis by plain interpolation (not through the axis's own scale). */
export const lerp = (v: number, [d0, d1]: [number, number], [r0, r1]: [number, number]) =>
  r0 + ((v - d0) / (d1 - d0)) * (r1 - r0);

export const markup = (model: PlotModel) =>
  renderToStaticMarkup(createElement(ReckonerPlotSvg, { model, id: 'p' }));
